import type PgBoss from 'pg-boss';
import { and, eq, lt } from 'drizzle-orm';
import { importBatch } from '../db/schema';
import type { Db } from '../db/client';
import { expirePendingAttachments } from '../repositories/attachments';
import { QUEUES, SCHEDULES } from './queues';

/**
 * An announced file whose bytes never arrived (a closed tab, a lost connection) is forgotten after
 * a day. Its bytes were never stored: the app writes a file to the object store only once the
 * whole upload has been checked, so a pending file is a row and nothing else.
 */
export const PENDING_UPLOAD_TTL_HOURS = 24;

/**
 * An import started but never committed keeps its parsed table (up to 100 000 rows) with the
 * batch; after a week it is forgotten. Its file stays with the dataset (an attachment).
 */
export const DRAFT_IMPORT_TTL_DAYS = 7;

/** One clean-up pass; returns what it removed. */
export async function runHousekeeping(db: Db, now = new Date()) {
	const cutoff = new Date(now.getTime() - PENDING_UPLOAD_TTL_HOURS * 3600 * 1000);
	const draftCutoff = new Date(now.getTime() - DRAFT_IMPORT_TTL_DAYS * 24 * 3600 * 1000);
	const drafts = await db
		.delete(importBatch)
		.where(and(eq(importBatch.status, 'draft'), lt(importBatch.createdAt, draftCutoff)))
		.returning({ id: importBatch.id });
	return {
		expiredUploads: await expirePendingAttachments(db, cutoff),
		expiredImportDrafts: drafts.length
	};
}

/** Schedule the hourly pass and take its jobs in this process. */
export async function startHousekeeping(boss: PgBoss, db: Db) {
	await boss.schedule(QUEUES.housekeeping.name, SCHEDULES.housekeeping);
	await boss.work(QUEUES.housekeeping.name, async () => {
		const done = await runHousekeeping(db);
		if (done.expiredUploads)
			console.log(`housekeeping: ${done.expiredUploads} expired upload(s) removed`);
		if (done.expiredImportDrafts)
			console.log(`housekeeping: ${done.expiredImportDrafts} abandoned import draft(s) removed`);
	});
}
