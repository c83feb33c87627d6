// A parsed table as JSON and back. Dates (XLSX date cells) are tagged, so a date read from a
// spreadsheet is a Date again when the table is read back, not an ISO string that the year check
// would refuse.

import type { Cell, ParsedTable } from './types';

export type JsonCell = string | number | boolean | null | { date: string };

export interface JsonTable extends Omit<ParsedTable, 'rows'> {
	rows: JsonCell[][];
}

const encodeCell = (c: Cell): JsonCell =>
	c instanceof Date
		? { date: c.toISOString() }
		: typeof c === 'number' && !Number.isFinite(c)
			? String(c) // JSON has no Infinity; keep it as text so the row check refuses it by name
			: c;

const decodeCell = (c: JsonCell): Cell =>
	c !== null && typeof c === 'object' ? new Date(c.date) : c;

export function encodeTable(table: ParsedTable): JsonTable {
	return { ...table, rows: table.rows.map((r) => r.map(encodeCell)) };
}

export function decodeTable(json: JsonTable): ParsedTable {
	return { ...json, rows: json.rows.map((r) => r.map(decodeCell)) };
}
