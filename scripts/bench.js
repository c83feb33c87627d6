// @ts-check
/**
 * `npm run bench`: set up what a fresh clone lacks (npm dependencies, `svelte-kit sync`, a private
 * throw-away PostgreSQL cluster, GDAL as the geostatistics peer), run every bench/*.bench.ts one
 * after another through tsx (so timings do not compete for the cores), then print one report:
 * each figure against its target, ratios to peers, machine and commit. The report is also
 * written as JSON to bench/results/latest.json. Speed targets live here, never in timed tests.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureNodeModules } from './lib/deps.js';
import { ROOT, resolveConfig } from './lib/config.js';
import { fatal, ok, step } from './lib/log.js';
import { orchestrate } from './lib/orchestrator.js';
import { claimRun } from './lib/runstate.js';

const USAGE = `usage: npm run bench [-- [options] [name …]]

  name …           run only the bench files whose name contains one of these (e.g. thermal)
  --dry-run        load every bench and run one tiny iteration (proves they start; figures are
                   not judged); the report goes to bench/results/dry-run.json
  --compare FILE   print the change of each figure from the report FILE to this run
  --report FILE    run nothing; use the report FILE (with --compare or --write-readme)
  --write-readme   regenerate the README's performance block from this run's report
  --out FILE       write the report to FILE instead of bench/results/latest.json`;

/** @param {string[]} argv */
function parseArgs(argv) {
	/** @type {{ filters: string[], dryRun: boolean, compare?: string, report?: string, writeReadme: boolean, out?: string }} */
	const args = { filters: [], dryRun: false, writeReadme: false };
	for (let i = 0; i < argv.length; i++) {
		const a = argv[i];
		const value = () => {
			const v = argv[++i];
			if (!v || v.startsWith('--')) usage(`${a} needs a file name`);
			return path.resolve(v);
		};
		if (a === '--help' || a === '-h') {
			console.log(USAGE);
			process.exit(0);
		} else if (a === '--dry-run') args.dryRun = true;
		else if (a === '--write-readme') args.writeReadme = true;
		else if (a === '--compare') args.compare = value();
		else if (a === '--report') args.report = value();
		else if (a === '--out') args.out = value();
		else if (a.startsWith('-')) usage(`unknown option ${a}`);
		else args.filters.push(a);
	}
	if (args.report && (args.dryRun || args.filters.length || args.out)) {
		usage('--report uses an existing report; it cannot be combined with a run’s options');
	}
	return args;
}

/** @param {string} message @returns {never} */
function usage(message) {
	console.error(`${message}\n\n${USAGE}`);
	process.exit(2);
}

const args = parseArgs(process.argv.slice(2));
// Node built-ins only until `npm ci` has run; the report module is plain JavaScript too.
const report = await import('./lib/bench-report.js');

/** @param {string} file */
function loadReport(file) {
	try {
		return report.asReport(JSON.parse(fs.readFileSync(file, 'utf8')), path.relative(ROOT, file));
	} catch (err) {
		return fatal(`cannot use ${file}: ${/** @type {Error} */ (err).message}`);
	}
}

// Every exit path (a result, an error, a signal) stops what the run started.
await orchestrate(async () => {
	// Read the earlier report first, so a bad file name fails before minutes of benchmarks.
	const before = args.compare ? loadReport(args.compare) : null;
	const result = args.report ? loadReport(args.report) : await runBenchmarks();

	if (!args.report) console.log(`\n${report.formatReport(result)}`);
	if (before && args.compare) {
		console.log(`\n${report.formatComparison(before, result, path.relative(ROOT, args.compare))}`);
	}
	if (args.writeReadme) await writeReadme(result);
	return args.report ? 0 : report.exitCodeFor(result);
});

async function runBenchmarks() {
	await ensureNodeModules();
	const { syncSvelteKit, runBenchFile, machineInfo, gitCommit, writeFileAtomic } =
		await import('./lib/bench-run.js');
	const { stopAll } = await import('./lib/proc.js');

	const files = fs
		.readdirSync(path.join(ROOT, 'bench'))
		.filter((f) => f.endsWith('.bench.ts'))
		.filter((f) => args.filters.length === 0 || args.filters.some((name) => f.includes(name)))
		.sort();
	if (files.length === 0) fatal(`no bench file matches ${args.filters.join(', ')}`);

	const startedAt = new Date().toISOString();
	const machine = machineInfo();
	const commit = gitCommit(ROOT);

	step('generating .svelte-kit (svelte-kit sync) so tsx resolves $lib');
	const synced = syncSvelteKit(ROOT);
	if (!synced.ok) fatal(synced.reason);

	/** @type {NodeJS.ProcessEnv} */
	const peerEnv = {};
	if (files.some((f) => f.startsWith('geostats'))) {
		const { ensureGdal } = await import('./lib/bench-gdal.js');
		const missing = await ensureGdal({ install: !args.dryRun });
		if (missing) peerEnv.THERMALITH_BENCH_GDAL_MISSING = missing;
	}

	// Benchmarks that touch the database get a private, throw-away cluster of their own (bench profile).
	const config = resolveConfig('bench');
	await claimRun(config.storageDir, 'npm run bench');
	/** @type {import('./lib/bench-report.js').FileRun[]} */
	const runs = [];
	try {
		const { startEmbeddedServices } = await import('./lib/services.js');
		const { applyMigrations } = await import('./migrate.js');
		await startEmbeddedServices(config, { freshDatabase: true, only: ['postgres'] });
		await applyMigrations(config.appEnv.DATABASE_URL);
		const env = {
			...process.env,
			...config.appEnv,
			...peerEnv,
			...(args.dryRun ? { BENCH_DRY_RUN: '1' } : {})
		};
		for (const file of files) {
			console.log(`\n=== ${file}${args.dryRun ? ' (dry run)' : ''} ===`);
			runs.push(await runBenchFile({ root: ROOT, file, env }));
		}
	} finally {
		await stopAll();
	}

	const result = report.buildReport({
		command: ['npm run bench', ...(args.filters.length || args.dryRun ? ['--'] : [])]
			.concat(args.dryRun ? ['--dry-run'] : [], args.filters)
			.join(' '),
		dryRun: args.dryRun,
		complete: args.filters.length === 0,
		startedAt,
		finishedAt: new Date().toISOString(),
		commit,
		machine: { ...machine, loadAverageEnd: os.loadavg().map((l) => Number(l.toFixed(2))) },
		runs
	});
	const out =
		args.out ?? path.join(ROOT, 'bench', 'results', args.dryRun ? 'dry-run.json' : 'latest.json');
	writeFileAtomic(out, JSON.stringify(result, null, '\t') + '\n');
	ok(`report written to ${path.relative(ROOT, out)}`);
	return result;
}

/** @param {import('./lib/bench-report.js').Report} result */
async function writeReadme(result) {
	const { writeFileAtomic } = await import('./lib/bench-run.js');
	const file = path.join(ROOT, 'README.md');
	let text;
	try {
		text = report.replaceReadmeBlock(fs.readFileSync(file, 'utf8'), report.readmeBlock(result));
	} catch (err) {
		return fatal(`README.md not changed: ${/** @type {Error} */ (err).message}`);
	}
	// Format as `prettier --check` expects, so the generated tables pass the test suite's check.
	const prettier = await import('prettier');
	const options = await prettier.resolveConfig(file);
	writeFileAtomic(file, await prettier.format(text, { ...options, filepath: file }));
	ok('README.md performance block regenerated from the report');
}
