// A small LAS 2.0 reader (Canadian Well Logging Society's open ASCII well-log standard). Written
// here because only header sections, curves and unwrapped ~A data are needed, and the format is a
// few line rules: `MNEM.UNIT  DATA : DESCRIPTION` (the unit runs from the first '.' to the first
// space, the description from the last ':'), sections start with '~' and '#' lines are comments.

import { ImportFormatError } from './types';
import { clipToken, quoteToken } from './quote';

export interface LasItem {
	mnemonic: string;
	unit: string;
	value: string;
	description: string;
	/** 1-based line number in the file. */
	line: number;
}

export interface LasCurve extends LasItem {
	/** One value per depth step; the file's NULL value becomes null. */
	values: (number | null)[];
}

export interface LasFile {
	version: string;
	wrap: boolean;
	well: LasItem[];
	curves: LasCurve[];
	parameters: LasItem[];
	other: string;
	/** The NULL value the file declares (often -999.25), or null. */
	nullValue: number | null;
	/** 1-based line number of each data row. */
	dataLines: number[];
}

/** Parses one header line `MNEM.UNIT DATA : DESCRIPTION`; null when it has no '.'. */
export function parseLasLine(text: string, line: number): LasItem | null {
	const dot = text.indexOf('.');
	if (dot < 0) return null;
	const mnemonic = text.slice(0, dot).trim();
	const rest = text.slice(dot + 1);
	const space = rest.search(/\s/);
	const unit = space < 0 ? rest : rest.slice(0, space);
	const afterUnit = space < 0 ? '' : rest.slice(space);
	const colon = afterUnit.lastIndexOf(':');
	const value = (colon < 0 ? afterUnit : afterUnit.slice(0, colon)).trim();
	const description = colon < 0 ? '' : afterUnit.slice(colon + 1).trim();
	return { mnemonic, unit: unit.replace(/:$/, ''), value, description, line };
}

/** Finds a header item by mnemonic (case-insensitive). */
export function lasItem(items: readonly LasItem[], mnemonic: string): LasItem | undefined {
	const m = mnemonic.toUpperCase();
	return items.find((i) => i.mnemonic.toUpperCase() === m);
}

/**
 * Parses LAS 2.0 (and 1.2) text with WRAP NO; throws ImportFormatError naming the line for
 * WRAP YES, LAS 3.0, a missing ~C or ~A section, or a data line with the wrong number of values.
 */
export function parseLas(text: string): LasFile {
	const lines = (text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).split(/\r\n|\r|\n/);
	const sections: Record<string, LasItem[]> = { V: [], W: [], C: [], P: [] };
	let other = '';
	let section: string | null = null;
	let dataStart = -1;
	for (let i = 0; i < lines.length && dataStart < 0; i++) {
		const raw = lines[i];
		const trimmed = raw.trim();
		if (trimmed === '' || trimmed.startsWith('#')) continue;
		if (trimmed.startsWith('~')) {
			section = trimmed.charAt(1).toUpperCase();
			if (section === 'A') dataStart = i + 1;
			continue;
		}
		if (section === null)
			throw new ImportFormatError(
				`LAS line ${i + 1}: text before the first ~ section; is this a LAS file?`,
				{ row: i + 1 }
			);
		if (section === 'O') {
			other += (other ? '\n' : '') + trimmed;
			continue;
		}
		const list = sections[section];
		if (!list) continue; // unknown section letters are ignored as the standard allows
		const item = parseLasLine(raw, i + 1);
		if (!item)
			throw new ImportFormatError(
				`LAS line ${i + 1}: expected "MNEMONIC.UNIT VALUE : DESCRIPTION"; got ${quoteToken(trimmed)}.`,
				{ row: i + 1, value: trimmed }
			);
		list.push(item);
	}
	const vers = lasItem(sections.V, 'VERS');
	const version = vers?.value ?? '';
	if (!vers) throw new ImportFormatError('LAS: the ~VERSION section has no VERS line.');
	if (!/^(1\.2|2(\.0+)?)$/.test(version))
		throw new ImportFormatError(
			`LAS line ${vers.line}: version ${quoteToken(version)} is not supported; only LAS 2.0 (and 1.2) are read.`,
			{ row: vers.line, value: version }
		);
	const wrapItem = lasItem(sections.V, 'WRAP');
	const wrap = /^y/i.test(wrapItem?.value ?? 'NO');
	if (wrap)
		throw new ImportFormatError(
			`LAS line ${wrapItem!.line}: WRAP YES (wrapped data lines) is not supported; export the log with WRAP NO (one depth step per line).`,
			{ row: wrapItem!.line, value: wrapItem!.value }
		);
	if (sections.C.length === 0)
		throw new ImportFormatError('LAS: no ~CURVE section, or it lists no curves.');
	if (dataStart < 0) throw new ImportFormatError('LAS: no ~ASCII (~A) data section.');
	const nullItem = lasItem(sections.W, 'NULL');
	// LAS 1.2 keeps some well values in the description field; NULL's value is in the data field in both.
	const nullValue = nullItem && nullItem.value !== '' ? Number(nullItem.value) : null;
	if (nullItem && nullValue !== null && !Number.isFinite(nullValue))
		throw new ImportFormatError(
			`LAS line ${nullItem.line}: NULL value ${quoteToken(nullItem.value)} is not a number.`,
			{ row: nullItem.line }
		);
	const curves: LasCurve[] = sections.C.map((c) => ({ ...c, values: [] }));
	const dataLines: number[] = [];
	for (let i = dataStart; i < lines.length; i++) {
		const trimmed = lines[i].trim();
		if (trimmed === '' || trimmed.startsWith('#')) continue;
		if (trimmed.startsWith('~')) break;
		const fields = trimmed.split(/[\s,]+/);
		if (fields.length !== curves.length)
			throw new ImportFormatError(
				`LAS line ${i + 1}: ${fields.length} values but ${curves.length} curves are defined in ~CURVE.`,
				{ row: i + 1, value: trimmed }
			);
		for (let c = 0; c < fields.length; c++) {
			const v = Number(fields[c]);
			if (!Number.isFinite(v) || fields[c] === '')
				throw new ImportFormatError(
					`LAS line ${i + 1}, curve ${clipToken(curves[c].mnemonic)}: ${quoteToken(fields[c])} is not a number.`,
					{ row: i + 1, column: curves[c].mnemonic, value: fields[c] }
				);
			curves[c].values.push(nullValue !== null && v === nullValue ? null : v);
		}
		dataLines.push(i + 1);
	}
	return {
		version,
		wrap,
		well: sections.W,
		curves,
		parameters: sections.P,
		other,
		nullValue,
		dataLines
	};
}
