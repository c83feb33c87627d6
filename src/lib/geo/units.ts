// Units, in one place: the exact factors, the named converters the solvers use (so no bare 1e-3
// or 1e3 hides in a formula), and the unit choices an uploaded column may be in, each with its
// factor to the stored unit and the source of that factor.
// Conventions: stored and shown units are mW/m², K/km, m, W/m/K, µW/m³, °C; the thermal solvers
// work in SI (W/m², W/m³, K/m) inside and convert only at their edges.

import { InputError } from '../foundation/errors';

// Exact factors.

/** mW/m² in one heat-flow unit (HFU = 1 µcal cm⁻² s⁻¹): 4.184e-6 J / 1e-4 m² / s, exact from 1 cal = 4.184 J. */
export const MWM2_PER_HFU = 41.84;
/** Metres per international foot, exact (NIST SP 811, appendix B). */
export const M_PER_FT = 0.3048;
/** K/km in one °F/100 ft: (5/9 K) / (100 × 0.3048 m) × 1000 m/km = 18.2269 K/km. */
export const KPERKM_PER_DEGF_PER_100FT = (5 / 9 / (100 * M_PER_FT)) * 1000;
/** W/m/K in one mcal cm⁻¹ s⁻¹ K⁻¹: 1e-3 × 4.184 J / (0.01 m · s · K), exact from 1 cal = 4.184 J. */
export const WMK_PER_MCAL_CM_S_K = 0.4184;
/** µW/m³ in one heat-generation unit (1 HGU = 1e-13 cal cm⁻³ s⁻¹), from 1 cal = 4.184 J. */
export const UWM3_PER_HGU = 0.4184;
/** Seconds in a Julian year (365.25 d), the usual year for geological ages (common practice, no source). */
export const SECONDS_PER_YEAR = 365.25 * 86400;

// SI prefixes (BIPM SI Brochure, 9th ed.): milli = 1e-3, micro = 1e-6, kilo = 1e3. Divisions by
// 1000 and 1e6 are correctly rounded, which multiplication by the inexact 1e-3 is not.
const KILO = 1000;
const MEGA = 1e6;

/** mW/m² → W/m² (heat flow). */
export const mWm2ToWm2 = (heatFlowMWm2: number): number => heatFlowMWm2 / KILO;
/** W/m² → mW/m² (heat flow). */
export const wm2ToMWm2 = (heatFlowWm2: number): number => heatFlowWm2 * KILO;
/** µW/m³ → W/m³ (heat production). */
export const uWm3ToWm3 = (heatProductionUWm3: number): number => heatProductionUWm3 / MEGA;
/** W/m³ → µW/m³ (heat production). */
export const wm3ToUWm3 = (heatProductionWm3: number): number => heatProductionWm3 * MEGA;
/** km → m. */
export const kmToM = (km: number): number => km * KILO;
/** m → km. */
export const mToKm = (m: number): number => m / KILO;
/** K/m → K/km (gradient). */
export const kPerMToKPerKm = (gradientKPerM: number): number => gradientKPerM * KILO;
/** K/km → K/m (gradient). */
export const kPerKmToKPerM = (gradientKPerKm: number): number => gradientKPerKm / KILO;
/** A slope of heat flow on heat production, (mW/m²)/(µW/m³), → m: 1e-3 W/m² / 1e-6 W/m³ = 1000 m. */
export const mWm2PerUWm3ToM = (slope: number): number => slope * KILO;
/** HFU → mW/m². */
export const hfuToMWm2 = (heatFlowHfu: number): number => heatFlowHfu * MWM2_PER_HFU;
/** mW/m² → HFU. */
export const mWm2ToHfu = (heatFlowMWm2: number): number => heatFlowMWm2 / MWM2_PER_HFU;

export type HeatFlowUnit = 'mW/m2' | 'W/m2' | 'HFU';

const MWM2_PER_UNIT: Record<HeatFlowUnit, number> = { 'mW/m2': 1, 'W/m2': KILO, HFU: MWM2_PER_HFU };

/** Converts a heat flow between mW/m², W/m² and HFU. */
export function convertHeatFlow(value: number, from: HeatFlowUnit, to: HeatFlowUnit): number {
	if (from === to) return value;
	return (value * MWM2_PER_UNIT[from]) / MWM2_PER_UNIT[to];
}

// Unit choices for uploads.

/** Physical quantities with a unit choice; each is stored in one unit (first in its list). */
export type Quantity =
	'heatFlow' | 'gradient' | 'depth' | 'conductivity' | 'heatProduction' | 'temperature';

export interface UnitDef {
	id: string;
	label: string;
	/** Spellings recognised in headers (compared after normaliseUnit). */
	aliases: string[];
	/** Converts a value in this unit to the stored unit. */
	toStored: (value: number) => number;
	/** Converts a difference or 1-σ uncertainty (no offset) to the stored unit. */
	deltaToStored: (value: number) => number;
	/** Where the factor comes from. */
	source: string;
}

/** Stored unit of each quantity (the unit named in the database column). */
export const STORED_UNIT: Record<Quantity, string> = {
	heatFlow: 'mW/m2',
	gradient: 'K/km',
	depth: 'm',
	conductivity: 'W/m/K',
	heatProduction: 'uW/m3',
	temperature: 'degC'
};

function linear(
	id: string,
	label: string,
	aliases: string[],
	factor: number,
	source: string
): UnitDef {
	const f = (v: number) => v * factor;
	return { id, label, aliases, toStored: f, deltaToStored: f, source };
}

function heatFlow(id: HeatFlowUnit, label: string, aliases: string[], source: string): UnitDef {
	const f = (v: number) => convertHeatFlow(v, id, 'mW/m2');
	return { id, label, aliases, toStored: f, deltaToStored: f, source };
}

const SI = 'SI prefixes (BIPM SI Brochure, 9th ed.)';
const CAL = 'thermochemical calorie 1 cal = 4.184 J exactly (NIST SP 811, appendix B)';

/** Units offered per quantity; the first is the stored unit. */
export const UNITS: Record<Quantity, UnitDef[]> = {
	heatFlow: [
		heatFlow('mW/m2', 'mW/m²', ['mw/m2', 'mw/m^2', 'mw m-2', 'mwm2', 'mw/m²'], 'stored unit'),
		heatFlow('W/m2', 'W/m²', ['w/m2', 'w/m^2', 'w m-2', 'wm2', 'w/m²'], SI),
		heatFlow(
			'HFU',
			'HFU (µcal/cm²/s)',
			['hfu', 'hfu', 'ucal/cm2/s', 'µcal/cm2/s', 'ucal cm-2 s-1'],
			`1 HFU = ${MWM2_PER_HFU} mW/m², ${CAL}`
		)
	],
	gradient: [
		linear('K/km', 'K/km', ['k/km', 'k km-1'], 1, 'stored unit'),
		linear(
			'degC/km',
			'°C/km',
			['°c/km', 'c/km', 'degc/km', 'deg/km', '°/km'],
			1,
			'a 1 °C step equals a 1 K step (SI Brochure, 9th ed., 2.3.1)'
		),
		linear('K/m', 'K/m', ['k/m', '°c/m', 'c/m', 'degc/m'], KILO, SI),
		linear('mK/m', 'mK/m', ['mk/m', 'm°c/m'], 1, SI),
		linear(
			'degF/100ft',
			'°F/100 ft',
			['°f/100ft', 'f/100ft', 'degf/100ft', '°f/100 ft'],
			KPERKM_PER_DEGF_PER_100FT,
			'1 °F step = 5/9 K, 1 ft = 0.3048 m exactly (NIST SP 811, appendix B)'
		)
	],
	depth: [
		linear('m', 'm', ['m', 'metres', 'meters', 'mbsl', 'mbgl'], 1, 'stored unit'),
		linear(
			'ft',
			'ft',
			['ft', 'feet', 'foot', 'f'],
			M_PER_FT,
			'1 ft = 0.3048 m exactly (NIST SP 811, appendix B)'
		),
		linear('km', 'km', ['km'], KILO, SI)
	],
	conductivity: [
		linear(
			'W/m/K',
			'W/m/K',
			['w/m/k', 'w/mk', 'w/(m k)', 'w m-1 k-1', 'w/m°c', 'w/m/c', 'w/m/°c', 'wmk'],
			1,
			'stored unit'
		),
		linear(
			'mcal/cm/s/degC',
			'mcal/cm/s/°C',
			[
				'mcal/cm/s/°c',
				'mcal/cm/s/c',
				'mcal/cm/s/k',
				'mcal cm-1 s-1 k-1',
				'mcal/cm s c',
				'mcal/cm/s/degc'
			],
			WMK_PER_MCAL_CM_S_K,
			`1 mcal/cm/s/K = 0.4184 W/m/K, ${CAL}`
		)
	],
	heatProduction: [
		linear(
			'uW/m3',
			'µW/m³',
			['uw/m3', 'µw/m3', 'μw/m3', 'uw m-3', 'µw/m³', 'uwm3'],
			1,
			'stored unit'
		),
		linear('W/m3', 'W/m³', ['w/m3', 'w m-3'], MEGA, SI),
		linear(
			'HGU',
			'HGU (1e-13 cal/cm³/s)',
			['hgu'],
			UWM3_PER_HGU,
			`1 HGU = 1e-13 cal cm⁻³ s⁻¹ (from memory), ${CAL}`
		)
	],
	temperature: [
		{
			id: 'degC',
			label: '°C',
			aliases: ['°c', 'c', 'degc', 'deg c', 'celsius'],
			toStored: (v) => v,
			deltaToStored: (v) => v,
			source: 'stored unit'
		},
		{
			id: 'K',
			label: 'K',
			aliases: ['k', 'kelvin', 'degk'],
			toStored: (v) => v - 273.15,
			deltaToStored: (v) => v,
			source: 't/°C = T/K − 273.15 by definition (SI Brochure, 9th ed., 2.3.1)'
		},
		{
			id: 'degF',
			label: '°F',
			aliases: ['°f', 'f', 'degf', 'deg f', 'fahrenheit'],
			toStored: (v) => ((v - 32) * 5) / 9,
			deltaToStored: (v) => (v * 5) / 9,
			source: 't/°C = (t/°F − 32)/1.8 (NIST SP 811, appendix B)'
		}
	]
};

/** Lower-cases a unit spelling and unifies µ/μ/u, ², ³, ⁻¹ and spacing so aliases compare. */
export function normaliseUnit(text: string): string {
	return text
		.trim()
		.toLowerCase()
		.replace(/[μµ]/g, 'u')
		.replace(/²/g, '2')
		.replace(/³/g, '3')
		.replace(/⁻/g, '-')
		.replace(/¹/g, '1')
		.replace(/°/g, 'deg')
		.replace(/\bdeg\s*/g, 'deg')
		.replace(/[·*.]/g, ' ')
		.replace(/\s*\/\s*/g, '/')
		.replace(/\s+/g, ' ');
}

/** The unit with this id for the quantity, or undefined. */
export function findUnit(quantity: Quantity, id: string): UnitDef | undefined {
	return UNITS[quantity].find((u) => u.id === id);
}

/** Recognises a unit spelling (header suffix, LAS unit) for a quantity; undefined if unknown. */
export function recogniseUnit(quantity: Quantity, text: string): UnitDef | undefined {
	const n = normaliseUnit(text);
	if (n === '') return undefined;
	return UNITS[quantity].find(
		(u) => normaliseUnit(u.id) === n || u.aliases.some((a) => normaliseUnit(a) === n)
	);
}

/** Converts a value in `unitId` to the stored unit of `quantity` (offsets applied for temperature). */
export function toStoredUnit(quantity: Quantity, unitId: string, value: number): number {
	const unit = findUnit(quantity, unitId);
	if (!unit) throw new InputError('unitId', unitId, `must be a known ${quantity} unit`);
	return unit.toStored(value);
}
