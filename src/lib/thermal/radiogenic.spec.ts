import { describe, expect, it } from 'vitest';
import { heatProductionUWm3 } from './radiogenic';
import { expectClose, thrown } from '../foundation/testing';

describe('heat production from U, Th, K (Rybach 1988)', () => {
	it('gives the Rybach (1988) value worked in docs/science.md#borehole-heat-flow: ρ 2700, U 3 ppm, Th 12 ppm, K 3 % → 1.88244 µW/m³', () => {
		expectClose(
			heatProductionUWm3({ densityKgM3: 2700, uraniumPpm: 3, thoriumPpm: 12, potassiumPct: 3 }),
			1.88244,
			{ abs: 1e-12 },
			'A'
		);
	});
	it('is linear in each element (1 ppm U in 1000 kg/m³ gives 0.0952 µW/m³)', () => {
		expectClose(
			heatProductionUWm3({ densityKgM3: 1000, uraniumPpm: 1, thoriumPpm: 0, potassiumPct: 0 }),
			0.0952,
			{ abs: 1e-15 },
			'U'
		);
		expect(
			heatProductionUWm3({ densityKgM3: 2650, uraniumPpm: 0, thoriumPpm: 0, potassiumPct: 0 })
		).toBe(0);
	});
	it('rejects negative concentrations, K above 100 % and non-positive density', () => {
		const ok = { densityKgM3: 2700, uraniumPpm: 3, thoriumPpm: 12, potassiumPct: 3 };
		expect(thrown(() => heatProductionUWm3({ ...ok, uraniumPpm: -1 })).field).toBe('uraniumPpm');
		expect(thrown(() => heatProductionUWm3({ ...ok, potassiumPct: 120 })).field).toBe(
			'potassiumPct'
		);
		expect(thrown(() => heatProductionUWm3({ ...ok, densityKgM3: 0 })).field).toBe('densityKgM3');
		expect(thrown(() => heatProductionUWm3({ ...ok, thoriumPpm: NaN })).message).toContain('NaN');
	});
});
