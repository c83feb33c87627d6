// @ts-check
/** Debian's Chromium for the end-to-end tests: installed with apt-get when missing and root. */
import fs from 'node:fs';
import { fatal, step } from './log.js';
import { run } from './proc.js';

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export async function ensureChromium() {
	if (fs.existsSync(CHROMIUM_PATH)) return;
	const command = 'apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y chromium';
	if (typeof process.getuid !== 'function' || process.getuid() !== 0) {
		fatal(
			`Chromium is needed for the end-to-end tests. Run as root:\n\n  sudo sh -c '${command}'\n`
		);
	}
	step('installing Debian chromium with apt-get');
	const code = await run('sh', ['-c', command]);
	if (code !== 0) fatal(`apt-get install chromium failed (exit ${code})`);
}
