import { describe, expect, it } from 'vitest';
import { HEAT_FLOW_CLASSES, heatFlowColour, NO_VALUE_COLOUR } from './heat-flow-scale';

// The classes are Thermalith's own (common practice, no source for the exact breaks).
describe('heat-flow colour classes', () => {
	it('cover the whole real line without gaps or overlaps', () => {
		expect(HEAT_FLOW_CLASSES[0].minMWm2).toBe(-Infinity);
		expect(HEAT_FLOW_CLASSES.at(-1)!.maxMWm2).toBe(Infinity);
		for (let i = 1; i < HEAT_FLOW_CLASSES.length; i++) {
			expect(HEAT_FLOW_CLASSES[i].minMWm2).toBe(HEAT_FLOW_CLASSES[i - 1].maxMWm2);
		}
	});
	it('puts a break value in the upper class', () => {
		const at70 = HEAT_FLOW_CLASSES.find((c) => c.minMWm2 === 70)!;
		expect(heatFlowColour(70)).toBe(at70.colour);
		expect(heatFlowColour(69.99)).not.toBe(at70.colour);
	});
	it('colours negative and extreme values and greys out missing ones', () => {
		expect(heatFlowColour(-5)).toBe(HEAT_FLOW_CLASSES[0].colour);
		expect(heatFlowColour(900)).toBe(HEAT_FLOW_CLASSES.at(-1)!.colour);
		expect(heatFlowColour(null)).toBe(NO_VALUE_COLOUR);
		expect(heatFlowColour(Number.NaN)).toBe(NO_VALUE_COLOUR);
	});
	it('labels the open-ended classes', () => {
		expect(HEAT_FLOW_CLASSES[0].label).toBe('< 40');
		expect(HEAT_FLOW_CLASSES.at(-1)!.label).toBe('≥ 120');
	});
});
