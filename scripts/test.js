// @ts-check
/**
 * `npm test`: sets up an isolated test cluster, database, S3 fake and mail catcher under
 * storage/test (never the development data), then runs the static checks, Vitest (unit,
 * component, integration) and the end-to-end tests in Chromium against a fresh build, stops what it
 * started (on every exit path), and ends with one plain line: `N passed, N failed, N skipped`.
 * Without arguments it runs the fast tier: everything but the files in tests/slow-tests.js.
 * Extra arguments are passed to Vitest (e.g. `npm test -- src/lib/thermal`; a named file runs
 * whatever its tier), except:
 *   --slow           only the slow tier (`npm run test:slow`): fault, whole-stack and queue-timer tests
 *   --all            both tiers and the static checks in one run (what CI runs)
 *   --cpu-burn       keep every core busy while Vitest runs (the suite must pass on a loaded machine)
 *   --services-only  start the test services and the test build, print their settings, wait for Ctrl-C
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureNodeModules } from './lib/deps.js';
import { ROOT, resolveConfig } from './lib/config.js';
import { ok, step, warn } from './lib/log.js';
import { orchestrate } from './lib/orchestrator.js';
import { claimRun } from './lib/runstate.js';

const OWN_FLAGS = ['--cpu-burn', '--services-only', '--slow', '--all'];
const cpuBurn = process.argv.includes('--cpu-burn');
const servicesOnly = process.argv.includes('--services-only');
const slowTier = process.argv.includes('--slow');
const allTiers = process.argv.includes('--all');
const vitestArgs = process.argv.slice(2).filter((a) => !OWN_FLAGS.includes(a));
// Read by vite.config.ts. Named files or filters run as asked, whatever their tier.
const tier = vitestArgs.length > 0 || allTiers ? undefined : slowTier ? 'slow' : 'fast';
const bin = (/** @type {string} */ p) => path.join(ROOT, 'node_modules', p);

await orchestrate(async () => {
	await ensureNodeModules();
	const { run, startService, stopAll } = await import('./lib/proc.js');
	const { ensureChromium, CHROMIUM_PATH } = await import('./lib/chromium.js');
	await ensureChromium();
	// GDAL's OGC API client reads /ogc in the tests, as a desktop GIS would.
	const { ensureGdal } = await import('./lib/bench-gdal.js');
	await ensureGdal({ install: true });

	const config = resolveConfig('test');
	const { validateEnvironment } = await import('./lib/validate-env.js');
	validateEnvironment(config.appEnv);
	// One test run per storage folder: they share its ports and database.
	await claimRun(config.storageDir, 'npm test');
	const env = {
		...process.env,
		...config.appEnv,
		CHROMIUM_PATH,
		TEST_APP_URL: config.appEnv.ORIGIN,
		...(tier ? { THERMALITH_TEST_TIER: tier } : {})
	};
	const totals = { passed: 0, failed: 0, skipped: 0 };

	/** Run a static check; it counts as one test. @param {string} name @param {string} script @param {string[]} args */
	async function check(name, script, args) {
		step(name);
		const code = await run(process.execPath, [bin(script), ...args], { cwd: ROOT, env });
		if (code === 0) {
			totals.passed += 1;
			ok(`${name} passed`);
		} else {
			totals.failed += 1;
			warn(`${name} failed (exit ${code})`);
		}
	}

	const { checkPortsFree, startEmbeddedServices } = await import('./lib/services.js');
	await checkPortsFree(config, ['app', 's3', 'smtp', 'mailWeb']);
	await run(process.execPath, [bin('@sveltejs/kit/svelte-kit.js'), 'sync'], { cwd: ROOT, env });
	await startEmbeddedServices(config, { freshDatabase: true, freshObjects: true });
	const { applyMigrations } = await import('./migrate.js');
	step('applying migrations to the test database');
	await applyMigrations(config.appEnv.DATABASE_URL);
	const { seedDemoData } = await import('./lib/seed-runner.js');
	await seedDemoData({ ...config.appEnv, THERMALITH_SEED: 'if-empty' });

	if (vitestArgs.length === 0 && !servicesOnly && tier !== 'slow') {
		await check('svelte-check', 'svelte-check/bin/svelte-check', [
			'--tsconfig',
			'./tsconfig.json',
			'--fail-on-warnings'
		]);
		await check('eslint', 'eslint/bin/eslint.js', ['.']);
		await check('prettier --check', 'prettier/bin/prettier.cjs', ['--check', '.']);
	}

	const { buildApp, startBuiltApp } = await import('./lib/app.js');
	await buildApp('build-test', config.appEnv, { force: !servicesOnly });
	await startBuiltApp('build-test', config.appEnv);

	if (servicesOnly) {
		ok('test services are up; run Vitest against them with these settings:');
		for (const name of ['DATABASE_URL', 'S3_ENDPOINT', 'SMTP_URL', 'MAIL_VIEWER_URL']) {
			console.log(`  ${name}=${config.appEnv[name]}`);
		}
		console.log(`  TEST_APP_URL=${config.appEnv.ORIGIN}`);
		return 'serve';
	}

	if (cpuBurn) {
		const cores = os.availableParallelism();
		step(`keeping ${cores} cores busy while the tests run (--cpu-burn)`);
		for (let i = 0; i < cores; i++) {
			startService(`cpu-burner-${i + 1}`, [path.join(ROOT, 'scripts/lib/cpu-burner.js')], {});
		}
	}

	const report = path.join(config.storageDir, 'vitest-report.json');
	fs.rmSync(report, { force: true });
	step('running Vitest (unit, component, integration, end-to-end)');
	const code = await run(
		process.execPath,
		[
			bin('vitest/vitest.mjs'),
			'run',
			'--reporter=default',
			'--reporter=json',
			`--outputFile.json=${report}`,
			...(tier === 'slow' ? ['--project', 'integration'] : []),
			...vitestArgs
		],
		{ cwd: ROOT, env }
	);
	if (fs.existsSync(report)) {
		const r = JSON.parse(fs.readFileSync(report, 'utf8'));
		totals.passed += r.numPassedTests ?? 0;
		totals.failed += r.numFailedTests ?? 0;
		totals.skipped += (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
		// A file that failed to load has no tests to count; count it as one failure.
		const brokenFiles = (r.testResults ?? []).filter(
			(/** @type {{ status: string, assertionResults: unknown[] }} */ f) =>
				f.status === 'failed' && f.assertionResults.length === 0
		).length;
		totals.failed += brokenFiles;
	} else {
		totals.failed += 1;
	}
	if (code !== 0 && totals.failed === 0) totals.failed += 1;

	// Stop the services before the summary, so the summary stays the last line.
	await stopAll();
	console.log(`${totals.passed} passed, ${totals.failed} failed, ${totals.skipped} skipped`);
	return totals.failed > 0 ? 1 : 0;
});
