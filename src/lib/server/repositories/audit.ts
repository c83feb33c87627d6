import { error } from '@sveltejs/kit';
import { and, count, desc, eq, gte, ilike, inArray, lt, ne, or, sql, type SQL } from 'drizzle-orm';
import type { AuditFilter } from '$lib/schemas/audit';
import { organisationsWhere, requireUuid, visibleImports, type Viewer } from '../access';
import type { Db } from '../db/client';
import { auditEvent, dataset, organisation, user } from '../db/schema';

/** The client or an open transaction: audit rows are written in the transaction of the change. */
export type DbOrTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

export interface AuditInput {
	action: string;
	/** An id, or a subquery giving it (when the caller only knows the dataset). */
	organisationId: string | SQL | null;
	datasetId: string | null;
	details?: Record<string, unknown>;
}

/** Append one event; the actor's name and address are copied from their account as they are now. */
export async function recordAudit(db: DbOrTx, viewer: Pick<Viewer, 'userId'>, event: AuditInput) {
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

export const AUDIT_PAGE_SIZE = 50;
/** An export holds at most this many events; narrow the filter for more. */
export const AUDIT_EXPORT_MAX = 100_000;
export const AUDIT_REFUSAL =
	'Only curators and owners (for their organisations) and platform administrators may read the audit log.';

/**
 * Which events the viewer may read: platform administrators all (the platform's oversight),
 * curators and owners those of their organisations (`audit:read` of permissions.ts); null for
 * everyone else.
 */
function auditScope(viewer: Viewer): SQL | null {
	if (viewer.isPlatformAdmin) return sql`true`;
	const own = organisationsWhere(viewer, 'audit', 'read');
	return own.length ? inArray(auditEvent.organisationId, own) : null;
}

export function mayReadAudit(viewer: Viewer): boolean {
	return auditScope(viewer) !== null;
}

function auditConditions(viewer: Viewer, f: AuditFilter): SQL {
	const scope = auditScope(viewer);
	if (!scope) error(403, AUDIT_REFUSAL);
	const c: SQL[] = [scope];
	if (f.action) c.push(eq(auditEvent.action, f.action));
	if (f.dataset) c.push(eq(auditEvent.datasetId, f.dataset));
	if (f.actor) {
		const pattern = `%${f.actor.replace(/[\\%_]/g, (ch) => `\\${ch}`)}%`;
		c.push(or(ilike(auditEvent.actorName, pattern), ilike(auditEvent.actorEmail, pattern))!);
	}
	// Whole days in UTC, the last one included.
	if (f.from) c.push(gte(auditEvent.at, sql`(${f.from}::date)::timestamp AT TIME ZONE 'UTC'`));
	if (f.to) c.push(lt(auditEvent.at, sql`(${f.to}::date + 1)::timestamp AT TIME ZONE 'UTC'`));
	return and(...c)!;
}

const auditColumns = {
	id: auditEvent.id,
	at: auditEvent.at,
	action: auditEvent.action,
	actorId: auditEvent.actorId,
	actorName: auditEvent.actorName,
	actorEmail: auditEvent.actorEmail,
	organisationId: auditEvent.organisationId,
	organisationName: organisation.name,
	datasetId: auditEvent.datasetId,
	datasetTitle: dataset.title,
	datasetVersion: dataset.version,
	details: auditEvent.details
};

function auditQuery(db: Db, viewer: Viewer, f: AuditFilter) {
	return db
		.select(auditColumns)
		.from(auditEvent)
		.leftJoin(organisation, eq(auditEvent.organisationId, organisation.id))
		.leftJoin(dataset, eq(auditEvent.datasetId, dataset.id))
		.where(auditConditions(viewer, f))
		.orderBy(desc(auditEvent.at), desc(auditEvent.id));
}

/** One page of the audit log, newest first, with the number of matching events. */
export async function listAuditEvents(db: Db, viewer: Viewer, f: AuditFilter) {
	const [rows, [{ total }]] = await Promise.all([
		auditQuery(db, viewer, f)
			.limit(AUDIT_PAGE_SIZE)
			.offset((f.page - 1) * AUDIT_PAGE_SIZE),
		db.select({ total: count() }).from(auditEvent).where(auditConditions(viewer, f))
	]);
	return { rows, total, pageSize: AUDIT_PAGE_SIZE };
}

export type AuditRow = Awaited<ReturnType<typeof listAuditEvents>>['rows'][number];

/** Every matching event (up to AUDIT_EXPORT_MAX) for the CSV export; the export is recorded too. */
export async function auditEventsForExport(db: Db, viewer: Viewer, f: AuditFilter) {
	const rows = await auditQuery(db, viewer, f).limit(AUDIT_EXPORT_MAX);
	await recordAudit(db, viewer, {
		action: 'audit-export',
		organisationId: null,
		datasetId: null,
		details: { filter: { ...f, page: undefined }, events: rows.length }
	});
	return rows;
}
