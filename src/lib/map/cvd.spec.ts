import { describe, expect, it } from 'vitest';
import { CVD_MATRICES, deltaE, lab, linearRgb, simulate } from './cvd';
import { HEAT_FLOW_CLASSES, NO_VALUE_COLOUR } from './heat-flow-scale';

// Simulation: Machado, Oliveira & Fernandes (2009), matrices from memory; ΔE*ab: CIE 1976.
describe('colour-vision deficiency simulation', () => {
	it('leaves greys grey (each matrix row sums to 1) and white white', () => {
		for (const m of Object.values(CVD_MATRICES)) {
			const grey = simulate([0.4, 0.4, 0.4], m);
			for (const c of grey) expect(c).toBeCloseTo(0.4, 5);
		}
		expect(lab(linearRgb('#ffffff'))[0]).toBeCloseTo(100, 1);
	});
	it('makes red and green hard to tell apart for deuteranopes', () => {
		const normal = deltaE('#d62728', '#2ca02c');
		const deut = deltaE('#d62728', '#2ca02c', CVD_MATRICES.deuteranopia);
		expect(deut).toBeLessThan(normal / 2);
	});
});

// The map's scale read through the simulation: every pair of classes stays apart (ΔE ≥ 15, far
// above the ~2.3 just-noticeable difference) for each dichromacy; "no value" is also drawn with a
// dashed outline, so for it a smaller colour difference (≥ 7) is enough.
describe('the heat-flow scale for colour-vision deficiency', () => {
	const colours = HEAT_FLOW_CLASSES.map((c) => c.colour);
	for (const [name, m] of Object.entries(CVD_MATRICES)) {
		it(`keeps every pair of classes distinct with ${name}`, () => {
			for (let i = 0; i < colours.length; i++) {
				for (let j = i + 1; j < colours.length; j++) {
					expect(
						deltaE(colours[i], colours[j], m),
						`${colours[i]} vs ${colours[j]}`
					).toBeGreaterThan(15);
				}
				expect(deltaE(colours[i], NO_VALUE_COLOUR, m)).toBeGreaterThan(7);
			}
		});
	}
});
