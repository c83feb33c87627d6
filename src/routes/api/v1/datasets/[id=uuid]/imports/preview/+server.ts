import { json } from '@sveltejs/kit';
import { issuesToCsv } from '$lib/imports';
import { getDb } from '$lib/server/db';
import { requireUploader, requireUser } from '$lib/server/guards';
import { serverPreview } from '$lib/server/imports/server-preview';
import { limitUser } from '$lib/server/rate-limit';
import type { RequestHandler } from './$types';

const ISSUES_SHOWN = 2000;
const ROWS_SHOWN = 25;

/** Validate an upload without writing anything: counts, issues, the first rows as they will be stored. */
export const POST: RequestHandler = async (event) => {
	// Counted before the body is read: the limit is about the work a preview costs.
	await limitUser(getDb(), event, requireUser(event, 'action').id, 'import-preview');
	const { payload } = await requireUploader(event, event.params.id);
	const { preview, previousImport } = await serverPreview(
		getDb(),
		event.locals.viewer,
		event.params.id,
		payload
	);
	return json({
		errorCount: preview.errorCount,
		warningCount: preview.warningCount,
		validCount: preview.validCount,
		totalRows: payload.table.rows.length,
		canImport: preview.canImport,
		ignoredColumns: preview.ignoredColumns,
		issues: preview.issues.slice(0, ISSUES_SHOWN),
		issuesTruncated: preview.issues.length > ISSUES_SHOWN,
		rows: preview.rows.slice(0, ROWS_SHOWN).map((r) => ({
			row: r.row,
			site: r.site ?? r.values,
			ok: r.site !== null,
			errors: r.errors.length,
			warnings: r.warnings.length
		})),
		reportCsv: issuesToCsv(preview.issues),
		previousImport
	});
};
