// @ts-check
/**
 * Watches one orchestrator run (scripts/lib/runstate.js) from a detached process. When the run's
 * process is gone but its records are still there (it was killed with SIGKILL, its terminal
 * closed, the machine ran out of memory), it stops the services and the PostgreSQL cluster the
 * run had recorded, then exits. When the run ends cleanly it removes its records and this exits too.
 * Usage (started by runstate.js): node scripts/lib/reaper.js <run folder> <orchestrator pid>
 */
import fs from 'node:fs';
import path from 'node:path';
import { cleanUpLeftovers, isAlive } from './runstate.js';

const [dir, pidText] = process.argv.slice(2);
const pid = Number(pidText);
const record = path.join(dir, 'orchestrator.json');

function ownerPid() {
	try {
		return JSON.parse(fs.readFileSync(record, 'utf8')).pid;
	} catch {
		return null;
	}
}

for (;;) {
	await new Promise((r) => setTimeout(r, 250));
	// Someone else's record (a newer run took over) or none (clean end): nothing to do.
	if (ownerPid() !== pid) process.exit(0);
	if (isAlive(pid)) continue;
	const done = await cleanUpLeftovers(dir, { stopPostgres: true });
	if (ownerPid() === pid) fs.rmSync(record, { force: true });
	console.log(
		`${new Date().toISOString()} run ${pid} died without cleaning up; ${done.join(', ') || 'nothing was running'}`
	);
	process.exit(0);
}
