/**
 * The benchmark report's logic (scripts/lib/bench-report.js): judging figures against targets,
 * peer ratios, failed bench files, comparing two runs and the README block. Pure functions: these
 * run without services (`npx vitest run tests/integration/bench-report.spec.ts`).
 */
import { describe, expect, it } from 'vitest';
import {
	README_END,
	README_START,
	asReport,
	buildReport,
	compareReports,
	exitCodeFor,
	formatComparison,
	formatReport,
	formatValue,
	parseFigureLines,
	readmeBlock,
	replaceReadmeBlock,
	verdict
} from '../../scripts/lib/bench-report.js';
import { failureReason } from '../../scripts/lib/bench-run.js';

type FileRun = Parameters<typeof buildReport>[0]['runs'][number];

const machine = {
	cores: 2,
	cpuModel: 'Test CPU',
	node: 'v20.20.2',
	platform: 'linux',
	loadAverageStart: [3.21, 2, 1],
	loadAverageEnd: [4.5, 3, 2]
};

function report(runs: FileRun[], over: { dryRun?: boolean; complete?: boolean } = {}) {
	return buildReport({
		command: 'npm run bench',
		dryRun: over.dryRun ?? false,
		complete: over.complete ?? true,
		startedAt: '2026-12-02T08:00:00.000Z',
		finishedAt: '2026-12-02T08:05:00.000Z',
		commit: { sha: 'abcdef0123456789abcdef0123456789abcdef01', dirty: false },
		machine,
		runs
	});
}

const thermal: FileRun = {
	file: 'thermal.bench.ts',
	exitCode: 0,
	seconds: 10,
	figures: [
		{
			id: 'thermal.mc',
			label: 'Monte Carlo',
			value: 250,
			unit: 'ms',
			target: 300,
			better: 'lower'
		},
		{
			id: 'thermal.slow',
			label: 'Slow one',
			value: 1200,
			unit: 'ms',
			target: 1000,
			better: 'lower'
		}
	]
};
const geostats: FileRun = {
	file: 'geostats.bench.ts',
	exitCode: 0,
	seconds: 20,
	figures: [
		{
			id: 'geostats.idw',
			label: 'IDW',
			value: 400,
			unit: 'ms',
			better: 'lower',
			peers: [
				{ name: 'gdal_grid invdist', value: 100, note: 'incl. start-up' },
				{ name: 'gdal_grid scalar', reason: 'gdal_grid is not installed' }
			]
		}
	]
};

describe('parseFigureLines', () => {
	it('reads one figure per JSON line and skips blank lines', () => {
		const lines = [JSON.stringify(thermal.figures[0]), '', JSON.stringify(geostats.figures[0])];
		const parsed = parseFigureLines(lines.join('\n') + '\n');
		expect(parsed.error).toBeUndefined();
		expect(parsed.figures.map((f) => f.id)).toEqual(['thermal.mc', 'geostats.idw']);
	});

	it('names the line of a malformed figure instead of dropping it', () => {
		const good = JSON.stringify(thermal.figures[0]);
		expect(parseFigureLines(`${good}\n{not json`).error).toBe('figure line 2 is not JSON');
		const noUnit = JSON.stringify({ ...thermal.figures[0], unit: 'minutes' });
		expect(parseFigureLines(noUnit).error).toMatch(/line 1: thermal\.mc: unit must be/);
		const nan = `{"id":"a","label":"A","value":null,"unit":"ms","better":"lower"}`;
		expect(parseFigureLines(nan).error).toMatch(/value not a finite number/);
		const silentPeer = JSON.stringify({ ...geostats.figures[0], peers: [{ name: 'gdal' }] });
		expect(parseFigureLines(silentPeer).error).toMatch(/peer gdal has neither/);
	});
});

describe('verdict', () => {
	const f = { id: 'x', label: 'x', unit: 'ms' } as const;
	it('passes a time under its target and misses one at or over it', () => {
		expect(verdict({ ...f, value: 99, target: 100, better: 'lower' }, false)).toBe('pass');
		expect(verdict({ ...f, value: 100, target: 100, better: 'lower' }, false)).toBe('miss');
		expect(verdict({ ...f, value: 150, target: 100, better: 'lower' }, false)).toBe('miss');
	});
	it('passes a rate over its target', () => {
		expect(verdict({ ...f, value: 150, target: 100, better: 'higher' }, false)).toBe('pass');
		expect(verdict({ ...f, value: 50, target: 100, better: 'higher' }, false)).toBe('miss');
	});
	it('does not judge a dry run or a figure without a target', () => {
		expect(verdict({ ...f, value: 150, target: 100, better: 'lower' }, true)).toBe('not judged');
		expect(verdict({ ...f, value: 150, better: 'lower' }, false)).toBe('no target');
	});
});

describe('buildReport', () => {
	it('judges each figure, works out peer ratios and counts the verdicts', () => {
		const r = report([thermal, geostats]);
		expect(r.figures.map((f) => [f.id, f.verdict])).toEqual([
			['thermal.mc', 'pass'],
			['thermal.slow', 'miss'],
			['geostats.idw', 'no target']
		]);
		const [measured, missing] = r.figures[2].peers;
		expect(measured.ratio).toBe(4);
		expect(missing.ratio).toBeUndefined();
		expect(missing.reason).toBe('gdal_grid is not installed');
		expect(r.summary).toEqual({ pass: 1, miss: 1, noTarget: 1, notJudged: 0, failedFiles: 0 });
		expect(exitCodeFor(r)).toBe(1);
		expect(exitCodeFor(report([{ ...thermal, figures: [thermal.figures[0]] }]))).toBe(0);
	});

	it('reports a bench that could not run as failed, with its reason', () => {
		const r = report([
			{
				file: 'import.bench.ts',
				exitCode: 1,
				seconds: 1,
				reason: "Error [ERR_MODULE_NOT_FOUND]: Cannot find package '$lib'",
				figures: []
			},
			{ file: 'quiet.bench.ts', exitCode: 0, seconds: 1, figures: [] },
			{ file: 'crashed.bench.ts', exitCode: 3, seconds: 1, figures: [] }
		]);
		expect(r.files.map((f) => [f.file, f.status, f.reason])).toEqual([
			['import.bench.ts', 'failed', "Error [ERR_MODULE_NOT_FOUND]: Cannot find package '$lib'"],
			['quiet.bench.ts', 'failed', expect.stringMatching(/reported no figures/)],
			['crashed.bench.ts', 'failed', 'exited with code 3']
		]);
		expect(r.summary.failedFiles).toBe(3);
		expect(exitCodeFor(r)).toBe(1);
		expect(formatReport(r)).toContain('FAILED import.bench.ts: Error [ERR_MODULE_NOT_FOUND]');
	});

	it('fails the second file that reports an id already taken', () => {
		const r = report([thermal, { ...thermal, file: 'copy.bench.ts' }]);
		expect(r.files[1]).toMatchObject({
			status: 'failed',
			reason: expect.stringMatching(/thermal\.mc was already reported by thermal\.bench\.ts/)
		});
		expect(r.figures).toHaveLength(2);
	});

	it('prints targets, verdicts, ratios, the machine and the commit', () => {
		const text = formatReport(report([thermal, geostats]));
		expect(text).toContain('commit `abcdef012345`');
		expect(text).toContain(
			'2 × Test CPU, Node v20.20.2, 1-minute load average 3.21 at the start, 4.50 at the end'
		);
		expect(text).toMatch(/Slow one\s+1\.2 s\s+< 1 s\s+miss/);
		expect(text).toContain(
			'geostats.idw vs gdal_grid invdist: 100 ms, ratio 4.00 (incl. start-up)'
		);
		expect(text).toContain(
			'geostats.idw vs gdal_grid scalar: ratio not measured: gdal_grid is not installed'
		);
	});
});

describe('formatValue', () => {
	it('shows milliseconds to three figures and seconds from 1,000 ms', () => {
		expect(formatValue(1.23456, 'ms')).toBe('1.23 ms');
		expect(formatValue(123.4, 'ms')).toBe('123 ms');
		expect(formatValue(4400, 'ms')).toBe('4.4 s');
		expect(formatValue(12_345, 'rows/s')).toBe('12,345 rows/s');
	});
});

describe('compareReports', () => {
	it('gives the change of each figure, better or worse by its direction', () => {
		const rate: FileRun = {
			file: 'api.bench.ts',
			exitCode: 0,
			seconds: 1,
			figures: [{ id: 'api.items', label: 'Items', value: 1000, unit: 'items/s', better: 'higher' }]
		};
		const before = report([thermal, rate]);
		const after = report([
			{ ...thermal, figures: [{ ...thermal.figures[0], value: 200 }] },
			{ ...rate, figures: [{ ...rate.figures[0], value: 800 }] },
			geostats
		]);
		const changes = compareReports(before, after);
		expect(changes).toEqual([
			expect.objectContaining({
				id: 'thermal.mc',
				before: 250,
				after: 200,
				changePercent: -20,
				direction: 'better'
			}),
			expect.objectContaining({ id: 'api.items', changePercent: -20, direction: 'worse' }),
			expect.objectContaining({ id: 'geostats.idw', direction: 'only after' }),
			expect.objectContaining({ id: 'thermal.slow', before: 1200, direction: 'only before' })
		]);
		const text = formatComparison(before, after, 'old.json');
		expect(text).toContain('Before (old.json): `npm run bench` at commit `abcdef012345`');
		expect(text).toMatch(/thermal\.mc\s+250 ms\s+200 ms\s+-20\.0 %\s+better/);
	});

	it('leaves out the figures of bench files a filtered run did not run', () => {
		const before = report([thermal, geostats]);
		const after = report([{ ...thermal, figures: [thermal.figures[0]] }], { complete: false });
		expect(compareReports(before, after).map((c) => [c.id, c.direction])).toEqual([
			['thermal.mc', 'same'],
			['thermal.slow', 'only before']
		]);
		expect(formatComparison(before, after, 'x')).toContain(
			'1 figure of bench files not run this time left out'
		);
	});

	it('warns when a dry run is compared', () => {
		const text = formatComparison(report([thermal], { dryRun: true }), report([thermal]), 'x');
		expect(text).toContain('a dry run is part of this comparison');
	});
});

describe('asReport', () => {
	it('accepts a written report and refuses anything else with a readable error', () => {
		const r = report([thermal]);
		expect(asReport(JSON.parse(JSON.stringify(r)), 'latest.json').figures).toHaveLength(2);
		expect(() => asReport({ figures: [] }, 'old.json')).toThrow(
			/old\.json is not a benchmark report/
		);
		const broken = { ...r, figures: [{ ...r.figures[0], value: 'fast' }] };
		expect(() => asReport(broken, 'old.json')).toThrow(/old\.json: thermal\.mc: value/);
	});
});

describe('README block', () => {
	const readme = `# App\n\n## Performance\n\nintro\n\n${README_START}\nold typed table\n${README_END}\n\n## Next\n`;

	it('names the command, commit and load, lists every figure and peer, and replaces only the block', () => {
		const block = readmeBlock(report([thermal, geostats]));
		expect(block).toContain('`npm run bench` at commit `abcdef012345`');
		expect(block).toContain('load average 3.21 at the start, 4.50 at the end');
		expect(block).toContain('| Slow one | 1.2 s | < 1 s | miss |');
		expect(block).toContain('| IDW | gdal_grid invdist | 100 ms | 4.00 | incl. start-up |');
		expect(block).toContain(
			'| IDW | gdal_grid scalar | not measured |  | gdal_grid is not installed |'
		);
		const once = replaceReadmeBlock(readme, block);
		expect(once).not.toContain('old typed table');
		expect(once.startsWith('# App\n\n## Performance\n\nintro\n\n')).toBe(true);
		expect(once.endsWith('\n\n## Next\n')).toBe(true);
		expect(replaceReadmeBlock(once, block)).toBe(once);
	});

	it('refuses a dry run, a filtered run, a run with a failed bench, and a README without markers', () => {
		expect(() => readmeBlock(report([thermal], { dryRun: true }))).toThrow(/dry run/);
		expect(() => readmeBlock(report([thermal], { complete: false }))).toThrow(/every bench file/);
		const failed = report([
			thermal,
			{ file: 'import.bench.ts', exitCode: 1, seconds: 1, figures: [] }
		]);
		expect(() => readmeBlock(failed)).toThrow(/failed: import\.bench\.ts/);
		expect(() => replaceReadmeBlock('# App\n', 'x')).toThrow(/no <!-- bench:start -->/);
	});
});

describe('failureReason', () => {
	it('picks the error line out of a crashed bench’s stderr', () => {
		const stderr = [
			'node:internal/modules/run_main:123',
			'    triggerUncaughtException(',
			'    ^',
			"Error [ERR_MODULE_NOT_FOUND]: Cannot find package '$lib' imported from /x/bench/import.bench.ts",
			'    at packageResolve (node:internal/modules/esm/resolve:854:9)',
			'',
			'Node.js v20.20.2'
		].join('\n');
		expect(failureReason(stderr)).toBe(
			"Error [ERR_MODULE_NOT_FOUND]: Cannot find package '$lib' imported from /x/bench/import.bench.ts"
		);
		expect(failureReason('something odd\nlast words\n\nNode.js v20.20.2\n')).toBe('last words');
		expect(failureReason('')).toBeNull();
	});
});
