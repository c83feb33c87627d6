import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseLas } from './las';
import { temperatureLogFromCsv, temperatureLogFromLas } from './temperature-log';

const SMALL_LAS = readFileSync('src/lib/imports/fixtures/small.las', 'utf8'); // invented test log

describe('temperature logs', () => {
	it('converts a LAS log in ft and °F to m and °C (1 ft = 0.3048 m; (°F − 32)/1.8, NIST SP 811), reporting NULLs', () => {
		const log = temperatureLogFromLas(parseLas(SMALL_LAS));
		expect(log.depthM).toEqual([30.48, 91.44, 121.92].map((v) => expect.closeTo(v, 10)));
		expect(log.temperatureC).toEqual(
			[10, 12.777777777777779, 14.166666666666666].map((v) => expect.closeTo(v, 10))
		);
		expect(log.issues.map((i) => i.message)).toEqual([
			'Line 22, TMP: the value is missing (empty or the NULL value); the point is left out.'
		]);
		expect(log.ok).toBe(true);
	});
	it('lets the caller choose curves and units; explains a missing temperature curve', () => {
		const las = parseLas(SMALL_LAS.replace('TMP .DEGF', 'XYZ .'));
		expect(() => temperatureLogFromLas(las)).toThrow(
			/no temperature curve found .* curves: DEPT \(FT\), XYZ \(no unit\)/
		);
		const log = temperatureLogFromLas(las, { temperatureCurve: 'XYZ', temperatureUnit: 'degC' });
		expect(log.temperatureC).toEqual([50, 55, 57.5]);
	});
	it('reads a two-column CSV, sorts by depth, reports duplicates and non-numbers', () => {
		const log = temperatureLogFromCsv(
			'Teufe;Temperatur\n30;8,1\n10;7,0\n20;7,5\n20;7,6\n40;warm\n',
			{ depthUnit: 'm' }
		);
		expect(log.depthM).toEqual([10, 20, 30]);
		expect(log.temperatureC).toEqual([7, 7.5, 8.1]);
		expect(log.issues.map((i) => `${i.row}:${i.severity}:${i.code}`)).toEqual([
			'6:error:number.invalid',
			'5:warning:log.duplicate-depth'
		]);
		expect(log.issues[0].message).toBe('Row 6, column "Temperatur": "warm" is not a number.');
		expect(log.issues[1].message).toMatch(
			/Row 5, column "Teufe": "20" m repeats the depth of row 4 with a different temperature/
		);
		expect(log.ok).toBe(false);
	});
});
