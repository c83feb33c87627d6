import { describe, expect, it } from 'vitest';
import { InputError } from '../foundation/errors';
import {
	convertHeatFlow,
	findUnit,
	hfuToMWm2,
	KPERKM_PER_DEGF_PER_100FT,
	kmToM,
	kPerKmToKPerM,
	kPerMToKPerKm,
	mToKm,
	MWM2_PER_HFU,
	mWm2PerUWm3ToM,
	mWm2ToHfu,
	mWm2ToWm2,
	recogniseUnit,
	toStoredUnit,
	uWm3ToWm3,
	UNITS,
	wm2ToMWm2,
	wm3ToUWm3,
	WMK_PER_MCAL_CM_S_K
} from './units';

describe('named converters (SI prefixes, BIPM SI Brochure 9th ed.; 1 cal = 4.184 J, NIST SP 811)', () => {
	it('converts HFU, W/m² and mW/m² (1 HFU = 1 µcal cm⁻² s⁻¹ = 41.84 mW/m² exactly)', () => {
		expect(hfuToMWm2(1)).toBe(41.84);
		expect(hfuToMWm2(1.5)).toBeCloseTo(62.76, 12);
		expect(mWm2ToHfu(83.68)).toBeCloseTo(2, 12);
		expect(wm2ToMWm2(0.065)).toBeCloseTo(65, 12);
		expect(mWm2ToWm2(65)).toBe(0.065);
		expect(convertHeatFlow(0.04184, 'W/m2', 'HFU')).toBeCloseTo(1, 12);
		expect(convertHeatFlow(12, 'HFU', 'HFU')).toBe(12);
	});
	it('converts heat production, depth, gradient and the heat-flow/heat-production slope', () => {
		expect(uWm3ToWm3(2.5)).toBe(2.5e-6);
		expect(wm3ToUWm3(2.5e-6)).toBeCloseTo(2.5, 12);
		expect(kmToM(35)).toBe(35_000);
		expect(mToKm(35_000)).toBe(35);
		expect(kPerMToKPerKm(0.025)).toBe(25);
		expect(kPerKmToKPerM(25)).toBe(0.025);
		// (mW/m²)/(µW/m³) = 1e-3/1e-6 m: a slope of 10 is a 10 km characteristic depth.
		expect(mWm2PerUWm3ToM(10)).toBe(10_000);
	});
	it('round-trips', () => {
		for (const v of [-3, 0, 0.1, 87, 1e4]) {
			expect(mWm2ToHfu(hfuToMWm2(v))).toBeCloseTo(v, 12);
			expect(wm2ToMWm2(mWm2ToWm2(v))).toBeCloseTo(v, 12);
			expect(mToKm(kmToM(v))).toBeCloseTo(v, 12);
		}
	});
});

describe('unit factors (each check names its source)', () => {
	it('heat flow: 1 HFU = 41.84 mW/m² exactly, from 1 cal = 4.184 J (NIST SP 811)', () => {
		expect(toStoredUnit('heatFlow', 'HFU', 1)).toBe(MWM2_PER_HFU);
		expect(toStoredUnit('heatFlow', 'HFU', 1.5)).toBeCloseTo(62.76, 12);
		expect(toStoredUnit('heatFlow', 'W/m2', 0.065)).toBeCloseTo(65, 12);
	});
	it('gradient: 1 °F/100 ft = (5/9 K)/(30.48 m) = 18.2269 K/km (1 ft = 0.3048 m exactly, NIST SP 811)', () => {
		expect(KPERKM_PER_DEGF_PER_100FT).toBeCloseTo(18.2269, 4);
		expect(toStoredUnit('gradient', 'degF/100ft', 1.5)).toBeCloseTo(27.3403, 4);
		expect(toStoredUnit('gradient', 'K/m', 0.025)).toBeCloseTo(25, 12);
		expect(toStoredUnit('gradient', 'mK/m', 25)).toBe(25);
		expect(toStoredUnit('gradient', 'degC/km', 30)).toBe(30);
	});
	it('depth: 1 ft = 0.3048 m exactly (NIST SP 811)', () => {
		expect(toStoredUnit('depth', 'ft', 1000)).toBeCloseTo(304.8, 10);
	});
	it('conductivity: 1 mcal/cm/s/K = 0.4184 W/m/K, from 1 cal = 4.184 J (NIST SP 811)', () => {
		expect(WMK_PER_MCAL_CM_S_K).toBe(0.4184);
		expect(toStoredUnit('conductivity', 'mcal/cm/s/degC', 6)).toBeCloseTo(2.5104, 12);
	});
	it('heat production: W/m³ by SI prefix; 1 HGU = 0.4184 µW/m³ (from memory, with 1 cal = 4.184 J)', () => {
		expect(toStoredUnit('heatProduction', 'W/m3', 2.5e-6)).toBeCloseTo(2.5, 12);
		expect(toStoredUnit('heatProduction', 'HGU', 10)).toBeCloseTo(4.184, 12);
	});
	it('temperature: K − 273.15 (SI Brochure); (°F − 32)/1.8 (NIST SP 811); σ without offset', () => {
		expect(toStoredUnit('temperature', 'K', 283.15)).toBeCloseTo(10, 12);
		expect(toStoredUnit('temperature', 'degF', 212)).toBeCloseTo(100, 12);
		expect(findUnit('temperature', 'degF')!.deltaToStored(9)).toBeCloseTo(5, 12);
		expect(findUnit('temperature', 'K')!.deltaToStored(2)).toBe(2);
	});
	it('every unit names a source and the first unit is the stored one', () => {
		for (const list of Object.values(UNITS)) {
			expect(list[0].source).toBe('stored unit');
			for (const u of list) expect(u.source.length).toBeGreaterThan(5);
		}
	});
	it('recognises header and LAS spellings', () => {
		expect(recogniseUnit('heatFlow', 'mW m⁻²')?.id).toBe('mW/m2');
		expect(recogniseUnit('conductivity', 'W/mK')?.id).toBe('W/m/K');
		expect(recogniseUnit('gradient', '°C/km')?.id).toBe('degC/km');
		expect(recogniseUnit('heatProduction', 'µW/m³')?.id).toBe('uW/m3');
		expect(recogniseUnit('temperature', 'DEGC')?.id).toBe('degC');
		expect(recogniseUnit('temperature', 'DEGF')?.id).toBe('degF');
		expect(recogniseUnit('depth', 'FT')?.id).toBe('ft');
		expect(recogniseUnit('depth', 'furlong')).toBeUndefined();
	});
	it('rejects an unknown unit with an InputError naming it', () => {
		expect(() => toStoredUnit('depth', 'furlong', 1)).toThrow(InputError);
		expect(() => toStoredUnit('depth', 'furlong', 1)).toThrow(/furlong/);
	});
});
