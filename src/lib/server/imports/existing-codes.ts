import { and, eq, inArray } from 'drizzle-orm';
import type { ImportPreview } from '$lib/imports';
import type { Db } from '../db/client';
import { site } from '../db/schema';

/**
 * Site codes must be unique within a dataset: a row whose code the dataset already holds is an
 * error in the preview (re-importing corrected values is an edit, not a second site).
 */
export async function markExistingCodes(
	db: Db,
	datasetId: string,
	preview: ImportPreview,
	codeColumn: string
) {
	const codes = preview.rows.flatMap((r) => (r.site ? [r.site.code] : []));
	if (codes.length === 0) return;
	const taken = new Set<string>();
	for (let i = 0; i < codes.length; i += 10_000) {
		const rows = await db
			.select({ code: site.code })
			.from(site)
			.where(and(eq(site.datasetId, datasetId), inArray(site.code, codes.slice(i, i + 10_000))));
		for (const r of rows) taken.add(r.code);
	}
	if (taken.size === 0) return;
	for (const r of preview.rows) {
		if (!r.site || !taken.has(r.site.code)) continue;
		const issue = {
			row: r.row,
			siteCode: r.site.code,
			severity: 'error' as const,
			column: codeColumn,
			value: r.site.code,
			code: 'code.exists',
			message: `Row ${r.row} (site ${r.site.code}), column "${codeColumn}": site ${JSON.stringify(r.site.code)} exists in this dataset already.`
		};
		r.errors.push(issue);
		preview.issues.push(issue);
		r.site = null;
		preview.errorCount += 1;
		preview.validCount -= 1;
	}
	preview.canImport = false;
	// Keep the report in row order, errors before warnings, as the library does.
	const rank = (i: { row: number | null; severity: string }) =>
		(i.row ?? 0) * 2 + (i.severity === 'error' ? 0 : 1);
	preview.issues.sort((a, b) => rank(a) - rank(b));
}
