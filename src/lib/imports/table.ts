// One entry point for every table format: picks the reader from the file name.

import { parseCsv, type CsvOptions } from './csv';
import { parseGeoJson } from './geojson';
import { ImportFormatError, type ParsedTable } from './types';
import { parseXlsx, type XlsxOptions } from './xlsx';

export type TableFormat = 'csv' | 'xlsx' | 'geojson';

/** Format from a file name's extension (.csv .tsv .txt, .xlsx, .geojson .json); null if unknown. */
export function formatFromFileName(fileName: string): TableFormat | null {
	const ext = /\.([a-z0-9]+)$/i.exec(fileName)?.[1]?.toLowerCase();
	if (ext === 'csv' || ext === 'tsv' || ext === 'txt') return 'csv';
	if (ext === 'xlsx') return 'xlsx';
	if (ext === 'geojson' || ext === 'json') return 'geojson';
	return null;
}

function asText(data: string | ArrayBuffer | Uint8Array): string {
	if (typeof data === 'string') return data;
	try {
		return new TextDecoder('utf-8', { fatal: true }).decode(data);
	} catch {
		throw new ImportFormatError(
			'The file is not UTF-8 text; save it as "CSV UTF-8" and upload again.'
		);
	}
}

/** Reads an uploaded file (text or bytes) into a ParsedTable, choosing the reader by `fileName`. */
export async function parseTableFile(
	fileName: string,
	data: string | ArrayBuffer | Uint8Array,
	options: CsvOptions & XlsxOptions = {}
): Promise<ParsedTable> {
	const format = formatFromFileName(fileName);
	if (format === 'xlsx') {
		if (typeof data === 'string')
			throw new ImportFormatError('An .xlsx file must be read as bytes, not text.');
		return parseXlsx(data, options);
	}
	if (format === 'geojson') return parseGeoJson(asText(data));
	if (format === 'csv') return parseCsv(asText(data), options);
	throw new ImportFormatError(
		`Cannot read ${JSON.stringify(fileName)}: use .csv, .tsv, .txt, .xlsx, .geojson or .json (.xls is not supported; save as .xlsx).`
	);
}
