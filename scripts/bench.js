// @ts-check
/**
 * `npm run bench`: run every bench/*.bench.ts (plain scripts that print their own figures) one
 * after another through tsx, so timings do not compete for the two cores. Speed targets live
 * here, never in timed tests. `npm run bench -- thermal` runs only the matching files.
 */
import fs from 'node:fs';
import path from 'node:path';
import { ensureNodeModules } from './lib/deps.js';
import { ROOT, resolveConfig } from './lib/config.js';
import { run, stopAll, stopOnSignals } from './lib/proc.js';

await ensureNodeModules();
stopOnSignals();
const filter = process.argv[2];
// Benchmarks that touch the database get a private, throw-away cluster of their own (bench profile).
const config = resolveConfig('bench');
const { startEmbeddedServices } = await import('./lib/services.js');
const { applyMigrations } = await import('./migrate.js');
await startEmbeddedServices(config, { freshDatabase: true, only: ['postgres'] });
await applyMigrations(config.appEnv.DATABASE_URL);
const files = fs
	.readdirSync(path.join(ROOT, 'bench'))
	.filter((f) => f.endsWith('.bench.ts') && (!filter || f.includes(filter)))
	.sort();
let failed = 0;
for (const file of files) {
	console.log(`\n=== ${file} ===`);
	const code = await run(
		process.execPath,
		[path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), path.join(ROOT, 'bench', file)],
		{ cwd: ROOT, env: { ...process.env, ...config.appEnv } }
	);
	if (code !== 0) failed += 1;
}
await stopAll();
console.log(
	`\n${files.length} benchmark files ran; ${failed} missed a target or failed (see above)`
);
process.exit(failed ? 1 : 0);
