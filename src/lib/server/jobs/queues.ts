import type PgBoss from 'pg-boss';

/**
 * The product's queues on its one job queue (pg-boss in PostgreSQL): name and retry policy each.
 * Mail: an unreachable mail server must not lose a message or fail the action that sent it, so
 * delivery is retried with exponential backoff (10 s, 20 s, 40 s, … about 2.8 hours in all).
 */
export const QUEUES = {
	mail: { name: 'mail', retryLimit: 10, retryDelay: 10, retryBackoff: true, expireInSeconds: 120 },
	// Periodic clean-up (expired pending uploads); a missed run is simply done by the next one.
	housekeeping: { name: 'housekeeping', retryLimit: 1, expireInSeconds: 600 },
	// Heat-flow grids: a worker that dies mid-job (killed, restarted) leaves its job active until
	// it expires, then pg-boss hands it to a worker again; the job starts the grid afresh.
	grid: { name: 'grid', retryLimit: 3, retryDelay: 5, expireInSeconds: 900 },
	// Embargo release (embargo-release.ts): idempotent, so a failed or missed run is redone by the next.
	embargoRelease: { name: 'embargo-release', retryLimit: 2, retryDelay: 60, expireInSeconds: 600 },
	// Writing an import's sites (one transaction, 100 000 rows in well under a minute). A crashed
	// worker's job comes back after its expiry; the batch itself is also re-queued at start
	// (import-queue.ts), and fails visibly after IMPORT_MAX_ATTEMPTS takes.
	import: { name: 'import', retryLimit: 3, retryDelay: 30, expireInSeconds: 900 }
} as const satisfies Record<string, PgBoss.Queue>;

/** Cron schedules (pg-boss keeps one per queue, whichever instance sets it; UTC). */
export const SCHEDULES = { housekeeping: '17 * * * *', embargoRelease: '2 * * * *' } as const;

/** Create every queue (pg-boss 10 needs a queue before its first job); safe to repeat. */
export async function ensureQueues(boss: PgBoss, queues: PgBoss.Queue[] = Object.values(QUEUES)) {
	const existing = new Set((await boss.getQueues()).map((q) => q.name));
	for (const queue of queues) {
		if (!existing.has(queue.name)) await boss.createQueue(queue.name, queue);
	}
}
