import { describe, expect, it } from 'vitest';
import { parseYearCell } from './cells';
import { decodeTable, encodeTable } from './table-json';
import type { ParsedTable } from './types';

// A table kept as JSON between the server's parse and its preview: an XLSX date cell must come
// back as a date (its year is read), not as an ISO string the year check refuses.
describe('encodeTable / decodeTable', () => {
	const table: ParsedTable = {
		headers: ['Site', 'Year', 'q'],
		rows: [['XD-1', new Date(Date.UTC(1987, 5, 1)), 62.5]],
		sourceRowNumbers: [2],
		rowKind: 'row',
		decimalComma: false,
		source: { format: 'xlsx', sheet: 'Boreholes' }
	};
	it('keeps date cells dates through JSON', () => {
		const back = decodeTable(JSON.parse(JSON.stringify(encodeTable(table))));
		expect(back).toEqual(table);
		expect(parseYearCell(back.rows[0][1])).toEqual({ ok: true, value: 1987 });
	});
	it('keeps a non-finite number as text, so the row check refuses it by name', () => {
		const t = { ...table, rows: [['XD-2', 2001, Number.POSITIVE_INFINITY]] };
		const back = decodeTable(JSON.parse(JSON.stringify(encodeTable(t))));
		expect(back.rows[0][2]).toBe('Infinity');
	});
});
