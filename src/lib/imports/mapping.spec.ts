import { describe, expect, it } from 'vitest';
import { checkMapping, suggestMapping, unmappedColumns } from './mapping';

const pick = (headers: string[]) => {
	const m = suggestMapping(headers);
	return Object.fromEntries(
		Object.entries(m).map(([k, v]) => [k, `${headers[v!.column]}${v!.unit ? ` [${v!.unit}]` : ''}`])
	);
};

describe('suggestMapping', () => {
	it('recognises synonyms, ignoring case, spacing and punctuation', () => {
		expect(pick(['HF', 'lat', 'Longitude', 'TC', 'Site ID'])).toEqual({
			heatFlow: 'HF [mW/m2]',
			lat: 'lat',
			lon: 'Longitude',
			conductivity: 'TC [W/m/K]',
			code: 'Site ID'
		});
		expect(pick(['q', 'k', 'Easting', 'NORTHING', 'well'])).toEqual({
			heatFlow: 'q [mW/m2]',
			conductivity: 'k [W/m/K]',
			x: 'Easting',
			y: 'NORTHING',
			code: 'well'
		});
		expect(pick(['Thermal Conductivity', 'latitude'])).toEqual({
			conductivity: 'Thermal Conductivity [W/m/K]',
			lat: 'latitude'
		});
	});
	it('takes units from a bracket or a suffix, and a σ column inherits its value column unit', () => {
		expect(pick(['heat flow (mW/m2)', 'heat flow (HFU)'])).toEqual({
			heatFlow: 'heat flow (mW/m2) [mW/m2]'
		});
		expect(pick(['Heat Flow [HFU]', 'HF sigma'])).toEqual({
			heatFlow: 'Heat Flow [HFU] [HFU]',
			heatFlowSigma: 'HF sigma [HFU]'
		});
		expect(
			pick([
				'heat_flow_W_m2',
				'q_err',
				'Gradient °F/100ft',
				'k (mcal/cm/s/°C)',
				'A (µW/m³)',
				'top depth ft',
				'Surface temp K'
			])
		).toEqual({
			heatFlow: 'heat_flow_W_m2 [W/m2]',
			heatFlowSigma: 'q_err [W/m2]',
			gradient: 'Gradient °F/100ft [degF/100ft]',
			conductivity: 'k (mcal/cm/s/°C) [mcal/cm/s/degC]',
			heatProduction: 'A (µW/m³) [uW/m3]',
			topDepth: 'top depth ft [ft]',
			surfaceTemperature: 'Surface temp K [K]'
		});
		expect(pick(['σ HF', '±k'])).toEqual({
			heatFlowSigma: 'σ HF [mW/m2]',
			conductivitySigma: '±k [W/m/K]'
		});
	});
	it('leaves unknown headers unmapped and lists them', () => {
		const headers = ['code', 'x', 'y', 'colour'];
		const m = suggestMapping(headers);
		expect(unmappedColumns(m, headers)).toEqual(['colour']);
	});
});

describe('checkMapping', () => {
	it('requires a code and a full coordinate pair, one field per column, valid units', () => {
		const codes = (m: Parameters<typeof checkMapping>[0]) =>
			checkMapping(m, ['a', 'b', 'c']).map((i) => i.code);
		expect(codes({})).toEqual(['mapping.no-code', 'mapping.no-coordinates']);
		expect(codes({ code: { column: 0 }, x: { column: 1 } })).toEqual([
			'mapping.no-coordinates',
			'mapping.half-xy'
		]);
		expect(codes({ code: { column: 0 }, lon: { column: 1 }, lat: { column: 1 } })).toEqual([
			'mapping.column-twice'
		]);
		expect(
			codes({
				code: { column: 0 },
				lon: { column: 1 },
				lat: { column: 2 },
				heatFlow: { column: 5, unit: 'mW/m2' }
			})
		).toEqual(['mapping.bad-column']);
		expect(
			codes({
				code: { column: 0 },
				x: { column: 1 },
				y: { column: 2 },
				conductivity: { column: 0, unit: 'furlong' }
			})
		).toEqual(['mapping.column-twice', 'mapping.bad-unit']);
	});
});

// Header spellings as found in contributors' own spreadsheets (invented files; common practice, no
// source): symbols, slashes, brackets and unit suffixes around the field's name.
describe('suggestMapping on realistic headers', () => {
	const cases: [string, string, string | undefined][] = [
		['dT/dz (K/km)', 'gradient', 'K/km'],
		['dT/dz, K/km', 'gradient', 'K/km'],
		['grad (°C/km)', 'gradient', 'degC/km'],
		['Q [mW/m2]', 'heatFlow', 'mW/m2'],
		['HF_mW/m²', 'heatFlow', 'mW/m2'],
		['q (HFU)', 'heatFlow', 'HFU'],
		['λ (W/m/K)', 'conductivity', 'W/m/K'],
		['k [W/(m·K)]', 'conductivity', 'W/m/K'],
		['TC (W/m/K)', 'conductivity', 'W/m/K'],
		['Northing_m', 'y', undefined],
		['Easting (m)', 'x', undefined],
		['Lat (deg)', 'lat', undefined],
		['Long_dd', 'lon', undefined],
		['Site-ID', 'code', undefined]
	];
	it.each(cases)('%s → %s', (header, key, unit) => {
		const m = suggestMapping([header]);
		expect(Object.keys(m)).toEqual([key]);
		if (unit) expect(m[key as keyof typeof m]!.unit).toBe(unit);
	});

	it('does not take a header that only starts like a field', () => {
		expect(suggestMapping(['Quarry owner', 'Kiln number'])).toEqual({});
	});
});
