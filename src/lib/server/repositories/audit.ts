import { and, desc, eq, ne, sql } from 'drizzle-orm';
import { requireUuid, visibleImports, type Viewer } from '../access';
import type { Db } from '../db/client';
import { auditEvent, dataset, user } from '../db/schema';

/** The client or an open transaction: audit rows are written in the transaction of the change. */
export type DbOrTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

export interface AuditInput {
	action: string;
	organisationId: string | null;
	datasetId: string | null;
	details?: Record<string, unknown>;
}

/** Append one event; the actor's name and address are copied from their account as they are now. */
export async function recordAudit(db: DbOrTx, viewer: Viewer, event: AuditInput) {
	const actor = viewer.userId;
	await db.insert(auditEvent).values({
		actorId: actor,
		actorName: actor ? sql`(SELECT ${user.name} FROM ${user} WHERE ${user.id} = ${actor})` : null,
		actorEmail: actor ? sql`(SELECT ${user.email} FROM ${user} WHERE ${user.id} = ${actor})` : null,
		action: event.action,
		organisationId: event.organisationId,
		datasetId: event.datasetId,
		details: event.details ?? {}
	});
}

/** A dataset's history, newest first, for members of its organisation (same rule as imports). */
export async function listDatasetHistory(db: Db, viewer: Viewer, datasetId: string, limit = 50) {
	requireUuid(datasetId);
	return (
		db
			.select({
				at: auditEvent.at,
				action: auditEvent.action,
				actorName: auditEvent.actorName,
				details: auditEvent.details
			})
			.from(auditEvent)
			.innerJoin(dataset, eq(auditEvent.datasetId, dataset.id))
			// Downloads are many and not part of the dataset's story; they are on the audit page.
			.where(
				and(
					eq(auditEvent.datasetId, datasetId),
					ne(auditEvent.action, 'download'),
					visibleImports(viewer)
				)
			)
			.orderBy(desc(auditEvent.at))
			.limit(limit)
	);
}
