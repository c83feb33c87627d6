/// <reference types="node" />
/**
 * The one way a benchmark reports a figure. `figure()` prints a readable line and, when
 * `npm run bench` named a file in THERMALITH_BENCH_FIGURES, appends the figure to it as one JSON
 * line; scripts/bench.js collects those lines into the run's report (scripts/lib/bench-report.js
 * judges targets and peers). Run on its own (`npx tsx bench/x.bench.ts`), a bench only prints.
 */
import { appendFileSync } from 'node:fs';

/** A program of another project timed on the same data in the same run (e.g. GDAL's gdal_grid). */
export interface Peer {
	/** Program and the settings it ran with, e.g. "GDAL 3.6.2 gdal_grid invdist:power=2". */
	name: string;
	/** Its time in the figure's unit; absent when it could not be measured (then `reason`). */
	value?: number;
	/** Why it was not measured (not installed, failed…). */
	reason?: string;
	/** What the comparison includes or how close the outputs were. */
	note?: string;
}

export interface Figure {
	/** Stable id used to compare runs, e.g. "thermal.monte-carlo-100m". */
	id: string;
	label: string;
	value: number;
	unit: 'ms' | 's' | 'rows/s' | 'items/s' | 'MB';
	/** Limit the value should stay under (better: 'lower') or above (better: 'higher'). */
	target?: number;
	better: 'lower' | 'higher';
	/** How the value was taken, e.g. "median of 5". */
	note?: string;
	peers?: Peer[];
}

/**
 * BENCH_DRY_RUN=1 (`npm run bench -- --dry-run`): load every module and run one tiny iteration,
 * to prove a bench starts; its figures are not judged against targets.
 */
export const dryRun = process.env.BENCH_DRY_RUN === '1';

/** The full size, or the tiny one in a dry run. */
export function size<T>(full: T, tiny: T): T {
	return dryRun ? tiny : full;
}

export function figure(f: Figure): void {
	if (!/^[a-z0-9][a-z0-9.-]*$/.test(f.id)) throw new Error(`figure id "${f.id}" is not a-z0-9.-`);
	if (!Number.isFinite(f.value)) throw new Error(`figure ${f.id}: value ${f.value} is not finite`);
	const target =
		f.target === undefined ? '' : `, target ${f.better === 'lower' ? '<' : '>'} ${f.target}`;
	const peers = (f.peers ?? [])
		.map((p) =>
			p.value === undefined
				? `; ${p.name}: not measured (${p.reason ?? 'no reason given'})`
				: `; ${p.name}: ${round(p.value)} ${f.unit}`
		)
		.join('');
	console.log(`${f.label}: ${round(f.value)} ${f.unit}${target}${peers}`);
	const file = process.env.THERMALITH_BENCH_FIGURES;
	if (file) appendFileSync(file, JSON.stringify(f) + '\n');
}

function round(value: number): string {
	return value >= 100 ? value.toFixed(0) : value.toPrecision(3);
}
