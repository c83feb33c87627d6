// @ts-check
/** Child-process helpers: run a command to completion, or keep a service running and stop it later. */
import { spawn, spawnSync } from 'node:child_process';
import net from 'node:net';
import { forgetService, recordService } from './runstate.js';

/**
 * Run a command, inheriting stdio, and resolve with its exit code.
 * @param {string} cmd @param {string[]} args @param {import('node:child_process').SpawnOptions} [options]
 * @returns {Promise<number>}
 */
export function run(cmd, args, options = {}) {
	return new Promise((resolve, reject) => {
		const child = spawn(cmd, args, { stdio: 'inherit', ...options });
		// Recorded like a service, so a killed run's watcher stops it too (a Vitest run, a build).
		const name = `task-${child.pid}`;
		if (child.pid) {
			tasks.add(child);
			// The marker that identifies the process later: a script's path, or the command itself.
			const marker = args[0]?.includes('/') ? args[0] : [cmd, ...args].join(' ').slice(0, 200);
			recordService(name, child.pid, marker);
		}
		child.on('error', reject);
		child.on('exit', (code, signal) => {
			tasks.delete(child);
			forgetService(name);
			resolve(code ?? (signal ? 1 : 0));
		});
	});
}

/** Commands run to completion that are still running (stopped first by stopAll). @type {Set<import('node:child_process').ChildProcess>} */
const tasks = new Set();

/**
 * Run a command synchronously and capture its output.
 * @param {string} cmd @param {string[]} args @param {import('node:child_process').SpawnSyncOptions} [options]
 */
export function capture(cmd, args, options = {}) {
	const result = spawnSync(cmd, args, { encoding: 'utf8', ...options });
	return {
		code: result.status ?? 1,
		stdout: String(result.stdout ?? ''),
		stderr: String(result.stderr ?? ''),
		error: result.error
	};
}

/** Resolve once something accepts TCP connections on host:port, or reject after timeoutMs. */
export async function waitForPort(
	/** @type {string} */ host,
	/** @type {number} */ port,
	timeoutMs = 20_000
) {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		if (await canConnect(host, port)) return;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`nothing answered on ${host}:${port} within ${timeoutMs} ms`);
}

/** @param {string} host @param {number} port @returns {Promise<boolean>} */
export function canConnect(host, port) {
	return new Promise((resolve) => {
		const socket = net.connect({ host, port });
		socket.once('connect', () => {
			socket.destroy();
			resolve(true);
		});
		socket.once('error', () => resolve(false));
	});
}

/** @typedef {{ name: string, child: import('node:child_process').ChildProcess }} Service */

/** Services started by this process, stopped in reverse order by stopAll(). @type {Service[]} */
const services = [];

/** Called when a service stops on its own while the run still needs it. @type {(name: string, code: number | null) => void} */
let onUnexpectedExit = () => {};
/** @param {(name: string, code: number | null) => void} fn */
export function whenServiceDies(fn) {
	onUnexpectedExit = fn;
}

/**
 * Start a long-running node program as a service with a prefixed log, recorded under the run's
 * storage folder so that a crashed run's services can be found and stopped.
 * Started as `node <file>` (not through npx) so the pid we keep is the server's own.
 * @param {string} name @param {string[]} args @param {NodeJS.ProcessEnv} env
 */
export function startService(name, args, env) {
	const child = spawn(process.execPath, args, { env, stdio: ['ignore', 'pipe', 'pipe'] });
	const prefix = `[${name}] `;
	child.stdout?.on('data', (d) => process.stdout.write(prefixLines(prefix, d)));
	child.stderr?.on('data', (d) => process.stderr.write(prefixLines(prefix, d)));
	services.push({ name, child });
	if (child.pid) recordService(name, child.pid, args[0]);
	child.once('exit', (code) => {
		forgetService(name);
		if (!stopping) onUnexpectedExit(name, code);
	});
	return child;
}

/** A stop function for something that is not our child (PostgreSQL), with its name. @type {{ name: string, stop: () => Promise<void> }[]} */
const stoppers = [];
/** @param {string} name @param {() => Promise<void>} fn */
export function onStop(name, fn) {
	stoppers.push({ name, stop: fn });
}

/** @param {string} prefix @param {Buffer} data */
function prefixLines(prefix, data) {
	return data
		.toString()
		.split(/\n(?=.)/)
		.map((l) => prefix + l)
		.join('\n');
}

let stopping = false;
/**
 * Stop everything this run started, newest first (the app before the services it uses, PostgreSQL
 * last): SIGTERM, then SIGKILL after a grace period. Says what it stops.
 */
export async function stopAll() {
	if (stopping) return;
	stopping = true;
	for (const child of tasks) child.kill('SIGTERM');
	const running = services.filter(
		({ child }) => child.exitCode === null && child.signalCode === null
	);
	const names = [...running.map((s) => s.name).reverse(), ...stoppers.map((s) => s.name).reverse()];
	if (names.length) console.log(`stopping what this run started: ${names.join(', ')}`);
	for (const { name, child } of [...running].reverse()) {
		await new Promise((resolve) => {
			const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
			child.once('exit', () => {
				clearTimeout(timer);
				resolve(undefined);
			});
			child.kill('SIGTERM');
		});
		console.log(`  ${name} stopped`);
	}
	for (const { stop } of [...stoppers].reverse()) {
		try {
			await stop();
		} catch (err) {
			console.error(err);
		}
	}
	if (names.length) console.log('everything this run started is stopped');
}
