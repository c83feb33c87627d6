// XLSX workbook → ParsedTable, with exceljs. Row numbers are the sheet's own row numbers.

import ExcelJS from 'exceljs';
import { ImportFormatError, type Cell, type ParsedTable } from './types';

export interface XlsxOptions {
	/** Sheet name to read; default the first sheet. */
	sheet?: string;
}

/** Reduces an exceljs cell value (rich text, formula, hyperlink, date, error) to a plain Cell. */
export function xlsxCellValue(value: ExcelJS.CellValue): Cell {
	if (value === null || value === undefined) return null;
	if (typeof value === 'number' || typeof value === 'string' || typeof value === 'boolean')
		return value;
	if (value instanceof Date) return value;
	if (typeof value === 'object') {
		if ('richText' in value) return value.richText.map((r) => r.text).join('');
		if ('formula' in value || 'sharedFormula' in value) {
			const result = (value as ExcelJS.CellFormulaValue).result;
			if (result !== null && typeof result === 'object' && 'error' in result)
				return String(result.error);
			return xlsxCellValue((result ?? null) as ExcelJS.CellValue);
		}
		if ('hyperlink' in value) return (value as ExcelJS.CellHyperlinkValue).text;
		if ('error' in value) return String((value as ExcelJS.CellErrorValue).error);
	}
	return String(value);
}

/** Reads the first (or the named) sheet of an .xlsx file given as bytes; header = first non-empty row. */
export async function parseXlsx(
	data: ArrayBuffer | Uint8Array,
	options: XlsxOptions = {}
): Promise<ParsedTable> {
	const workbook = new ExcelJS.Workbook();
	try {
		const bytes = data instanceof Uint8Array ? data : new Uint8Array(data);
		await workbook.xlsx.load(
			bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer
		);
	} catch (e) {
		throw new ImportFormatError(
			`The file is not a readable .xlsx workbook: ${(e as Error).message}`
		);
	}
	const sheet = options.sheet ? workbook.getWorksheet(options.sheet) : workbook.worksheets[0];
	if (!sheet) {
		const names = workbook.worksheets.map((w) => w.name).join(', ');
		throw new ImportFormatError(
			options.sheet
				? `The workbook has no sheet named ${JSON.stringify(options.sheet)} (sheets: ${names}).`
				: 'The workbook has no sheets.'
		);
	}
	let headers: string[] | null = null;
	const rows: Cell[][] = [];
	const sourceRowNumbers: number[] = [];
	let width = 0;
	sheet.eachRow({ includeEmpty: false }, (row, rowNumber) => {
		const values: Cell[] = [];
		row.eachCell({ includeEmpty: true }, (cell, col) => {
			values[col - 1] = xlsxCellValue(cell.value);
		});
		for (let i = 0; i < values.length; i++) if (values[i] === undefined) values[i] = null;
		const text = values.map((v) => (v === null ? '' : String(v).trim()));
		if (text.every((t) => t === '')) return;
		if (!headers) {
			width = values.length;
			headers = text.map((h, i) => h || `Column ${i + 1}`);
			return;
		}
		if (
			values.length > width &&
			values.slice(width).some((v) => v !== null && String(v).trim() !== '')
		)
			throw new ImportFormatError(
				`Row ${rowNumber} has a value in column ${values.length}, right of the last header (column ${width}).`,
				{ row: rowNumber }
			);
		const padded: Cell[] = [];
		for (let i = 0; i < width; i++) padded.push(values[i] ?? null);
		rows.push(padded);
		sourceRowNumbers.push(rowNumber);
	});
	if (!headers)
		throw new ImportFormatError(
			`Sheet ${JSON.stringify(sheet.name)} is empty: no header row found.`
		);
	return {
		headers,
		rows,
		sourceRowNumbers,
		rowKind: 'row',
		decimalComma: true,
		source: { format: 'xlsx', sheet: sheet.name }
	};
}
