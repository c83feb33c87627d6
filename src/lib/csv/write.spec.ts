import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { neutraliseCell, writeCsv } from './write';

/* Formula neutralising as OWASP's "CSV Injection" page describes it (common practice). */
describe('neutraliseCell', () => {
	it.each([
		['=HYPERLINK("http://x.example")', `'=HYPERLINK("http://x.example")`],
		['+1+1', "'+1+1"],
		['-2+3', "'-2+3"],
		['@SUM(A1)', "'@SUM(A1)"],
		['\tcmd', "'\tcmd"],
		['\rcmd', "'\rcmd"],
		['=1+1\nsecond line', "'=1+1\nsecond line"],
		['-', "'-"],
		['- 5', "'- 5"]
	])('marks %j', (input, expected) => {
		expect(neutraliseCell(input)).toBe(expected);
	});

	it.each(['-12.5', '+3', '1e-3', '-.5', '42', 'plain text', 'a=b', ''])(
		'leaves %j as it is',
		(input) => {
			expect(neutraliseCell(input)).toBe(input);
		}
	);

	it('writes numbers, booleans and empty values as they are', () => {
		expect(neutraliseCell(-7.25)).toBe('-7.25');
		expect(neutraliseCell(true)).toBe('true');
		expect(neutraliseCell(null)).toBe('');
		expect(neutraliseCell(undefined)).toBe('');
	});
});

describe('writeCsv', () => {
	it('neutralises header and data cells and round-trips through a CSV reader', () => {
		const csv = writeCsv(
			['code', '=bad'],
			[
				['A, "1"', '=cmd|"/c calc"!A1'],
				['B', -3.5]
			]
		);
		const rows = Papa.parse<string[]>(csv.trim()).data;
		expect(rows).toEqual([
			['code', "'=bad"],
			['A, "1"', `'=cmd|"/c calc"!A1`],
			['B', '-3.5']
		]);
		expect(csv.endsWith('\n')).toBe(true);
	});

	it('puts comments above the columns, one line each, line breaks flattened', () => {
		const csv = writeCsv(['a'], [['1']], ['Cite as: X (2026).', 'two\nlines']);
		expect(csv).toBe('# Cite as: X (2026).\n# two lines\na\n1\n');
		const data = Papa.parse<string[]>(csv.trim(), { comments: '#' }).data;
		expect(data).toEqual([['a'], ['1']]);
	});
});
