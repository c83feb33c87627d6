import { describe, expect, it } from 'vitest';
import { detectDelimiter, parseCsv } from './csv';
import { ImportFormatError } from './types';

describe('parseCsv', () => {
	it('detects each delimiter', () => {
		expect(detectDelimiter('a,b\n1,2\n')).toBe(',');
		expect(detectDelimiter('a;b;c\n1,5;2,5;3\n4;5,1;6\n')).toBe(';');
		expect(detectDelimiter('a\tb\n1\t2\n')).toBe('\t');
		expect(detectDelimiter('a|b\n1|2\n')).toBe('|');
	});
	it('strips a UTF-8 BOM and allows decimal commas only with a non-comma delimiter', () => {
		const t = parseCsv('\uFEFFcode;q\nA;12,5\n');
		expect(t.headers).toEqual(['code', 'q']);
		expect(t.rows).toEqual([['A', '12,5']]);
		expect(t.decimalComma).toBe(true);
		expect(parseCsv('code,q\nA,12.5\n').decimalComma).toBe(false);
	});
	it('keeps quoted delimiters and newlines in one cell; row numbers count records like a spreadsheet', () => {
		const t = parseCsv('code,remarks\nA,"line one\nline two, with comma"\n\nB,x\n');
		expect(t.rows[0]).toEqual(['A', 'line one\nline two, with comma']);
		// header = row 1, A = row 2, blank = row 3, B = row 4
		expect(t.sourceRowNumbers).toEqual([2, 4]);
	});
	it('pads short rows, accepts empty trailing fields, rejects values beyond the header', () => {
		expect(parseCsv('a;b;c\n1;2\n3;4;5;;\n').rows).toEqual([
			['1', '2', null],
			['3', '4', '5']
		]);
		expect(() => parseCsv('a,b\n1,2,3\n')).toThrow(
			/Row 2 has 3 fields but the header has 2; extra value "3"/
		);
	});
	it('reports an unclosed quote and an empty file', () => {
		expect(() => parseCsv('a,b\n1,"2\n')).toThrow(ImportFormatError);
		expect(() => parseCsv('\n\n')).toThrow(/no header row/);
	});
});
