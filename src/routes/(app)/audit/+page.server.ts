import { error } from '@sveltejs/kit';
import { AUDIT_ACTIONS } from '$lib/audit/actions';
import { parseAuditFilter } from '$lib/schemas/audit';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { AUDIT_REFUSAL, listAuditEvents, mayReadAudit } from '$lib/server/repositories/audit';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	if (!mayReadAudit(event.locals.viewer)) error(403, AUDIT_REFUSAL);
	const parsed = parseAuditFilter(event.url.searchParams);
	const actions = Object.entries(AUDIT_ACTIONS).map(([value, label]) => ({ value, label }));
	const values = Object.fromEntries(event.url.searchParams);
	if (!parsed.success) {
		const errors = Object.fromEntries(
			parsed.error.issues.map((i) => [String(i.path[0] ?? 'form'), i.message])
		);
		return { actions, values, errors, rows: [], total: 0, page: 1, pageSize: 1 };
	}
	const result = await listAuditEvents(getDb(), event.locals.viewer, parsed.data);
	return {
		actions,
		values,
		errors: {} as Record<string, string>,
		rows: result.rows.map((r) => ({ ...r, at: r.at.toISOString() })),
		total: result.total,
		page: parsed.data.page,
		pageSize: result.pageSize,
		admin: event.locals.viewer.isPlatformAdmin
	};
};
