/**
 * Drive the project's own scripts (`npm start`, the test services, backups) as a user would, in a
 * throw-away storage folder on ports of their own, with the user's environment: nothing of the
 * settings `npm test` exported for its own services leaks into them.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

const ROOT = path.resolve('.');

/** The user's environment, without the settings `npm test` exported for its own services. */
export function userEnv(offset: number, storage: string): NodeJS.ProcessEnv {
	const env: NodeJS.ProcessEnv = {};
	const inherited =
		/^(DATABASE_URL|S3_|SMTP_|MAIL_|ORIGIN|HOST|PORT|BETTER_AUTH_SECRET|NODE_ENV|THERMALITH_|TEST_APP_URL|BODY_SIZE_LIMIT|PUBLIC_)/;
	for (const [k, v] of Object.entries(process.env)) if (!inherited.test(k)) env[k] = v;
	return {
		...env,
		NO_COLOR: '1',
		THERMALITH_PORT_OFFSET: String(offset),
		THERMALITH_STORAGE_DIR: storage,
		// Reuse the build `npm test` made instead of building a second copy.
		THERMALITH_BUILD_DIR: 'build-test'
	};
}

export interface ScriptRun {
	child: ChildProcess;
	output: () => string;
	exited: Promise<number | null>;
}

const runs: ScriptRun[] = [];

/** Start a script (path from the project root) and collect its output. */
export function launchScript(
	script: string,
	args: string[],
	where: { offset: number; storage: string }
): ScriptRun {
	const child = spawn(process.execPath, [path.join(ROOT, script), ...args], {
		cwd: ROOT,
		env: userEnv(where.offset, where.storage),
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let text = '';
	child.stdout!.on('data', (d) => (text += d));
	child.stderr!.on('data', (d) => (text += d));
	const exited = new Promise<number | null>((resolve) => child.once('exit', (c) => resolve(c)));
	const run = { child, output: () => text, exited };
	runs.push(run);
	return run;
}

/** Ctrl-C every script still running (for afterEach: a failed assertion must not leave one behind). */
export async function stopScripts() {
	for (const run of runs.splice(0)) {
		if (run.child.exitCode === null && run.child.signalCode === null) {
			run.child.kill('SIGINT');
			await run.exited;
		}
	}
}

/**
 * Wait for a state. Generous: a start may have to rebuild the app on a busy machine; the state,
 * not the time, ends the wait.
 */
export async function until(
	what: string,
	check: () => boolean | Promise<boolean>,
	timeoutMs = 300_000
) {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		if (await check()) return;
		await new Promise((r) => setTimeout(r, 200));
	}
	// What the scripts of this test said last: a stall under load names its step, not just its wait.
	const said = runs
		.map(
			(r, i) => `--- script ${i + 1}, last lines:\n${r.output().split('\n').slice(-25).join('\n')}`
		)
		.join('\n');
	throw new Error(`timed out waiting for ${what}\n${said}`);
}
