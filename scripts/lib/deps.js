// @ts-check
/** Make sure node_modules matches package-lock.json; runs `npm ci` when it is missing or stale. */
import fs from 'node:fs';
import path from 'node:path';
import { ROOT } from './config.js';
import { fatal, ok, step } from './log.js';
import { run } from './proc.js';

export async function ensureNodeModules() {
	const lock = path.join(ROOT, 'package-lock.json');
	const installed = path.join(ROOT, 'node_modules', '.package-lock.json');
	const stale =
		!fs.existsSync(installed) || fs.statSync(lock).mtimeMs > fs.statSync(installed).mtimeMs + 1000;
	if (!stale) return;
	step('installing npm dependencies (npm ci)');
	const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
	const code = await run(npm, ['ci', '--no-audit', '--no-fund'], { cwd: ROOT });
	if (code !== 0) fatal(`npm ci failed (exit ${code})`);
	ok('npm dependencies installed');
}
