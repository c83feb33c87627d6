// The shipped demo files in static/examples/ (all invented) behave as the upload page expects.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { heatFlowFromLog } from '../thermal/index';
import { parseConductivitySamples } from './conductivity-samples';
import { parseCsv } from './csv';
import { parseGeoJson } from './geojson';
import { parseLas } from './las';
import { suggestMapping } from './mapping';
import { buildPreview } from './preview';
import { temperatureLogFromLas } from './temperature-log';

const read = (name: string) => readFileSync(`static/examples/${name}`, 'utf8');

describe('static/examples', () => {
	it('korvald-boreholes-utm32.csv: semicolons, decimal commas, EPSG:25832; two errors and one warning', () => {
		const table = parseCsv(read('korvald-boreholes-utm32.csv'));
		expect(table.source.delimiter).toBe(';');
		const p = buildPreview(table, {
			mapping: suggestMapping(table.headers),
			epsg: 25832,
			currentYear: 2025
		});
		expect(p.ignoredColumns).toEqual([]);
		expect(p.issues.map((i) => `${i.row}:${i.severity}:${i.code}`)).toEqual([
			'6:error:coordinate.missing',
			'8:warning:heat-production.implausible',
			'10:error:sigma.negative'
		]);
		// KGS-001 was placed at 6.62° E, 58.81° N; coordinates written with
		// echo "58.81 6.62" | cs2cs -f %.1f EPSG:4326 EPSG:25832 (rounded to 0.1 m, so 1e-6°).
		const first = p.rows[0].site!;
		expect(first.location.lon).toBeCloseTo(6.62, 6);
		expect(first.location.lat).toBeCloseTo(58.81, 6);
		expect(p.validCount).toBe(10);
	});
	it('korvald-marine.geojson imports cleanly as marine probe sites', () => {
		const table = parseGeoJson(read('korvald-marine.geojson'));
		const p = buildPreview(table, { mapping: suggestMapping(table.headers), currentYear: 2025 });
		expect(p.issues).toEqual([]);
		expect(p.rows.every((r) => r.site?.method === 'marine_probe')).toBe(true);
	});
	it('KGS-017 LAS log + conductivity CSV give back the 58 mW/m² the log was synthesised from', () => {
		const log = temperatureLogFromLas(parseLas(read('KGS-017-temperature.las')));
		expect(log.issues.map((i) => i.code)).toEqual(['log.missing']); // the NULL at 400 m, on purpose
		const k = parseConductivitySamples(read('KGS-017-conductivity.csv'));
		expect(k.ok).toBe(true);
		const q = heatFlowFromLog({
			depthM: log.depthM,
			temperatureC: log.temperatureC,
			conductivity: k.intervals,
			method: 'bullard'
		});
		expect(q.heatFlowMWm2).toBeCloseTo(58, 0); // invented: T = 6.5 °C + 0.058 W/m² × R(z) ± 0.02 °C
	});
});
