// @ts-check
/**
 * What a run of `npm start`/`npm run dev`/`npm test`/`npm run bench` has started, recorded under
 * its storage folder (storage/<profile>/run/) so that nothing outlives it:
 *   orchestrator.json   the run itself (pid, command)
 *   service-<name>.json each Node service it started (pid and the script it runs)
 *   postgres.json       the PostgreSQL cluster it started or took over (data folder, port)
 * A small detached watcher (reaper.js) stops all of it if the run dies without cleaning up
 * (SIGKILL, a closed terminal, an out-of-memory kill), and the next run of the same storage folder
 * checks again before it starts anything.
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { fatal, warn } from './log.js';
import { commandLine } from './ports.js';
import { clusterRunning, stopCluster } from './postgres.js';

/** @typedef {{ pid: number, script: string, label: string, startedAt: string }} OrchestratorRecord */
/** @typedef {{ name: string, pid: number, marker: string }} ServiceRecord */
/** @typedef {{ dataDir: string, port: number }} PostgresRecord */

/** @type {string | null} */
let runDir = null;

/** @param {number} pid */
export function isAlive(pid) {
	try {
		process.kill(pid, 0);
		return true;
	} catch (err) {
		return /** @type {NodeJS.ErrnoException} */ (err).code === 'EPERM';
	}
}

/** @param {string} file */
function readJson(file) {
	try {
		return JSON.parse(fs.readFileSync(file, 'utf8'));
	} catch {
		return null;
	}
}

/** @param {string} file @param {unknown} value */
function writeJson(file, value) {
	// Write then rename, so a reader never sees half a record.
	const tmp = `${file}.${process.pid}.tmp`;
	fs.writeFileSync(tmp, JSON.stringify(value));
	fs.renameSync(tmp, file);
}

/** Is this pid still the process we recorded (and not a new one that reuses the number)? */
function stillOurs(/** @type {number} */ pid, /** @type {string} */ marker) {
	if (!isAlive(pid)) return false;
	const cmd = commandLine(pid);
	// Without /proc we cannot tell; trust the pid file.
	return cmd === null || cmd.includes(marker);
}

/** SIGTERM, then SIGKILL after a grace period; resolves when the process is gone. */
export async function terminate(/** @type {number} */ pid, graceMs = 5000) {
	try {
		process.kill(pid, 'SIGTERM');
	} catch {
		return;
	}
	const deadline = Date.now() + graceMs;
	while (isAlive(pid) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
	if (isAlive(pid)) {
		try {
			process.kill(pid, 'SIGKILL');
		} catch {
			/* gone meanwhile */
		}
		while (isAlive(pid)) await new Promise((r) => setTimeout(r, 20));
	}
}

/**
 * Stop what a dead run left behind in `dir`. PostgreSQL is stopped only when `stopPostgres`
 * (the reaper); the next run instead takes over a healthy cluster of the same data folder.
 * @param {string} dir @param {{ stopPostgres: boolean }} options
 * @returns {Promise<string[]>} what was done, in words
 */
export async function cleanUpLeftovers(dir, { stopPostgres }) {
	/** @type {string[]} */
	const done = [];
	if (!fs.existsSync(dir)) return done;
	// Newest first, as a clean stop would: the app before the services it uses.
	const files = fs
		.readdirSync(dir)
		.filter((f) => f.startsWith('service-') && f.endsWith('.json'))
		.map((f) => ({ f, at: fs.statSync(path.join(dir, f)).mtimeMs }))
		.sort((a, b) => b.at - a.at)
		.map(({ f }) => f);
	for (const file of files) {
		/** @type {ServiceRecord | null} */
		const record = readJson(path.join(dir, file));
		if (record && stillOurs(record.pid, record.marker)) {
			await terminate(record.pid);
			done.push(
				record.name.startsWith('task-')
					? `stopped ${path.basename(record.marker)} (pid ${record.pid})`
					: `stopped the ${record.name} service (pid ${record.pid})`
			);
		}
		fs.rmSync(path.join(dir, file), { force: true });
	}
	/** @type {PostgresRecord | null} */
	const pg = readJson(path.join(dir, 'postgres.json'));
	if (pg && stopPostgres && clusterRunning(pg.dataDir)) {
		stopCluster(pg.dataDir);
		done.push(`stopped PostgreSQL (${pg.dataDir})`);
	}
	if (stopPostgres) fs.rmSync(path.join(dir, 'postgres.json'), { force: true });
	return done;
}

/**
 * The live run (`npm start`, `npm run dev`, …) that holds this storage folder, or null.
 * @param {string} storageDir @returns {OrchestratorRecord | null}
 */
export function activeRun(storageDir) {
	/** @type {OrchestratorRecord | null} */
	const record = readJson(path.join(storageDir, 'run', 'orchestrator.json'));
	return record && record.pid !== process.pid && stillOurs(record.pid, record.script)
		? record
		: null;
}

/**
 * Take the storage folder for this run: refuse when another live run holds it, clean up after a
 * crashed one, record this run and start its watcher.
 * @param {string} storageDir @param {string} label e.g. "npm start"
 */
export async function claimRun(storageDir, label) {
	const dir = path.join(storageDir, 'run');
	fs.mkdirSync(dir, { recursive: true });
	const own = path.join(dir, 'orchestrator.json');
	/** @type {OrchestratorRecord | null} */
	const previous = readJson(own);
	if (previous && previous.pid !== process.pid && stillOurs(previous.pid, previous.script)) {
		fatal(
			`another \`${previous.label}\` (pid ${previous.pid}) is running with ${path.relative(process.cwd(), storageDir) || storageDir}; ` +
				`stop it first (Ctrl-C in its terminal, or: kill ${previous.pid})`
		);
	}
	if (previous && previous.pid !== process.pid) await waitForReaper(dir);
	const leftovers = await cleanUpLeftovers(dir, { stopPostgres: false });
	if (previous || leftovers.length) {
		const what = leftovers.length ? `: ${leftovers.join(', ')}` : '';
		warn(
			`an earlier \`${previous?.label ?? 'run'}\`${previous ? ` (pid ${previous.pid})` : ''} ended without cleaning up${what}`
		);
	}
	const script = process.argv[1] ?? '';
	writeJson(own, {
		pid: process.pid,
		script,
		label,
		startedAt: new Date().toISOString()
	});
	runDir = dir;
	startReaper(dir);
}

/** A dead run's watcher may be cleaning up right now: let it finish rather than race it. */
async function waitForReaper(/** @type {string} */ dir) {
	const reaper = readJson(path.join(dir, 'reaper.json'));
	if (!reaper || !stillOurs(reaper.pid, 'reaper.js')) return;
	const deadline = Date.now() + 30_000;
	while (isAlive(reaper.pid) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
}

function startReaper(/** @type {string} */ dir) {
	const reaper = path.join(path.dirname(fileURLToPath(import.meta.url)), 'reaper.js');
	const log = fs.openSync(path.join(dir, 'reaper.log'), 'a');
	const child = spawn(process.execPath, [reaper, dir, String(process.pid)], {
		detached: true,
		stdio: ['ignore', log, log]
	});
	child.unref();
	fs.closeSync(log);
	writeJson(path.join(dir, 'reaper.json'), { pid: child.pid });
}

/** @param {string} name @param {number} pid @param {string} marker */
export function recordService(name, pid, marker) {
	if (!runDir) return;
	writeJson(path.join(runDir, `service-${name}.json`), { name, pid, marker });
}

/** @param {string} name */
export function forgetService(name) {
	if (runDir) fs.rmSync(path.join(runDir, `service-${name}.json`), { force: true });
}

/** @param {string} dataDir @param {number} port */
export function recordPostgres(dataDir, port) {
	if (runDir) writeJson(path.join(runDir, 'postgres.json'), { dataDir, port });
}

export function forgetPostgres() {
	if (runDir) fs.rmSync(path.join(runDir, 'postgres.json'), { force: true });
}

/** The run ended cleanly: remove its records (the watcher sees that and exits). */
export function releaseRun() {
	if (!runDir) return;
	for (const f of fs.readdirSync(runDir)) {
		if (!['orchestrator.json', 'reaper.log', 'reaper.json'].includes(f))
			fs.rmSync(path.join(runDir, f), { force: true });
	}
	fs.rmSync(path.join(runDir, 'orchestrator.json'), { force: true });
	runDir = null;
}
