import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { issuesToCsv } from './report';

describe('issuesToCsv', () => {
	it('writes row, site code, severity, column, message; quotes where needed; defuses formulas', () => {
		const csv = issuesToCsv([
			{
				row: null,
				siteCode: null,
				severity: 'error',
				column: 'Site code',
				value: '',
				code: 'mapping.no-code',
				message: 'Map a column to "Site code".'
			},
			{
				row: 7,
				siteCode: 'KV-7',
				severity: 'warning',
				column: '=HF',
				value: '650',
				code: 'x',
				message: 'Row 7, column "=HF": "650" is high, really.'
			}
		]);
		const parsed = Papa.parse<string[]>(csv.trim()).data;
		expect(parsed[0]).toEqual(['row', 'code', 'severity', 'column', 'message']);
		expect(parsed[1]).toEqual(['', '', 'error', 'Site code', 'Map a column to "Site code".']);
		expect(parsed[2].slice(0, 2)).toEqual(['7', 'KV-7']);
		expect(parsed[2][3]).toBe("'=HF");
		expect(csv.endsWith('\n')).toBe(true);
	});
});
