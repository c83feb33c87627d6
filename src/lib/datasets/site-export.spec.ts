import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { citationFields } from './citation';
import { downloadFileName, sitesCsv, sitesGeoJson } from './site-export';

/* Download formats carry the citation (common practice, no source). */
const citation = citationFields(
	{
		id: '0b9f0d3e-0000-4000-8000-000000000001',
		title: 'Invented shield',
		authors: '',
		version: 3,
		licence: 'CC-BY-4.0',
		doi: null,
		status: 'published',
		citation: '',
		publishedAt: '2026-01-02T00:00:00Z',
		createdAt: '2026-01-01T00:00:00Z'
	},
	'Korvald Survey',
	'http://h'
);
const sites = [
	{
		lon: 8.25,
		lat: -59.4,
		code: '=A1',
		name: 'Invented',
		heatFlowMWm2: -1.5,
		corrections: ['topographic', 'palaeoclimatic'],
		method: 'borehole_interval',
		qualityClass: 'A'
	}
];

describe('site downloads', () => {
	it('CSV: citation block, template columns, neutralised cells', () => {
		const csv = sitesCsv(sites, citation);
		expect(csv.split('\n').slice(0, 4)).toEqual([
			`# Cite as: ${citation.citation}`,
			'# Licence (SPDX): CC-BY-4.0',
			'# Version: 3',
			'# Dataset: http://h/datasets/0b9f0d3e-0000-4000-8000-000000000001'
		]);
		const [head, row] = Papa.parse<string[]>(csv.trim(), { comments: '#' }).data;
		const at = (h: string) => row[head.indexOf(h)];
		expect(at('site_code')).toBe("'=A1");
		expect(at('longitude_deg')).toBe('8.25');
		expect(at('latitude_deg')).toBe('-59.4');
		expect(at('heat_flow_mW_m2')).toBe('-1.5');
		expect(at('corrections')).toBe('topographic, palaeoclimatic');
		expect(at('quality_class')).toBe('A');
	});

	it('GeoJSON: a metadata member with citation, licence and version', () => {
		const g = sitesGeoJson(sites, citation);
		expect(g.metadata).toMatchObject({
			citation: citation.citation,
			licence: 'CC-BY-4.0',
			version: 3
		});
		expect(g.features[0].geometry.coordinates).toEqual([8.25, -59.4]);
		expect(g.features[0].properties).toMatchObject({ site_code: '=A1', heat_flow_mW_m2: -1.5 });
	});

	it('names the file after the title and version', () => {
		expect(downloadFileName('Crème: heat/flow «2026»', 2, 'csv')).toBe(
			'creme-heatflow-2026-v2.csv'
		);
	});
});
