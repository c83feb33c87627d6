import { describe, expect, it } from 'vitest';
import { formatFromFileName, parseTableFile } from './table';

describe('parseTableFile', () => {
	it('picks the reader from the extension', async () => {
		expect(formatFromFileName('a.CSV')).toBe('csv');
		expect(formatFromFileName('a.tsv')).toBe('csv');
		expect(formatFromFileName('a.xlsx')).toBe('xlsx');
		expect(formatFromFileName('a.geojson')).toBe('geojson');
		expect(formatFromFileName('a.xls')).toBeNull();
		const t = await parseTableFile('s.csv', new TextEncoder().encode('code;q\nA;1,5\n'));
		expect(t.rows).toEqual([['A', '1,5']]);
	});
	it('explains unsupported files and non-UTF-8 bytes', async () => {
		await expect(parseTableFile('s.xls', new Uint8Array([1]))).rejects.toThrow(/save as .xlsx/);
		await expect(parseTableFile('s.csv', new Uint8Array([0x63, 0xff, 0xfe]))).rejects.toThrow(
			/not UTF-8/
		);
		await expect(parseTableFile('s.xlsx', 'text')).rejects.toThrow(/bytes/);
	});
});
