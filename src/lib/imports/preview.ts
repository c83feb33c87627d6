// A whole parsed table + mapping → the upload preview: every row's stored value, all errors and
// warnings (row order), and the columns left unmapped. Nothing is dropped without a message.

import { checkMapping, unmappedColumns } from './mapping';
import { DEFAULT_NEAR_DISTANCE_M, nearPairs } from './near-duplicates';
import { flagsOf } from '../sites/flags';
import type { ImportIssue, ParsedTable } from './types';
import {
	prepareRowContext,
	validateRow,
	type RowResult,
	type ValidateOptions
} from './validate-row';

export interface ImportPreview {
	rows: RowResult[];
	/** Problems with the mapping or options, not with a row (row = null). */
	fileIssues: ImportIssue[];
	/** Every issue, file issues first, then by row. */
	issues: ImportIssue[];
	errorCount: number;
	warningCount: number;
	/** Rows without errors, i.e. what an import would store. */
	validCount: number;
	/** Headers no field is mapped to (shown so they are not ignored unseen). */
	ignoredColumns: string[];
	/** True when nothing blocks the import. */
	canImport: boolean;
}

/** Validates every row of a table with a mapping and CRS; duplicate site codes are errors. */
export function buildPreview(table: ParsedTable, options: ValidateOptions): ImportPreview {
	const fileIssues = checkMapping(options.mapping, table.headers);
	if (table.rows.length === 0)
		fileIssues.push({
			row: null,
			siteCode: null,
			severity: 'error',
			column: '',
			value: '',
			code: 'file.no-rows',
			message: 'The file has a header but no data rows.'
		});
	const ignoredColumns = unmappedColumns(options.mapping, table.headers);
	if (fileIssues.some((i) => i.severity === 'error'))
		return summarise([], fileIssues, ignoredColumns);
	const ctx = prepareRowContext(table, options);
	const rows: RowResult[] = new Array(table.rows.length);
	const firstRowOfCode = new Map<string, number>();
	const where = table.rowKind === 'feature' ? 'Feature' : 'Row';
	for (let i = 0; i < table.rows.length; i++) {
		const r = validateRow(ctx, i);
		const code = r.values.code;
		if (code !== undefined) {
			const first = firstRowOfCode.get(code);
			if (first === undefined) firstRowOfCode.set(code, r.row);
			else {
				const column = table.headers[options.mapping.code!.column];
				r.errors.push({
					row: r.row,
					siteCode: code,
					severity: 'error',
					column,
					value: code,
					code: 'code.duplicate',
					message: `${where} ${r.row} (site ${code}), column "${column}": ${JSON.stringify(code)} is already used by ${where.toLowerCase()} ${first}; site codes must be unique within the file.`
				});
				r.site = null;
			}
		}
		rows[i] = r;
	}
	markNearDuplicates(rows, where, options.nearDistanceM ?? DEFAULT_NEAR_DISTANCE_M);
	return summarise(rows, fileIssues, ignoredColumns);
}

/**
 * Two sites of the file closer than `maxM`: a warning on the later one naming both, and a flag
 * on its stored site. Rows with errors have no location to compare and are left out.
 */
function markNearDuplicates(rows: RowResult[], where: string, maxM: number) {
	const located = rows.filter((r) => r.site !== null);
	for (const pair of nearPairs(
		located.map((r) => r.site!.location),
		maxM
	)) {
		const a = located[pair.first];
		const b = located[pair.second];
		b.warnings.push({
			row: b.row,
			siteCode: b.site!.code,
			severity: 'warning',
			column: 'Coordinates',
			value: `${b.site!.location.lat}, ${b.site!.location.lon}`,
			code: 'location.near-duplicate',
			message: `${where} ${b.row} (site ${b.site!.code}) is ${Math.round(pair.distanceM)} m from ${where.toLowerCase()} ${a.row} (site ${a.site!.code}) of this file; check they are not the same borehole.`
		});
		b.site!.flags = flagsOf(b.warnings);
	}
}

function summarise(
	rows: RowResult[],
	fileIssues: ImportIssue[],
	ignoredColumns: string[]
): ImportPreview {
	const issues: ImportIssue[] = [...fileIssues];
	let validCount = 0;
	for (const r of rows) {
		for (const e of r.errors) issues.push(e);
		for (const w of r.warnings) issues.push(w);
		if (r.site) r.site.flags = flagsOf(r.warnings);
		if (r.site) validCount++;
	}
	const errorCount = issues.filter((i) => i.severity === 'error').length;
	return {
		rows,
		fileIssues,
		issues,
		errorCount,
		warningCount: issues.length - errorCount,
		validCount,
		ignoredColumns,
		canImport: errorCount === 0 && rows.length > 0
	};
}
