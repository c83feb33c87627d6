// Reading one cell as a number, integer, year or text, whatever reader produced it.

import type { Cell } from './types';

export type NumberResult = { ok: true; value: number | null } | { ok: false; error: string };

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
	if (typeof cell === 'number')
		return Number.isFinite(cell)
			? { ok: true, value: cell }
			: { ok: false, error: 'is not a finite number' };
	if (typeof cell === 'boolean' || cell instanceof Date)
		return { ok: false, error: 'is not a number' };
	const text = String(cell).trim().replace(/−/g, '-');
	if (PLAIN.test(text)) return { ok: true, value: Number(text) };
	if (decimalComma && COMMA.test(text)) return { ok: true, value: Number(text.replace(',', '.')) };
	if (!decimalComma && COMMA.test(text))
		return {
			ok: false,
			error:
				'is not a number (a decimal comma is only read in files whose delimiter is not a comma)'
		};
	return { ok: false, error: 'is not a number' };
}

/** Parses a whole non-negative count (e.g. number of samples); blank → null. */
export function parseCountCell(cell: Cell | undefined, decimalComma: boolean): NumberResult {
	const r = parseNumberCell(cell, decimalComma);
	if (!r.ok || r.value === null) return r;
	if (!Number.isInteger(r.value) || r.value < 0)
		return { ok: false, error: 'is not a whole number ≥ 0' };
	return r;
}

/** Parses a calendar year from a number, text or a date cell (its year); blank → null. */
export function parseYearCell(cell: Cell | undefined): NumberResult {
	if (cell instanceof Date) return { ok: true, value: cell.getUTCFullYear() };
	if (isBlank(cell)) return { ok: true, value: null };
	const text = cellText(cell);
	const m = /^(\d{4})(?:[-/.]\d{1,2}(?:[-/.]\d{1,2})?)?$/.exec(text);
	if (!m) return { ok: false, error: 'is not a year (expected e.g. 1987 or 1987-06-01)' };
	return { ok: true, value: Number(m[1]) };
}

/** Text of a cell, trimmed; blank → null. */
export function parseTextCell(cell: Cell | undefined): string | null {
	const t = cellText(cell);
	return t === '' ? null : t;
}
