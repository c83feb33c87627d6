import { writeCsv } from '../csv/write';

/** An audit event as the export writes it (repositories/audit.ts selects these). */
export interface AuditExportRow {
	at: Date;
	action: string;
	actorName: string | null;
	actorEmail: string | null;
	organisationId: string | null;
	organisationName: string | null;
	datasetId: string | null;
	datasetTitle: string | null;
	details: Record<string, unknown>;
}

/** The audit log as CSV through the one neutralising writer; details as JSON text. */
export function auditCsv(rows: readonly AuditExportRow[], comments: string[] = []): string {
	return writeCsv(
		[
			'at_utc',
			'action',
			'actor_name',
			'actor_email',
			'organisation',
			'organisation_id',
			'dataset',
			'dataset_id',
			'details'
		],
		rows.map((r) => [
			r.at.toISOString(),
			r.action,
			r.actorName,
			r.actorEmail,
			r.organisationName,
			r.organisationId,
			r.datasetTitle,
			r.datasetId,
			JSON.stringify(r.details)
		]),
		comments
	);
}
