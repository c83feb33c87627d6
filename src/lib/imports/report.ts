// The preview's issues as a downloadable CSV (row, site code, severity, column, message).

import { writeCsv } from '../csv/write';
import type { ImportIssue } from './types';

/** Renders issues as CSV text with a header; row is empty for whole-file issues. */
export function issuesToCsv(issues: readonly ImportIssue[]): string {
	return writeCsv(
		['row', 'code', 'severity', 'column', 'message'],
		issues.map((i) => [
			i.row === null ? '' : String(i.row),
			i.siteCode ?? '',
			i.severity,
			i.column,
			i.message
		])
	);
}
