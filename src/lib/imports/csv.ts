// CSV / delimited text → ParsedTable, with papaparse. The delimiter is chosen among , ; tab |
// by which one gives the header's field count on every early row (papaparse's own guess can pick
// the comma in a semicolon file full of decimal commas).

import Papa from 'papaparse';
import { ImportFormatError, type Cell, type ParsedTable } from './types';

export const CSV_DELIMITERS = [',', ';', '\t', '|'] as const;
export type CsvDelimiter = (typeof CSV_DELIMITERS)[number];

export interface CsvOptions {
	/** Force a delimiter instead of detecting one. */
	delimiter?: CsvDelimiter;
}

const PREVIEW_RECORDS = 50;

function isBlankRecord(record: string[]): boolean {
	return record.every((f) => f.trim() === '');
}

/** Picks the delimiter whose field count is > 1 and the same on the header and every early row. */
export function detectDelimiter(text: string): CsvDelimiter {
	let best: { d: CsvDelimiter; score: number; fields: number } | null = null;
	for (const d of CSV_DELIMITERS) {
		const res = Papa.parse<string[]>(text, { delimiter: d, preview: PREVIEW_RECORDS });
		const records = res.data.filter((r) => !isBlankRecord(r));
		if (records.length === 0) continue;
		const fields = records[0].length;
		if (fields < 2) continue;
		const same = records.filter((r) => r.length === fields).length / records.length;
		const score = same * 1000 + fields;
		if (!best || score > best.score) best = { d, score, fields };
	}
	return best?.d ?? ',';
}

/**
 * Parses delimited text (UTF-8, BOM optional; quoted fields may hold delimiters and newlines) into
 * a table. Blank lines are skipped but still counted, so row numbers match the spreadsheet.
 */
export function parseCsv(text: string, options: CsvOptions = {}): ParsedTable {
	const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
	const delimiter = options.delimiter ?? detectDelimiter(body);
	const res = Papa.parse<string[]>(body, { delimiter, skipEmptyLines: false });
	const quoteError = res.errors.find((e) => e.type === 'Quotes');
	if (quoteError)
		throw new ImportFormatError(
			`Row ${(quoteError.row ?? 0) + 1}: ${quoteError.message} (a quote " opened and never closed)`,
			{ row: (quoteError.row ?? 0) + 1 }
		);
	const records = res.data;
	const headerIndex = records.findIndex((r) => !isBlankRecord(r));
	if (headerIndex < 0) throw new ImportFormatError('The file is empty: no header row found.');
	const headers = records[headerIndex].map((h, i) => h.trim() || `Column ${i + 1}`);
	const rows: Cell[][] = [];
	const sourceRowNumbers: number[] = [];
	for (let i = headerIndex + 1; i < records.length; i++) {
		const record = records[i];
		if (isBlankRecord(record)) continue;
		const rowNumber = i + 1;
		if (record.length > headers.length) {
			const extra = record.slice(headers.length);
			if (extra.some((f) => f.trim() !== ''))
				throw new ImportFormatError(
					`Row ${rowNumber} has ${record.length} fields but the header has ${headers.length}; ` +
						`extra value ${JSON.stringify(extra.find((f) => f.trim() !== ''))} has no column.`,
					{ row: rowNumber }
				);
		}
		const row: Cell[] = headers.map((_, c) => record[c] ?? null);
		rows.push(row);
		sourceRowNumbers.push(rowNumber);
	}
	return {
		headers,
		rows,
		sourceRowNumbers,
		rowKind: 'row',
		decimalComma: delimiter !== ',',
		source: { format: 'csv', delimiter }
	};
}
