// @ts-check
/** Run the TypeScript seed (scripts/seed.ts) through tsx with the app's environment. */
import path from 'node:path';
import { ROOT } from './config.js';
import { fatal } from './log.js';
import { run } from './proc.js';

/** @param {Record<string, string>} appEnv */
export async function seedDemoData(appEnv) {
	const code = await run(
		process.execPath,
		[path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), path.join(ROOT, 'scripts/seed.ts')],
		{ cwd: ROOT, env: { ...process.env, ...appEnv } }
	);
	if (code !== 0) fatal(`seeding the demo data failed (exit ${code})`);
}
