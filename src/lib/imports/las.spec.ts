import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseLas, parseLasLine } from './las';

// fixtures/small.las: a minimal LAS 2.0 file written for these tests (invented values), following the CWLS LAS 2.0 line
// rules: MNEM.UNIT DATA : DESCRIPTION, ~V/~W/~C/~P/~O/~A sections, '#' comments.
const SMALL_LAS = readFileSync('src/lib/imports/fixtures/small.las', 'utf8');

describe('parseLasLine', () => {
	it('splits mnemonic, unit, value and description at the last colon', () => {
		expect(parseLasLine(' DATE.      2021-08-14 13:45 : LOG DATE', 3)).toEqual({
			mnemonic: 'DATE',
			unit: '',
			value: '2021-08-14 13:45',
			description: 'LOG DATE',
			line: 3
		});
		expect(parseLasLine(' TEMP.DEGC  : TEMPERATURE', 1)).toMatchObject({
			mnemonic: 'TEMP',
			unit: 'DEGC',
			value: ''
		});
		expect(parseLasLine('no dot here', 1)).toBeNull();
	});
});

describe('parseLas', () => {
	it('reads sections, curves and NULL values', () => {
		const las = parseLas(SMALL_LAS);
		expect(las.version).toBe('2.0');
		expect(las.nullValue).toBe(-999.25);
		expect(las.curves.map((c) => `${c.mnemonic}.${c.unit}`)).toEqual(['DEPT.FT', 'TMP.DEGF']);
		expect(las.curves[1].values).toEqual([50, null, 55, 57.5]);
		expect(las.well.find((w) => w.mnemonic === 'UWI')?.value).toBe('TEST-0001');
		expect(las.parameters[0]).toMatchObject({ mnemonic: 'TSURF', unit: 'DEGF', value: '45.0' });
		expect(las.other).toBe('Invented test data.');
		expect(las.dataLines).toEqual([21, 22, 23, 24]);
	});
	it('refuses WRAP YES, LAS 3.0 and malformed data with the line number', () => {
		expect(() => parseLas(SMALL_LAS.replace('WRAP.   NO ', 'WRAP.   YES'))).toThrow(
			/LAS line 3: WRAP YES .* not supported/
		);
		expect(() => parseLas(SMALL_LAS.replace('VERS.   2.0', 'VERS.   3.0'))).toThrow(
			/version "3.0" is not supported/
		);
		expect(() => parseLas(SMALL_LAS.replace(' 300.0   55.0', ' 300.0   55.0  1'))).toThrow(
			/LAS line 23: 3 values but 2 curves/
		);
		expect(() => parseLas(SMALL_LAS.replace(' 300.0   55.0', ' 300.0   hot'))).toThrow(
			/LAS line 23, curve TMP: "hot" is not a number/
		);
		expect(() => parseLas(SMALL_LAS.split('~A')[0])).toThrow(/no ~ASCII/);
		expect(() => parseLas('depth,temp\n1,2\n')).toThrow(/before the first ~ section/);
	});
	it('never echoes more than a short piece of a huge token (finding: a 1 MB token came back)', () => {
		const huge = 'x'.repeat(1_000_000);
		const messageOf = (text: string) => {
			try {
				parseLas(text);
			} catch (err) {
				return (err as Error).message;
			}
			throw new Error('parseLas accepted the file');
		};
		const cases = [
			SMALL_LAS.replace(' 300.0   55.0', ` 300.0   ${huge}`), // a data value
			SMALL_LAS.replace('VERS.   2.0', `VERS.   ${huge}`), // the version
			SMALL_LAS.replace('~Well information', `~Well information\n${huge}`) // a header line without a unit dot
		];
		for (const text of cases) {
			const message = messageOf(text);
			expect(message.length).toBeLessThan(300);
			expect(message).toContain(`"${'x'.repeat(80)}"… (1,000,000 characters)`);
			expect(message).toMatch(/^LAS line \d+/);
		}
	});
});
