// Reading one cell as a number, integer, year or text, whatever reader produced it.

import type { Cell } from './types';

export type NumberResult =
	| { ok: true; value: number | null }
	| { ok: false; error: string; code: 'number.invalid' | 'number.non-finite' };

const NON_FINITE_ERROR =
	'is not a finite number (infinity or not-a-number, or too large for a double); it cannot be stored';
const NON_FINITE_WORDS = /^[+-]?(inf|infinity|∞|nan)$/i;
const invalid = (error: string): NumberResult => ({ ok: false, error, code: 'number.invalid' });
const nonFinite: NumberResult = { ok: false, error: NON_FINITE_ERROR, code: 'number.non-finite' };
/** `1e999` matches the number pattern but overflows to Infinity, which must never be stored. */
const finite = (value: number): NumberResult =>
	Number.isFinite(value) ? { ok: true, value } : nonFinite;

const PLAIN = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
const COMMA = /^[+-]?(\d+,\d*|,\d+)(e[+-]?\d+)?$/i;

/** True when the cell holds nothing (null, '', whitespace). */
export function isBlank(cell: Cell | undefined): boolean {
	return cell === null || cell === undefined || (typeof cell === 'string' && cell.trim() === '');
}

/** A cell as the user wrote it, for messages ('' when empty). */
export function cellText(cell: Cell | undefined): string {
	if (cell === null || cell === undefined) return '';
	if (cell instanceof Date) return cell.toISOString().slice(0, 10);
	return String(cell).trim();
}

/**
 * Parses a numeric cell; blank → null. Text may use a decimal comma when `decimalComma` (e.g. "12,5");
 * thousands separators and units inside the cell are rejected, never guessed.
 */
export function parseNumberCell(cell: Cell | undefined, decimalComma: boolean): NumberResult {
	if (isBlank(cell)) return { ok: true, value: null };
	if (typeof cell === 'number') return finite(cell);
	if (typeof cell === 'boolean' || cell instanceof Date) return invalid('is not a number');
	const text = String(cell).trim().replace(/−/g, '-');
	if (PLAIN.test(text)) return finite(Number(text));
	if (decimalComma && COMMA.test(text)) return finite(Number(text.replace(',', '.')));
	if (NON_FINITE_WORDS.test(text)) return nonFinite;
	if (!decimalComma && COMMA.test(text))
		return invalid(
			'is not a number (a decimal comma is only read in files whose delimiter is not a comma)'
		);
	return invalid('is not a number');
}

/** Parses a whole non-negative count (e.g. number of samples); blank → null. */
export function parseCountCell(cell: Cell | undefined, decimalComma: boolean): NumberResult {
	const r = parseNumberCell(cell, decimalComma);
	if (!r.ok || r.value === null) return r;
	if (!Number.isInteger(r.value) || r.value < 0) return invalid('is not a whole number ≥ 0');
	return r;
}

/** Parses a calendar year from a number, text or a date cell (its year); blank → null. */
export function parseYearCell(cell: Cell | undefined): NumberResult {
	if (cell instanceof Date) return { ok: true, value: cell.getUTCFullYear() };
	if (isBlank(cell)) return { ok: true, value: null };
	const text = cellText(cell);
	const m = /^(\d{4})(?:[-/.]\d{1,2}(?:[-/.]\d{1,2})?)?$/.exec(text);
	if (!m) return invalid('is not a year (expected e.g. 1987 or 1987-06-01)');
	return { ok: true, value: Number(m[1]) };
}

/** Text of a cell, trimmed; blank → null. */
export function parseTextCell(cell: Cell | undefined): string | null {
	const t = cellText(cell);
	return t === '' ? null : t;
}

/**
 * Control characters (C0 except tab, line feed and carriage return; DEL) in a cell: PostgreSQL
 * text cannot hold NUL at all, and the others are invisible garbage from copy and paste.
 * Returns the first one as `U+0000`, or null.
 */
export function controlCharacter(cell: Cell | undefined): string | null {
	if (typeof cell !== 'string') return null;
	const m = CONTROL.exec(cell);
	return m ? `U+${m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}` : null;
}
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
