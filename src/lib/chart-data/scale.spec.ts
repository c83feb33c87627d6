import { describe, expect, it } from 'vitest';
import { formatDepthRangeKm, formatTriple } from './format';
import { linearScale, niceCeil, niceStep, ticks } from './scale';

describe('scale helpers (arithmetic, no source)', () => {
	it('maps linearly, including inverted ranges', () => {
		const s = linearScale([0, 100], [50, 550]);
		expect(s(0)).toBe(50);
		expect(s(50)).toBe(300);
		expect(linearScale([0, 10], [400, 0])(2.5)).toBe(300);
		expect(linearScale([3, 3], [1, 9])(3)).toBe(1);
	});

	it('chooses 1-2-5 steps and ticks inside the domain', () => {
		expect(niceStep(700, 6)).toBe(100);
		expect(niceStep(35, 7)).toBe(5);
		expect(niceCeil(612)).toBe(700);
		expect(niceCeil(612, 10)).toBe(650);
		expect(ticks(0, 35, 7)).toEqual([0, 5, 10, 15, 20, 25, 30, 35]);
		expect(ticks(0, 0.3, 3)).toEqual([0, 0.1, 0.2, 0.3]);
	});

	it('formats ranges as "P50 (P10–P90) unit"', () => {
		expect(formatDepthRangeKm(4200, 3800, 4750)).toBe('4.2 (3.8–4.8) km');
		expect(formatDepthRangeKm(30_000, 28_000, null)).toBe('30.0 (28.0–beyond base) km');
		expect(formatDepthRangeKm(null, 30_000, null)).toBe('not reached');
		expect(formatTriple({ p10: 580.2, p50: 612.4, p90: 650.9 }, '°C')).toBe('612 (580–651) °C');
	});
});
