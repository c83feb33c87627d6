import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseCsv } from './csv';
import { suggestMapping } from './mapping';
import { buildPreview } from './preview';
import { templateColumns, templateCsv, TEMPLATE_FILE_NAME } from './template';

describe('template', () => {
	it('the shipped static/examples file equals the generator output', () => {
		expect(readFileSync(`static/examples/${TEMPLATE_FILE_NAME}`, 'utf8')).toBe(templateCsv());
	});
	it('maps itself completely and its invented row imports without issues', () => {
		const table = parseCsv(templateCsv());
		expect(table.headers).toEqual(templateColumns());
		const mapping = suggestMapping(table.headers);
		expect(Object.keys(mapping).length).toBe(templateColumns().length);
		const p = buildPreview(table, { mapping, currentYear: 2025 });
		expect(p.issues).toEqual([]);
		expect(p.rows[0].site).toMatchObject({
			code: 'DEMO-001',
			location: { lon: 8.25, lat: 59.4 },
			method: 'borehole_interval'
		});
	});
});
