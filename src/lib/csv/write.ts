// THE CSV writer of the product: every CSV the product writes (import report, upload template,
// site downloads, audit export) goes through writeCsv, so every cell is neutralised the same way.
// Pure (papaparse only): the import report is built in the browser too.

import Papa from 'papaparse';

/** A cell as callers give it; null and undefined are written as empty cells. */
export type CsvCell = string | number | boolean | null | undefined;

/** Characters that make spreadsheet programs read a cell as a formula (OWASP "CSV injection"). */
const FORMULA_START = /^[=+\-@\t\r]/;
/** A plain decimal number ("-12.5", "+3", "1e-3") is data, not a formula: left as it is. */
const PLAIN_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * The text of one cell, with a leading apostrophe when a spreadsheet would run it as a formula.
 * Own check rather than papaparse's `escapeFormulae`: its pattern (`^[=+\-@\t\r].*$`) does not
 * match a cell with a line break after the formula, and it would also mark negative numbers.
 */
export function neutraliseCell(value: CsvCell): string {
	if (value === null || value === undefined) return '';
	const text = String(value);
	if (typeof value !== 'string') return text;
	return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
}

/** One `# …` comment line per entry; line breaks inside an entry become spaces. */
function commentLines(comments: readonly string[]): string {
	return comments.map((c) => `# ${c.replace(/[\r\n]+/g, ' ')}\n`).join('');
}

/**
 * CSV text (comma-separated, `\n` line ends, a final line end), quoted where needed, every cell
 * neutralised. `comments` become a `#` header block above the column names (readers such as
 * pandas `comment='#'` and R `comment.char='#'` skip it).
 */
export function writeCsv(
	fields: readonly string[],
	rows: readonly (readonly CsvCell[])[],
	comments: readonly string[] = []
): string {
	const body = Papa.unparse(
		{
			fields: fields.map(neutraliseCell),
			data: rows.map((r) => r.map(neutraliseCell))
		},
		{ newline: '\n', escapeFormulae: false }
	);
	return commentLines(comments) + body + '\n';
}
