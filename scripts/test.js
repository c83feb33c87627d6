// @ts-check
/**
 * `npm test`: sets up an isolated test cluster, database, S3 fake and mail catcher under
 * storage/test (never the development data), then runs the static checks, Vitest (unit,
 * component, integration) and the end-to-end tests in Chromium against a fresh build, stops what it
 * started, and ends with one plain line: `N passed, N failed, N skipped`.
 * Extra arguments are passed to Vitest (e.g. `npm test -- src/lib/thermal`).
 */
import fs from 'node:fs';
import path from 'node:path';
import { ensureNodeModules } from './lib/deps.js';
import { ROOT, resolveConfig } from './lib/config.js';
import { ok, step, warn } from './lib/log.js';
import { run, stopAll, stopOnSignals } from './lib/proc.js';

const vitestArgs = process.argv.slice(2);
const totals = { passed: 0, failed: 0, skipped: 0 };
const bin = (/** @type {string} */ p) => path.join(ROOT, 'node_modules', p);

await ensureNodeModules();
stopOnSignals();
const { ensureChromium, CHROMIUM_PATH } = await import('./lib/chromium.js');
await ensureChromium();

const config = resolveConfig('test');
// One test run at a time: they share the test ports and database.
const lock = path.join(config.storageDir, 'test-run.lock');
fs.mkdirSync(config.storageDir, { recursive: true });
try {
	fs.writeFileSync(lock, String(process.pid), { flag: 'wx' });
} catch {
	const holder = Number(fs.readFileSync(lock, 'utf8'));
	let alive = false;
	try {
		process.kill(holder, 0);
		alive = true;
	} catch {
		alive = false;
	}
	if (alive) {
		console.error(`another npm test (pid ${holder}) is running; wait for it to finish`);
		process.exit(1);
	}
	fs.writeFileSync(lock, String(process.pid));
}
process.on('exit', () => fs.rmSync(lock, { force: true }));
const { validateEnvironment } = await import('./lib/validate-env.js');
validateEnvironment(config.appEnv);
const env = { ...process.env, ...config.appEnv, CHROMIUM_PATH, TEST_APP_URL: config.appEnv.ORIGIN };

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

let exitCode = 0;
try {
	await run(process.execPath, [bin('@sveltejs/kit/svelte-kit.js'), 'sync'], { cwd: ROOT, env });
	const { startEmbeddedServices } = await import('./lib/services.js');
	await startEmbeddedServices(config, { freshDatabase: true, freshObjects: true });
	const { applyMigrations } = await import('./migrate.js');
	step('applying migrations to the test database');
	await applyMigrations(config.appEnv.DATABASE_URL);
	const { seedDemoData } = await import('./lib/seed-runner.js');
	await seedDemoData({ ...config.appEnv, THERMALITH_SEED: 'if-empty' });

	if (vitestArgs.length === 0) {
		await check('svelte-check', 'svelte-check/bin/svelte-check', [
			'--tsconfig',
			'./tsconfig.json',
			'--fail-on-warnings'
		]);
		await check('eslint', 'eslint/bin/eslint.js', ['.']);
		await check('prettier --check', 'prettier/bin/prettier.cjs', ['--check', '.']);
	}

	const { buildApp, startBuiltApp } = await import('./lib/app.js');
	await buildApp('build-test', config.appEnv, { force: true });
	await startBuiltApp('build-test', config.appEnv);

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
} catch (err) {
	console.error(err);
	totals.failed += 1;
} finally {
	await stopAll();
}
if (totals.failed > 0) exitCode = 1;
console.log(`${totals.passed} passed, ${totals.failed} failed, ${totals.skipped} skipped`);
process.exit(exitCode);
