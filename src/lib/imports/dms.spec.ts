import { describe, expect, it } from 'vitest';
import { parseAngle } from './dms';

// Expected values are plain arithmetic d + m/60 + s/3600 (no source needed).
const OK: [string, 'lat' | 'lon', number][] = [
	[`59°12'30.5"N`, 'lat', 59 + 12 / 60 + 30.5 / 3600],
	['59 12 30.5 N', 'lat', 59 + 12 / 60 + 30.5 / 3600],
	['59 12 30,5 N', 'lat', 59 + 12 / 60 + 30.5 / 3600],
	['-7.5', 'lon', -7.5],
	['7,5', 'lon', 7.5],
	[`7°30'W`, 'lon', -7.5],
	['S 33 52.5', 'lat', -(33 + 52.5 / 60)],
	['59:12:30', 'lat', 59 + 12 / 60 + 30 / 3600],
	['59d12m30s', 'lat', 59 + 12 / 60 + 30 / 3600],
	['59d12m30sS', 'lat', -(59 + 12 / 60 + 30 / 3600)],
	['59°12′30″ N', 'lat', 59 + 12 / 60 + 30 / 3600],
	['+179.999', 'lon', 179.999]
];
const BAD: [string, 'lat' | 'lon', RegExp][] = [
	['', 'lat', /empty/],
	['91', 'lat', /outside ±90/],
	['181 W', 'lon', /outside ±180/],
	['59 61', 'lat', /minutes 61/],
	['59 10 60', 'lat', /seconds 60/],
	['12 E', 'lat', /not a latitude/],
	['-7 W', 'lon', /minus sign and a hemisphere/],
	['abc', 'lat', /not an angle/],
	['1.234,5', 'lon', /not an angle/],
	['59.5 12', 'lat', /fraction before/]
];

describe('parseAngle', () => {
	it.each(OK)('%s → %f', (text, axis, degrees) => {
		const r = parseAngle(text, axis);
		expect(r.ok).toBe(true);
		if (r.ok) expect(r.degrees).toBeCloseTo(degrees, 12);
	});
	it.each(BAD)('rejects %s', (text, axis, message) => {
		const r = parseAngle(text, axis);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.error).toMatch(message);
	});
});
