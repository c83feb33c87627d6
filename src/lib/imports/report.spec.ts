import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { issuesToCsv } from './report';

describe('issuesToCsv', () => {
	it('writes row, severity, column, message; quotes where needed; defuses formulas', () => {
		const csv = issuesToCsv([
			{
				row: null,
				severity: 'error',
				column: 'Site code',
				value: '',
				code: 'mapping.no-code',
				message: 'Map a column to "Site code".'
			},
			{
				row: 7,
				severity: 'warning',
				column: '=HF',
				value: '650',
				code: 'x',
				message: 'Row 7, column "=HF": "650" is high, really.'
			}
		]);
		const parsed = Papa.parse<string[]>(csv.trim()).data;
		expect(parsed[0]).toEqual(['row', 'severity', 'column', 'message']);
		expect(parsed[1]).toEqual(['', 'error', 'Site code', 'Map a column to "Site code".']);
		expect(parsed[2][0]).toBe('7');
		expect(parsed[2][2]).toBe("'=HF");
		expect(csv.endsWith('\n')).toBe(true);
	});
});
