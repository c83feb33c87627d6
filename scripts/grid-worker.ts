/**
 * A grid worker apart from the web servers: `node --import tsx scripts/grid-worker.ts`, with the
 * app's environment (DATABASE_URL at least). Takes heat-flow grid jobs from the one job queue,
 * one at a time, until SIGTERM/SIGINT (a running grid is left to pg-boss's expiry and retry).
 * Start one per core you want to give to grids; see src/lib/server/jobs/README.md.
 */
import { createDb } from '../src/lib/server/db/client';
import { createBoss } from '../src/lib/server/jobs/boss';
import { workGridQueue } from '../src/lib/server/jobs/grid-queue';
import { ensureQueues } from '../src/lib/server/jobs/queues';

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('grid worker: DATABASE_URL is not set');
	process.exit(2);
}
const { db, client } = createDb(url, { max: 2 });
const boss = createBoss(url);
await boss.start();
await ensureQueues(boss);
await workGridQueue(boss, db);
console.log('grid worker: taking grid jobs');

const stop = async () => {
	await boss.stop({ graceful: true, timeout: 10_000 });
	await client.end({ timeout: 5 });
	process.exit(0);
};
process.once('SIGTERM', () => void stop());
process.once('SIGINT', () => void stop());
