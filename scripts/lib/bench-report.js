// @ts-check
/**
 * The benchmark report: collects the figures every bench file wrote through bench/report.ts,
 * judges each against its target, works out ratios to peers timed in the same run, and turns
 * a report into the console summary, a comparison with an earlier report, and the README's
 * performance block. Pure functions (no I/O) so they are unit-tested in
 * tests/integration/bench-report.spec.ts.
 */

export const REPORT_SCHEMA = 1;
export const README_START = '<!-- bench:start -->';
export const README_END = '<!-- bench:end -->';

/**
 * @typedef {{ name: string, value?: number, reason?: string, note?: string }} Peer
 * @typedef {{ id: string, label: string, value: number, unit: string, target?: number,
 *   better: 'lower' | 'higher', note?: string, peers?: Peer[] }} Figure
 * @typedef {'pass' | 'miss' | 'no target' | 'not judged'} Verdict
 * @typedef {Peer & { ratio?: number }} JudgedPeer
 * @typedef {Omit<Figure, 'peers'> & { file: string, verdict: Verdict, peers: JudgedPeer[] }} JudgedFigure
 * @typedef {{ file: string, exitCode: number | null, seconds: number, reason?: string,
 *   figures: Figure[] }} FileRun
 * @typedef {{ file: string, status: 'ran' | 'failed', exitCode: number | null, seconds: number,
 *   reason?: string, figureIds: string[] }} FileResult
 * @typedef {{ sha: string | null, dirty: boolean, reason?: string }} Commit
 * @typedef {{ cores: number, cpuModel: string, node: string, platform: string,
 *   loadAverageStart: number[], loadAverageEnd: number[] }} Machine
 * @typedef {{ schema: number, command: string, dryRun: boolean, complete: boolean,
 *   startedAt: string, finishedAt: string, commit: Commit, machine: Machine,
 *   files: FileResult[], figures: JudgedFigure[],
 *   summary: { pass: number, miss: number, noTarget: number, notJudged: number, failedFiles: number } }} Report
 */

const UNITS = ['ms', 's', 'rows/s', 'items/s', 'MB'];

/**
 * Parse the JSON lines one bench file wrote. Anything malformed is an error with the line number,
 * so a bench that reports wrongly fails instead of silently losing a figure.
 * @param {string} text
 * @returns {{ figures: Figure[], error?: string }}
 */
export function parseFigureLines(text) {
	/** @type {Figure[]} */
	const figures = [];
	const lines = text.split('\n');
	for (let i = 0; i < lines.length; i++) {
		const line = lines[i].trim();
		if (!line) continue;
		let value;
		try {
			value = JSON.parse(line);
		} catch {
			return { figures, error: `figure line ${i + 1} is not JSON` };
		}
		const problem = figureProblem(value);
		if (problem) return { figures, error: `figure line ${i + 1}: ${problem}` };
		figures.push(value);
	}
	return { figures };
}

/** @param {any} f @returns {string | null} */
function figureProblem(f) {
	if (!f || typeof f !== 'object') return 'not an object';
	if (typeof f.id !== 'string' || !/^[a-z0-9][a-z0-9.-]*$/.test(f.id))
		return 'id missing or not a-z0-9.-';
	if (typeof f.label !== 'string' || !f.label) return `${f.id}: label missing`;
	if (typeof f.value !== 'number' || !Number.isFinite(f.value))
		return `${f.id}: value not a finite number`;
	if (!UNITS.includes(f.unit)) return `${f.id}: unit must be one of ${UNITS.join(', ')}`;
	if (f.better !== 'lower' && f.better !== 'higher')
		return `${f.id}: better must be lower or higher`;
	if (f.target !== undefined && (typeof f.target !== 'number' || !Number.isFinite(f.target)))
		return `${f.id}: target not a finite number`;
	if (f.peers !== undefined) {
		if (!Array.isArray(f.peers)) return `${f.id}: peers must be a list`;
		for (const p of f.peers) {
			if (!p || typeof p.name !== 'string') return `${f.id}: a peer has no name`;
			const measured = typeof p.value === 'number' && Number.isFinite(p.value) && p.value > 0;
			if (!measured && typeof p.reason !== 'string')
				return `${f.id}: peer ${p.name} has neither a positive value nor a reason`;
		}
	}
	return null;
}

/**
 * @param {Figure} f @param {boolean} dryRun
 * @returns {Verdict}
 */
export function verdict(f, dryRun) {
	if (f.target === undefined) return 'no target';
	// A dry run's figures come from a tiny iteration; comparing them with targets would mislead.
	if (dryRun) return 'not judged';
	const ok = f.better === 'lower' ? f.value < f.target : f.value > f.target;
	return ok ? 'pass' : 'miss';
}

/**
 * Ours divided by the peer's, for times (`better: 'lower'`): above 1 means we are slower. For
 * rates (`better: 'higher'`) it is also ours / peer: below 1 means we are slower.
 * @param {Figure} f @param {Peer} p
 */
export function peerRatio(f, p) {
	return p.value === undefined || p.value <= 0 ? undefined : f.value / p.value;
}

/**
 * @param {{ command: string, dryRun: boolean, complete: boolean, startedAt: string,
 *   finishedAt: string, commit: Commit, machine: Machine, runs: FileRun[] }} input
 * @returns {Report}
 */
export function buildReport({
	command,
	dryRun,
	complete,
	startedAt,
	finishedAt,
	commit,
	machine,
	runs
}) {
	/** @type {FileResult[]} */
	const files = [];
	/** @type {JudgedFigure[]} */
	const figures = [];
	/** @type {Map<string, string>} */
	const seen = new Map();
	for (const run of runs) {
		let reason = run.reason;
		if (!reason && run.exitCode !== 0) reason = `exited with code ${run.exitCode}`;
		if (!reason && run.figures.length === 0)
			reason = 'reported no figures (a bench reports through figure() in bench/report.ts)';
		const duplicate = run.figures.find((f) => seen.has(f.id));
		if (!reason && duplicate)
			reason = `figure id ${duplicate.id} was already reported by ${seen.get(duplicate.id)}`;
		for (const f of run.figures) {
			if (seen.has(f.id)) continue;
			seen.set(f.id, run.file);
			figures.push({
				...f,
				file: run.file,
				verdict: verdict(f, dryRun),
				peers: (f.peers ?? []).map((p) => ({ ...p, ratio: peerRatio(f, p) }))
			});
		}
		files.push({
			file: run.file,
			status: reason ? 'failed' : 'ran',
			exitCode: run.exitCode,
			seconds: run.seconds,
			...(reason ? { reason } : {}),
			figureIds: run.figures.map((f) => f.id)
		});
	}
	const count = (/** @type {Verdict} */ v) => figures.filter((f) => f.verdict === v).length;
	return {
		schema: REPORT_SCHEMA,
		command,
		dryRun,
		complete,
		startedAt,
		finishedAt,
		commit,
		machine,
		files,
		figures,
		summary: {
			pass: count('pass'),
			miss: count('miss'),
			noTarget: count('no target'),
			notJudged: count('not judged'),
			failedFiles: files.filter((f) => f.status === 'failed').length
		}
	};
}

/** 1 when a bench could not run or a figure missed its target, else 0. @param {Report} report */
export function exitCodeFor(report) {
	return report.summary.failedFiles > 0 || report.summary.miss > 0 ? 1 : 0;
}

/**
 * Check that parsed JSON is a report this version can read; throws a readable error otherwise.
 * @param {unknown} value @param {string} name
 * @returns {Report}
 */
export function asReport(value, name) {
	const r = /** @type {any} */ (value);
	if (!r || typeof r !== 'object' || r.schema !== REPORT_SCHEMA || !Array.isArray(r.figures)) {
		throw new Error(`${name} is not a benchmark report (schema ${REPORT_SCHEMA}) of npm run bench`);
	}
	for (const f of r.figures) {
		const problem = figureProblem(f);
		if (problem) throw new Error(`${name}: ${problem}`);
	}
	return r;
}

/**
 * A value with its unit, in seconds from 1,000 ms up.
 * @param {number} value @param {string} unit
 */
export function formatValue(value, unit) {
	if (unit === 'ms' && Math.abs(value) >= 1000) return `${trim(value / 1000)} s`;
	return `${trim(value)} ${unit}`;
}

/** Three significant figures, no exponent, whole numbers from 100 up. @param {number} v */
function trim(v) {
	if (Math.abs(v) >= 100) return Math.round(v).toLocaleString('en');
	return String(Number(v.toPrecision(3)));
}

/** @param {JudgedFigure | Figure} f */
export function formatTarget(f) {
	if (f.target === undefined) return '';
	return `${f.better === 'lower' ? '<' : '>'} ${formatValue(f.target, f.unit)}`;
}

/** @param {number} ratio */
function formatRatio(ratio) {
	return ratio >= 10 ? ratio.toFixed(1) : ratio.toFixed(2);
}

/** @param {Report} r */
export function describeRun(r) {
	const commit = r.commit.sha
		? `commit \`${r.commit.sha.slice(0, 12)}\`${r.commit.dirty ? ' plus uncommitted changes' : ''}`
		: `no commit (${r.commit.reason ?? 'unknown'})`;
	const m = r.machine;
	const load = `1-minute load average ${m.loadAverageStart[0]?.toFixed(2)} at the start, ${m.loadAverageEnd[0]?.toFixed(2)} at the end`;
	return `\`${r.command}\` at ${commit}, ${r.startedAt.slice(0, 16).replace('T', ' ')} UTC; ${m.cores} × ${m.cpuModel}, Node ${m.node}, ${load}`;
}

/**
 * The console summary: one line per figure, then peers, failures and the totals.
 * @param {Report} r
 */
export function formatReport(r) {
	/** @type {string[][]} */
	const rows = [['figure', 'result', 'target', 'verdict']];
	for (const f of r.figures) {
		rows.push([f.label, formatValue(f.value, f.unit), formatTarget(f), f.verdict]);
	}
	const out = [`Benchmark report: ${describeRun(r)}`, '', ...table(rows)];
	const peered = r.figures.filter((f) => f.peers.length > 0);
	if (peered.length > 0) {
		out.push(
			'',
			'Peers timed in the same run (ratio = ours / peer; above 1 for a time: we are slower):'
		);
		for (const f of peered) {
			for (const p of f.peers) {
				out.push(
					p.ratio === undefined
						? `  ${f.id} vs ${p.name}: ratio not measured: ${p.reason}`
						: `  ${f.id} vs ${p.name}: ${formatValue(/** @type {number} */ (p.value), f.unit)}, ratio ${formatRatio(p.ratio)}${p.note ? ` (${p.note})` : ''}`
				);
			}
		}
	}
	for (const file of r.files.filter((f) => f.status === 'failed')) {
		out.push('', `FAILED ${file.file}: ${file.reason}`);
	}
	const s = r.summary;
	out.push(
		'',
		`${r.figures.length} figures: ${s.pass} pass, ${s.miss} miss, ${s.noTarget} without target` +
			(s.notJudged ? `, ${s.notJudged} not judged (dry run)` : '') +
			`; ${r.files.length - s.failedFiles} of ${r.files.length} bench files ran` +
			(s.failedFiles ? `, ${s.failedFiles} FAILED` : '')
	);
	return out.join('\n');
}

/** Plain-text columns. @param {string[][]} rows */
function table(rows) {
	const widths = rows[0].map((_, c) => Math.max(...rows.map((row) => row[c].length)));
	return rows.map((row) =>
		row
			.map((cell, c) => cell.padEnd(widths[c]))
			.join('  ')
			.trimEnd()
	);
}

/**
 * @typedef {{ id: string, label: string, unit: string, before?: number, after?: number,
 *   changePercent?: number, direction: 'better' | 'worse' | 'same' | 'only before' | 'only after' | 'unit changed' }} Change
 */

/**
 * The change of each figure from `before` to `after`, matched by id.
 * @param {Report} before @param {Report} after
 * @returns {Change[]}
 */
export function compareReports(before, after) {
	const old = new Map(before.figures.map((f) => [f.id, f]));
	/** @type {Change[]} */
	const changes = [];
	for (const f of after.figures) {
		const b = old.get(f.id);
		old.delete(f.id);
		if (!b) {
			changes.push({
				id: f.id,
				label: f.label,
				unit: f.unit,
				after: f.value,
				direction: 'only after'
			});
			continue;
		}
		if (b.unit !== f.unit) {
			changes.push({
				id: f.id,
				label: f.label,
				unit: f.unit,
				before: b.value,
				after: f.value,
				direction: 'unit changed'
			});
			continue;
		}
		const changePercent = b.value === 0 ? undefined : ((f.value - b.value) / b.value) * 100;
		const improved = f.better === 'lower' ? f.value < b.value : f.value > b.value;
		changes.push({
			id: f.id,
			label: f.label,
			unit: f.unit,
			before: b.value,
			after: f.value,
			changePercent,
			direction: f.value === b.value ? 'same' : improved ? 'better' : 'worse'
		});
	}
	// A filtered run did not run the other files: their figures are not gone, just not measured.
	const ran = new Set(after.files.map((f) => f.file));
	for (const b of old.values()) {
		if (!ran.has(b.file)) continue;
		changes.push({
			id: b.id,
			label: b.label,
			unit: b.unit,
			before: b.value,
			direction: 'only before'
		});
	}
	return changes;
}

/** @param {Report} before @param {Report} after @param {string} beforeName */
export function formatComparison(before, after, beforeName) {
	/** @type {string[][]} */
	const rows = [['figure', 'before', 'after', 'change', '']];
	for (const c of compareReports(before, after)) {
		rows.push([
			c.id,
			c.before === undefined ? '' : formatValue(c.before, c.unit),
			c.after === undefined ? '' : formatValue(c.after, c.unit),
			c.changePercent === undefined
				? ''
				: `${c.changePercent >= 0 ? '+' : ''}${c.changePercent.toFixed(1)} %`,
			c.direction
		]);
	}
	const notes = [];
	const ran = new Set(after.files.map((f) => f.file));
	const notRun = before.figures.filter((f) => !ran.has(f.file)).length;
	if (notRun) {
		notes.push(
			`${notRun} figure${notRun === 1 ? '' : 's'} of bench files not run this time left out`
		);
	}
	if (before.dryRun || after.dryRun)
		notes.push('a dry run is part of this comparison: its figures mean nothing');
	return [
		`Before (${beforeName}): ${describeRun(before)}`,
		`After: ${describeRun(after)}`,
		...notes.map((n) => `Note: ${n}`),
		'',
		...table(rows)
	].join('\n');
}

/** Escape a table cell for Markdown. @param {string} s */
function cell(s) {
	return s.replace(/\|/g, '\\|');
}

/**
 * The README's performance block (between the markers), generated from a full, non-dry report.
 * @param {Report} r
 */
export function readmeBlock(r) {
	if (r.dryRun) throw new Error('a dry run has no figures worth publishing; run `npm run bench`');
	if (!r.complete) throw new Error('the README needs a run of every bench file (no name filter)');
	const failed = r.files.filter((f) => f.status === 'failed');
	if (failed.length > 0) {
		throw new Error(
			`the README needs a run where every bench ran; failed: ${failed.map((f) => f.file).join(', ')}`
		);
	}
	const rows = [
		'| benchmark | result | target | verdict |',
		'| --- | --- | --- | --- |',
		...r.figures.map(
			(f) =>
				`| ${cell(f.label)} | ${formatValue(f.value, f.unit)}${f.note ? ` (${cell(f.note)})` : ''} | ${formatTarget(f)} | ${f.verdict === 'no target' ? '' : f.verdict} |`
		)
	];
	const peerRows = r.figures.flatMap((f) =>
		f.peers.map(
			(p) =>
				`| ${cell(f.label)} | ${cell(p.name)} | ${p.value === undefined ? 'not measured' : formatValue(p.value, f.unit)} | ${p.ratio === undefined ? '' : formatRatio(p.ratio)} | ${cell((p.ratio === undefined ? p.reason : p.note) ?? '')} |`
		)
	);
	return [
		README_START,
		'<!-- Generated by `npm run bench -- --write-readme` from the run it names; do not edit by hand. -->',
		'',
		`Figures from ${describeRun(r)}. A load average above the number of cores means other work competed with the benchmarks, so single figures vary more from run to run.`,
		'',
		...rows,
		...(peerRows.length
			? [
					'',
					'Peers timed in the same run on the same data (ratio = Thermalith / peer; above 1 means Thermalith is slower):',
					'',
					'| benchmark | peer | peer result | ratio | note |',
					'| --- | --- | --- | --- | --- |',
					...peerRows
				]
			: []),
		'',
		README_END
	].join('\n');
}

/**
 * Replace the block between the markers (markers included) with `block`.
 * @param {string} readme @param {string} block
 */
export function replaceReadmeBlock(readme, block) {
	const start = readme.indexOf(README_START);
	const end = readme.indexOf(README_END);
	if (start < 0 || end < start) {
		throw new Error(`README.md has no ${README_START} … ${README_END} block to replace`);
	}
	return readme.slice(0, start) + block + readme.slice(end + README_END.length);
}
