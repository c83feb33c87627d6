import PgBoss from 'pg-boss';
import { ensureQueues } from './queues';

/**
 * A pg-boss instance on the product's PostgreSQL, in its own schema. pg-boss takes a small pool of
 * its own (node-postgres) beside the app's; it creates and migrates its schema when it starts,
 * under a lock, so several app instances can start at once.
 */
export function createBoss(connectionString: string, schema = 'pgboss'): PgBoss {
	const boss = new PgBoss({
		connectionString,
		schema,
		max: 4,
		application_name: 'thermalith-jobs'
	});
	boss.on('error', (err) => console.error('job queue:', err));
	return boss;
}

let started: Promise<PgBoss> | undefined;

/** The app's job queue, started on first use. */
export function jobs(connectionString: string): Promise<PgBoss> {
	started ??= (async () => {
		const boss = createBoss(connectionString);
		await boss.start();
		await ensureQueues(boss);
		return boss;
	})().catch((err) => {
		started = undefined;
		throw err;
	});
	return started;
}

/** Stop taking jobs and let running ones finish (on shutdown). */
export async function stopJobs(): Promise<void> {
	if (!started) return;
	const boss = await started.catch(() => null);
	started = undefined;
	await boss?.stop({ graceful: true, timeout: 10_000 });
}
