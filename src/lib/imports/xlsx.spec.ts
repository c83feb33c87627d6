import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { parseXlsx } from './xlsx';

async function workbook(): Promise<Uint8Array> {
	const wb = new ExcelJS.Workbook();
	wb.addWorksheet('Notes').addRow(['invented demo workbook']);
	const ws = wb.addWorksheet('Sites');
	ws.addRow(['code', 'q (mW/m2)', 'k', 'measured', 'remarks']);
	ws.addRow([
		'A-1',
		61.5,
		{ formula: 'B2*0+2.5', result: 2.5 },
		new Date(Date.UTC(1987, 5, 1)),
		{ richText: [{ text: 'rich ' }, { font: { bold: true }, text: 'text' }] }
	]);
	ws.addRow([]);
	ws.addRow(['A-2', '12,5', null, 1990, { text: 'link', hyperlink: 'https://example.org' }]);
	const buf = await wb.xlsx.writeBuffer();
	return new Uint8Array(buf as ArrayBuffer);
}

describe('parseXlsx', () => {
	it('reads a named sheet: numbers, formula results, dates, rich text, hyperlinks; sheet row numbers', async () => {
		const t = await parseXlsx(await workbook(), { sheet: 'Sites' });
		expect(t.headers).toEqual(['code', 'q (mW/m2)', 'k', 'measured', 'remarks']);
		expect(t.rows[0].slice(0, 3)).toEqual(['A-1', 61.5, 2.5]);
		expect((t.rows[0][3] as Date).getUTCFullYear()).toBe(1987);
		expect(t.rows[0][4]).toBe('rich text');
		expect(t.rows[1]).toEqual(['A-2', '12,5', null, 1990, 'link']);
		expect(t.sourceRowNumbers).toEqual([2, 4]);
		expect(t.source).toEqual({ format: 'xlsx', sheet: 'Sites' });
	});
	it('reads the first sheet by default, from an ArrayBuffer', async () => {
		const bytes = await workbook();
		const t = await parseXlsx(
			bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer
		);
		expect(t.headers).toEqual(['invented demo workbook']);
	});
	it('names the missing sheet and rejects non-workbooks', async () => {
		await expect(parseXlsx(await workbook(), { sheet: 'Nope' })).rejects.toThrow(
			/no sheet named "Nope" \(sheets: Notes, Sites\)/
		);
		await expect(parseXlsx(new TextEncoder().encode('not a zip'))).rejects.toThrow(
			/not a readable .xlsx/
		);
	});
});
