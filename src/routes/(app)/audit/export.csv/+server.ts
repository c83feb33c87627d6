import { error } from '@sveltejs/kit';
import { auditCsv } from '$lib/audit/csv';
import { parseAuditFilter } from '$lib/schemas/audit';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { auditEventsForExport } from '$lib/server/repositories/audit';
import type { RequestHandler } from './$types';

/** The audit events the viewer may read, with the audit page's filters, as CSV. */
export const GET: RequestHandler = async (event) => {
	requireUser(event, 'action');
	const parsed = parseAuditFilter(event.url.searchParams);
	if (!parsed.success) error(400, parsed.error.issues[0]?.message ?? 'Check the filters.');
	const rows = await auditEventsForExport(getDb(), event.locals.viewer, parsed.data);
	const day = new Date().toISOString().slice(0, 10);
	return new Response(
		auditCsv(rows, [`Thermalith audit log exported ${new Date().toISOString()}`]),
		{
			headers: {
				'content-type': 'text/csv; charset=utf-8',
				'content-disposition': `attachment; filename="thermalith-audit-${day}.csv"`,
				'cache-control': 'private, no-store'
			}
		}
	);
};
