import { describe, expect, it } from 'vitest';
import {
	bhtSchema,
	correctionSchema,
	heatProductionSchema,
	palaeoclimateSchema
} from './site-values';

const errors = (r: {
	success: boolean;
	error?: { issues: { path: PropertyKey[]; message: string }[] };
}) =>
	// The first message per field, as parseForm (src/lib/schemas/form.ts) shows it.
	(r.error?.issues ?? []).reduce<Record<string, string>>(
		(e, i) => ({ [String(i.path[0])]: i.message, ...e }),
		{}
	);

describe('site computation forms', () => {
	it('BHT: collects filled rows, ignores blank ones, accepts a decimal comma', () => {
		const r = bhtSchema.safeParse({
			depthM: '2450',
			circulationTimeH: '4,5',
			bhtTemperatureC0: '101.2',
			bhtShutInH0: '6',
			bhtTemperatureC1: '',
			bhtShutInH1: '',
			bhtTemperatureC2: '108',
			bhtShutInH2: '12'
		});
		expect(r.success).toBe(true);
		expect(r.data).toEqual({
			depthM: 2450,
			circulationTimeH: 4.5,
			readings: [
				{ temperatureC: 101.2, shutInTimeH: 6 },
				{ temperatureC: 108, shutInTimeH: 12 }
			]
		});
	});

	it('BHT: puts each message on its own field', () => {
		const r = bhtSchema.safeParse({
			circulationTimeH: '0',
			bhtTemperatureC0: '101',
			bhtShutInH0: '',
			bhtTemperatureC1: 'warm',
			bhtShutInH1: '-3'
		});
		expect(r.success).toBe(false);
		const e = errors(r);
		expect(e.circulationTimeH).toMatch(/more than 0/);
		expect(e.bhtShutInH0).toMatch(/time since circulation/);
		expect(e.bhtTemperatureC1).toBe('Enter a number.');
	});

	it('BHT: refuses fewer than two readings and non-finite numbers', () => {
		const one = bhtSchema.safeParse({
			circulationTimeH: '4',
			bhtTemperatureC0: '90',
			bhtShutInH0: '5'
		});
		expect(errors(one).readings).toMatch(/at least two/);
		const inf = bhtSchema.safeParse({ circulationTimeH: '1e999' });
		expect(errors(inf).circulationTimeH).toMatch(/circulation time/);
	});

	it('palaeoclimate: steps, diffusivity in 10⁻⁶ m²/s (default 1), at least one step', () => {
		const id = '00000000-0000-4000-8000-000000000001';
		const ok = palaeoclimateSchema.safeParse({ logId: id, stepC0: '-1.5', stepAgeYears0: '12000' });
		expect(ok.data).toEqual({
			logId: id,
			diffusivityM2s: 1e-6,
			steps: [{ stepC: -1.5, ageYears: 12000 }]
		});
		const none = palaeoclimateSchema.safeParse({ logId: id, diffusivity: '0' });
		expect(errors(none).steps).toMatch(/at least one step/);
		expect(errors(none).diffusivity).toMatch(/more than 0/);
		const age = palaeoclimateSchema.safeParse({ logId: id, stepC0: '1', stepAgeYears0: '0' });
		expect(errors(age).stepAgeYears0).toMatch(/more than 0 years/);
	});

	it('heat production: all four required, K a percentage, density plausible', () => {
		const ok = heatProductionSchema.safeParse({
			uraniumPpm: '3',
			thoriumPpm: '12',
			potassiumPct: '3',
			densityKgM3: '2700'
		});
		expect(ok.data).toEqual({ uraniumPpm: 3, thoriumPpm: 12, potassiumPct: 3, densityKgM3: 2700 });
		const bad = heatProductionSchema.safeParse({
			uraniumPpm: '',
			thoriumPpm: '-1',
			potassiumPct: '140',
			densityKgM3: '2.7'
		});
		const e = errors(bad);
		expect(e.uraniumPpm).toMatch(/uranium in ppm/);
		expect(e.thoriumPpm).toMatch(/negative/);
		expect(e.potassiumPct).toMatch(/between 0 and 100/);
		expect(e.densityKgM3).toMatch(/kg\/m³/);
	});

	it('correction: needs heat flow, method and a reason; blank optional values become null', () => {
		const ok = correctionSchema.safeParse({
			heatFlowMWm2: '71.5',
			heatFlowSigmaMWm2: '',
			method: 'bullard',
			reason: 'Typo in the field sheet'
		});
		expect(ok.data?.values.heatFlowMWm2).toBe(71.5);
		expect(ok.data?.values.heatFlowSigmaMWm2).toBeNull();
		expect(ok.data?.reason).toBe('Typo in the field sheet');
		const bad = correctionSchema.safeParse({
			heatFlowMWm2: '',
			method: 'guess',
			reason: ' ',
			topDepthM: '500',
			bottomDepthM: '100'
		});
		const e = errors(bad);
		expect(Object.keys(e).sort()).toEqual(['heatFlowMWm2', 'method', 'reason']);
	});
});
