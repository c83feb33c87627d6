import { describe, expect, it } from 'vitest';
import { parseCountCell, parseNumberCell, parseYearCell } from './cells';

describe('cells', () => {
	it('parses numbers, decimal commas only when allowed, blanks as null', () => {
		expect(parseNumberCell('12.5', false)).toEqual({ ok: true, value: 12.5 });
		expect(parseNumberCell(' -3e2 ', false)).toEqual({ ok: true, value: -300 });
		expect(parseNumberCell('12,5', true)).toEqual({ ok: true, value: 12.5 });
		expect(parseNumberCell('12,5', false).ok).toBe(false);
		expect(parseNumberCell('1.234,5', true).ok).toBe(false);
		expect(parseNumberCell('65 mW/m2', true).ok).toBe(false);
		expect(parseNumberCell('', true)).toEqual({ ok: true, value: null });
		expect(parseNumberCell(null, true)).toEqual({ ok: true, value: null });
		expect(parseNumberCell(7, false)).toEqual({ ok: true, value: 7 });
	});
	it('parses counts and years', () => {
		expect(parseCountCell('12', false)).toEqual({ ok: true, value: 12 });
		expect(parseCountCell('2.5', false).ok).toBe(false);
		expect(parseYearCell('1987-06-01')).toEqual({ ok: true, value: 1987 });
		expect(parseYearCell(new Date(Date.UTC(2001, 0, 1)))).toEqual({ ok: true, value: 2001 });
		expect(parseYearCell('87').ok).toBe(false);
	});
});
