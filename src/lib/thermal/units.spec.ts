import { describe, expect, it } from 'vitest';
import { convertHeatFlow, hfuToMWm2, mWm2ToHfu, mWm2ToWm2, wm2ToMWm2 } from './units';
import { expectClose } from './testing';

describe('heat-flow units (1 HFU = 1 µcal cm⁻² s⁻¹ = 41.84 mW/m² exactly; SCIENCE.md §3)', () => {
	it('converts HFU, W/m² and mW/m²', () => {
		expect(hfuToMWm2(1)).toBe(41.84);
		expectClose(hfuToMWm2(1.5), 62.76, { abs: 1e-12 }, '1.5 HFU');
		expectClose(mWm2ToHfu(83.68), 2, { abs: 1e-12 }, '83.68 mW/m²');
		expect(wm2ToMWm2(0.065)).toBeCloseTo(65, 12);
		expect(mWm2ToWm2(65)).toBeCloseTo(0.065, 15);
		expectClose(convertHeatFlow(0.04184, 'W/m2', 'HFU'), 1, { abs: 1e-12 }, 'W/m² → HFU');
		expect(convertHeatFlow(12, 'HFU', 'HFU')).toBe(12);
	});
	it('round-trips', () => {
		for (const v of [-3, 0, 0.1, 87, 1e4])
			expectClose(mWm2ToHfu(hfuToMWm2(v)), v, { abs: 1e-12, rel: 1e-15 }, `${v}`);
	});
});
