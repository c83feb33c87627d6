import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { importBatch } from '../db/schema';

/** An import still 'running' after this long lost its process: its transaction was rolled back. */
export const STALE_IMPORT_MS = 2 * 60 * 60 * 1000;

/**
 * Mark imports whose process stopped mid-way as failed, so their progress bars end with a clear
 * message instead of spinning forever. Their rows were never committed (one transaction).
 */
export async function failStaleImports(db: Db, now = new Date()): Promise<number> {
	const rows = await db
		.update(importBatch)
		.set({
			status: 'failed',
			doneRows: 0,
			finishedAt: now,
			error: 'The server stopped during the import; nothing was written. Import the file again.'
		})
		.where(
			and(
				eq(importBatch.status, 'running'),
				// The last sign of life: a draft may wait long before it is committed.
				sql`coalesce(${importBatch.heartbeatAt}, ${importBatch.createdAt}) < ${new Date(now.getTime() - STALE_IMPORT_MS).toISOString()}::timestamptz`
			)
		)
		.returning({ id: importBatch.id });
	return rows.length;
}
