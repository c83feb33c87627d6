import { describe, expect, it } from 'vitest';
import { importPayloadSchema } from './payload';

const payload = (rows: (string | number | null)[][], headers = ['site_code', 'heat_flow']) => ({
	fileName: 'sites.csv',
	sha256: 'a'.repeat(64),
	table: {
		headers,
		rows,
		sourceRowNumbers: rows.map((_, i) => i + 2),
		rowKind: 'row',
		decimalComma: false,
		source: { format: 'csv' }
	},
	mapping: {}
});

// PostgreSQL documentation (character types): text cannot contain the NUL character.
describe('import payload', () => {
	it('refuses a NUL in a cell, naming the row and column', () => {
		const r = importPayloadSchema.safeParse(
			payload([
				['A-1', 60],
				['B\u0000-2', 61]
			])
		);
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].message).toMatch(/^Row 3, column "site_code" contains a NUL/);
	});

	it('refuses a NUL in a column name and in the file name', () => {
		expect(importPayloadSchema.safeParse(payload([['A', 1]], ['co\u0000de', 'hf'])).success).toBe(
			false
		);
		expect(
			importPayloadSchema.safeParse({ ...payload([['A', 1]]), fileName: 'a\u0000.csv' }).success
		).toBe(false);
	});

	it('accepts an ordinary table', () => {
		expect(
			importPayloadSchema.safeParse(
				payload([
					['A-1', 60],
					['B-2', null]
				])
			).success
		).toBe(true);
	});
});
