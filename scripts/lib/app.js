// @ts-check
/** Build the SvelteKit app when its sources changed, and run it (built, or under Vite's dev server). */
import fs from 'node:fs';
import path from 'node:path';
import { ROOT } from './config.js';
import { fatal, ok, step } from './log.js';
import { run, startService, waitForPort } from './proc.js';

/**
 * Where `npm start` builds the app; THERMALITH_BUILD_DIR reuses another up-to-date build (the
 * orchestration tests point it at the test build instead of building a second time).
 */
export const START_BUILD_DIR = process.env.THERMALITH_BUILD_DIR ?? 'build';

const SOURCES = [
	'src',
	'static',
	'package-lock.json',
	'svelte.config.js',
	'vite.config.ts',
	'tailwind.config.ts'
];

/** Newest modification time under the given paths. @param {string[]} paths */
function newestMtime(paths) {
	let newest = 0;
	const visit = (/** @type {string} */ p) => {
		if (!fs.existsSync(p)) return;
		const stat = fs.statSync(p);
		if (stat.isDirectory()) for (const entry of fs.readdirSync(p)) visit(path.join(p, entry));
		else newest = Math.max(newest, stat.mtimeMs);
	};
	paths.forEach((p) => visit(path.join(ROOT, p)));
	return newest;
}

/** @param {string} outDir @param {NodeJS.ProcessEnv} env @param {{ force?: boolean }} [options] */
export async function buildApp(outDir, env, options = {}) {
	const stamp = path.join(ROOT, outDir, '.built-at');
	const builtAt = fs.existsSync(stamp) ? fs.statSync(stamp).mtimeMs : 0;
	if (!options.force && builtAt > newestMtime(SOURCES)) {
		ok(`app build in ${outDir}/ is up to date`);
		return;
	}
	step('building the app (vite build)');
	const code = await run(
		process.execPath,
		[path.join(ROOT, 'node_modules/vite/bin/vite.js'), 'build'],
		{
			cwd: ROOT,
			env: { ...env, BUILD_DIR: outDir, NODE_ENV: 'production' }
		}
	);
	if (code !== 0) fatal(`the build failed (exit ${code})`);
	fs.writeFileSync(stamp, new Date().toISOString());
}

/** @param {string} outDir @param {Record<string, string>} appEnv */
export async function startBuiltApp(outDir, appEnv) {
	startService('app', [path.join(ROOT, outDir, 'index.js')], { ...process.env, ...appEnv });
	await waitForPort(appEnv.HOST, Number(appEnv.PORT), 30_000);
}

/** @param {Record<string, string>} appEnv */
export async function startDevServer(appEnv) {
	startService(
		'vite',
		[
			path.join(ROOT, 'node_modules/vite/bin/vite.js'),
			'dev',
			'--host',
			appEnv.HOST,
			'--port',
			appEnv.PORT,
			'--strictPort'
		],
		{ ...process.env, ...appEnv }
	);
	await waitForPort(appEnv.HOST, Number(appEnv.PORT), 30_000);
}
