import { describe, expect, it } from 'vitest';
import { parseCsv } from './csv';
import { suggestMapping } from './mapping';
import { buildPreview } from './preview';
import type { SiteDraft } from './site-draft';
import type { ValidateOptions } from './validate-row';

const HEADER =
	'code;x;y;q (mW/m2);q sigma;k (W/mK);k n;gradient (K/km);top (m);bottom (m);A (µW/m³);method;corrections;year';
function preview(lines: string[], options: Partial<ValidateOptions> = {}) {
	const table = parseCsv([HEADER, ...lines].join('\n'));
	return buildPreview(table, {
		mapping: suggestMapping(table.headers),
		epsg: 25832,
		currentYear: 2025,
		...options
	});
}
const GOOD = 'A1;500000;6600000;60,0;3,0;2,5;12;24,0;100;900;2,0;Bullard;topo;1999';
const codes = (p: ReturnType<typeof preview>) =>
	p.issues.map((i) => `${i.row}:${i.severity}:${i.code}`);

describe('buildPreview', () => {
	it('stores a clean row with converted location, enums and the quality class', () => {
		const p = preview([GOOD]);
		expect(p.issues).toEqual([]);
		const site = p.rows[0].site!;
		expect(site.location.lon).toBeCloseTo(9, 9); // EPSG:25832 → 4326 via cs2cs: 9.000000000, 59.538349130
		expect(site.location.lat).toBeCloseTo(59.53834913, 7);
		expect(site).toMatchObject({
			code: 'A1',
			originalX: 500000,
			originalY: 6600000,
			originalEpsg: 25832,
			heatFlowMWm2: 60,
			heatFlowSigmaMWm2: 3,
			conductivityWmK: 2.5,
			conductivitySamples: 12,
			method: 'bullard',
			corrections: ['topographic'],
			yearMeasured: 1999,
			qualityClass: 'well-constrained'
		});
		expect(p.canImport).toBe(true);
	});
	it('blocks missing coordinates, non-numbers, negative σ, unknown method, duplicate/missing codes, top below bottom', () => {
		const p = preview([
			GOOD,
			'A2;500000;;60;3;2,5;12;24;100;900;2;interval;;1999',
			'A3;500000;6600000;sixty;3;2,5;12;24;100;900;2;interval;;1999',
			'A4;500000;6600000;60;-3;2,5;12;24;100;900;2;interval;;1999',
			'A5;500000;6600000;60;3;2,5;12;24;100;900;2;guessed;;1999',
			'A1;500000;6600000;60;3;2,5;12;24;100;900;2;interval;;1999',
			';500000;6600000;60;3;2,5;12;24;100;900;2;interval;;1999',
			'A8;500000;6600000;60;3;2,5;12;24;950;900;2;interval;;1999',
			'A9;500000;6600000;60;3;2,5;12;24;100;900;2;interval;magic;1999'
		]);
		expect(codes(p).filter((c) => c.includes('error'))).toEqual([
			'3:error:coordinate.missing',
			'4:error:number.invalid',
			'5:error:sigma.negative',
			'6:error:method.unknown',
			'7:error:code.duplicate',
			'8:error:code.missing',
			'9:error:depth.top-below-bottom',
			'10:error:corrections.unknown'
		]);
		const byCode = Object.fromEntries(p.issues.map((i) => [i.code, i.message]));
		expect(byCode['coordinate.missing']).toBe(
			'Row 3 (site A2), column "y": empty — the coordinate is missing; every site needs a location.'
		);
		expect(byCode['number.invalid']).toBe(
			'Row 4 (site A3), column "q (mW/m2)": "sixty" is not a number (Heat flow).'
		);
		expect(byCode['sigma.negative']).toBe(
			'Row 5 (site A4), column "q sigma": "-3" is negative; a standard deviation must be ≥ 0.'
		);
		expect(byCode['code.duplicate']).toBe(
			'Row 7 (site A1), column "code": "A1" is already used by row 2; site codes must be unique within the file.'
		);
		expect(byCode['method.unknown']).toMatch(
			/^Row 6 \(site A5\), column "method": "guessed" is not a known method; use one of borehole_interval/
		);
		expect(p.rows.filter((r) => r.site).length).toBe(1);
		expect(p.validCount).toBe(1);
		expect(p.canImport).toBe(false);
	});
	it('warns (never rejects) on implausible values, per docs/science.md#plausibility-limits', () => {
		const p = preview(
			[
				'W1;500000;6600000;650;30;2,5;12;260;100;900;2;interval;;1999', // q > 500 mW/m² (docs/science.md#plausibility-limits)
				'W2;500000;6600000;-5;1;2,5;12;-2;100;900;2;interval;;1999', // q < 0 (docs/science.md#plausibility-limits)
				'W3;500000;6600000;60;3;7,5;12;8;100;900;2;interval;;1999', // k outside 0.5–6 W/m/K (common practice)
				'W4;500000;6600000;60;3;2,5;12;24;100;900;12;interval;;1999', // A > 10 µW/m³ (granite gives about 2–4; docs/science.md#plausibility-limits)
				'W5;500000;6600000;60;3;2,5;12;35;100;900;2;interval;;1999', // Γ vs q/k = 24 K/km: 46 % off
				'W6;500000;6600000;60;3;2,5;12;24;100;900;2;interval;;2031'
			],
			{ nearDistanceM: 0 }
		); // all at one place on purpose: near-duplicates are tested below
		expect(p.errorCount).toBe(0);
		expect(codes(p)).toEqual([
			'2:warning:heat-flow.implausible',
			'3:warning:heat-flow.negative',
			'4:warning:conductivity.implausible',
			'5:warning:heat-production.implausible',
			'6:warning:gradient.inconsistent',
			'7:warning:year.implausible'
		]);
		expect(p.issues[4].message).toBe(
			'Row 6 (site W5), column "gradient (K/km)": "35" (35 K/km) differs by 46 % from heat flow / conductivity = 60 / 2.5 = 24 K/km (more than 20 %).'
		);
		expect(p.rows.every((r) => r.site !== null)).toBe(true);
		expect(
			codes(
				preview(['W1;500000;6600000;650;30;2,5;12;260;100;900;2;interval;;1999'], {
					volcanicArea: true
				})
			)
		).toEqual([]);
	});
	it('reports lat/lon out of range after transformation and unknown per-row CRS', () => {
		const table = parseCsv('code,lon,lat,q\nA,10,95,60\nB,"7°30\'W","59 12 30 N",60\nC,10,50,60\n');
		const p = buildPreview(table, { mapping: suggestMapping(table.headers) });
		expect(p.issues.map((i) => i.code)).toEqual(['angle.invalid']);
		expect(p.issues[0].message).toBe(
			'Row 2 (site A), column "lat": "95" is outside ±90° for a latitude.'
		);
		expect(p.rows[1].site!.location).toEqual({ lon: -7.5, lat: 59 + 12 / 60 + 30 / 3600 });
		const projected = parseCsv(
			'code;x;y;epsg;q\nA;1e9;1e9;3857;60\nB;1;2;1234;60\nC;500000;6600000;EPSG:32632;60\nD;500000;99000000;25832;60\nE;1500000;6600000;25832;60\n'
		);
		const q = buildPreview(projected, { mapping: suggestMapping(projected.headers), epsg: 25832 });
		expect(q.issues.map((i) => `${i.row}:${i.severity}:${i.code}`)).toEqual([
			'2:error:coordinate.out-of-range', // Web Mercator 1e9 m → longitude 8623°
			'3:error:crs.unknown',
			'5:error:coordinate.transform', // northing 99 000 km: proj4 alone returns a wrong, finite point
			'6:warning:coordinate.outside-zone' // easting 1 500 km: about 18° east of zone 32's meridian
		]);
		expect(q.issues[0].message).toMatch(
			/^Row 2 \(site A\), column "Coordinates": "1e9 \/ 1e9" — in EPSG:3857 this is longitude 8623\.15°/
		);
		expect(q.rows[2].site!.originalEpsg).toBe(32632);
	});
	it('passes valid sites to the nearExisting hook and shows its message as a warning', () => {
		const seen: SiteDraft[] = [];
		const p = preview([GOOD], {
			nearExisting: (s) => (seen.push(s), 'within 50 m of site X-9 in dataset "Survey 2001"')
		});
		expect(seen.map((s) => s.code)).toEqual(['A1']);
		expect(p.warningCount).toBe(1);
		expect(p.issues[0].message).toMatch(/within 50 m of site X-9/);
	});
	it('stops at whole-file mapping errors', () => {
		const table = parseCsv('foo,bar\n1,2\n');
		const p = buildPreview(table, { mapping: suggestMapping(table.headers) });
		expect(p.rows).toEqual([]);
		expect(p.fileIssues.map((i) => i.code)).toEqual(['mapping.no-code', 'mapping.no-coordinates']);
		expect(p.ignoredColumns).toEqual(['foo', 'bar']);
	});
	it('validates 10 000 rows correctly (bench-sized; no timing assertion)', () => {
		const lines: string[] = [];
		for (let i = 0; i < 10_000; i++) {
			const bad = i % 1000 === 999;
			lines.push(
				`S${i};${400000 + (i % 100) * 1000};${6500000 + Math.floor(i / 100) * 1000};${bad ? 'x' : '55,5'};4;2,5;9;22,2;50;800;1,5;interval;;2001`
			);
		}
		const p = preview(lines);
		expect(p.rows.length).toBe(10_000);
		expect(p.errorCount).toBe(10);
		expect(p.validCount).toBe(9_990);
		expect(p.issues.every((i) => i.code === 'number.invalid' && i.column === 'q (mW/m2)')).toBe(
			true
		);
		expect(p.rows[9_999].row).toBe(10_001);
		expect(p.rows[5].site!.heatFlowMWm2).toBe(55.5);
	});
});
