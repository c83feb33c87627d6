// Shapes shared by the import modules: one parsed-table shape for CSV, XLSX and GeoJSON, and one
// issue shape for every error and warning shown in the upload preview.

/** A cell as a reader produced it: text (CSV), or a typed value (XLSX, GeoJSON); null when empty. */
export type Cell = string | number | boolean | Date | null;

/** Every reader's output: header names, data rows, and the row number the user sees for each row. */
export interface ParsedTable {
	headers: string[];
	rows: Cell[][];
	/** Spreadsheet row number of each data row (header = row 1), or the 1-based feature number. */
	sourceRowNumbers: number[];
	/** What a row number counts: spreadsheet rows or GeoJSON features. */
	rowKind: 'row' | 'feature';
	/** True when text numbers may use a decimal comma (`12,5`): CSV with a non-comma delimiter. */
	decimalComma: boolean;
	/** Format-specific facts worth showing (delimiter found, sheet read). */
	source: { format: 'csv' | 'xlsx' | 'geojson'; delimiter?: string; sheet?: string };
}

export type Severity = 'error' | 'warning';

/** One finding about one row (or the whole file when row is null). Errors block the import. */
export interface ImportIssue {
	row: number | null;
	/** The row's site code as written (for finding it in the file), null when it has none. */
	siteCode?: string | null;
	severity: Severity;
	/** The user's column header (or a field label when no column is involved). */
	column: string;
	/** The offending value as text, '' when missing. */
	value: string;
	/** A stable machine code for the UI and tests. */
	code: string;
	/** Full sentence naming the row, column and value. */
	message: string;
}

const MESSAGE_MAX = 1000;

/** A file that cannot be read at all (bad structure, not bad values); names where it failed. */
export class ImportFormatError extends Error {
	readonly row: number | null;
	readonly column: string | null;
	readonly value: unknown;

	constructor(message: string, where: { row?: number; column?: string; value?: unknown } = {}) {
		// Parsers quote file content cut short (quote.ts); this bounds what a message can grow to
		// anyway (a list of thousands of curve names), since messages go back to the browser.
		super(message.length > MESSAGE_MAX ? `${message.slice(0, MESSAGE_MAX)}…` : message);
		this.name = 'ImportFormatError';
		this.row = where.row ?? null;
		this.column = where.column ?? null;
		this.value = where.value;
	}
}
