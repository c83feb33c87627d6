import Papa from 'papaparse';
import { and, desc, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { auditEvent, dataset, site } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * Site downloads (src/lib/server/repositories/downloads.ts): CSV and GeoJSON for whoever may see
 * the dataset, each carrying the citation, licence (SPDX) and version, with formulas neutralised,
 * and each recorded in the audit log.
 */
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const ORG = 'org-korvald-survey';
const run = Date.now().toString(36);
let anonymous: Client;
let outsider: Client;
let orgViewer: Client;

beforeAll(async () => {
	anonymous = new Client();
	outsider = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
	orgViewer = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
});
afterAll(async () => {
	await sql.end();
});

async function datasetWithSites(visibility: 'public' | 'private', label: string) {
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: ORG,
			title: `Downloads ${label} ${run}`,
			authors: 'Holm, A.; Varga, K.',
			licence: 'CC-BY-4.0',
			version: 3,
			status: 'published',
			visibility,
			publishedAt: new Date('2026-03-04T00:00:00Z'),
			citation: 'Please also cite the invented field report.'
		})
		.returning();
	await db.insert(site).values([
		{
			datasetId: d.id,
			code: `DL-1-${run}`,
			name: '=HYPERLINK("http://x.example","click")',
			location: { lon: 12.5, lat: -33.25 },
			heatFlowMWm2: 61.5,
			heatFlowSigmaMWm2: 3,
			corrections: ['topographic', 'palaeoclimatic']
		},
		{
			datasetId: d.id,
			code: `DL-2-${run}`,
			name: '-2+3',
			location: { lon: -12.5, lat: 33.25 },
			heatFlowMWm2: -4.5
		}
	]);
	return d;
}

const downloads = (id: string) =>
	db
		.select()
		.from(auditEvent)
		.where(and(eq(auditEvent.datasetId, id), eq(auditEvent.action, 'download')))
		.orderBy(desc(auditEvent.at));

describe('site downloads', () => {
	it('CSV: a citation header block, licence, version, neutralised cells; recorded', async () => {
		const d = await datasetWithSites('public', 'csv');
		const res = await anonymous.get(`/datasets/${d.id}/download/sites.csv`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(res.headers.get('content-disposition')).toMatch(
			/^attachment; filename="downloads-csv-\w+-v3\.csv"$/
		);
		expect(res.headers.get('link')).toMatch(new RegExp(`/datasets/${d.id}>; rel="cite-as"$`));
		expect(res.headers.get('cache-control')).toBe('private, no-store');
		const text = await res.text();
		const lines = text.split('\n');
		expect(lines[0]).toMatch(
			new RegExp(
				`^# Cite as: Holm, A\\.; Varga, K\\. \\(2026\\)\\. Downloads csv ${run}, version 3 \\[data set\\]\\. Korvald .*Thermalith\\. Licence CC-BY-4\\.0\\. http://.*/datasets/${d.id}$`
			)
		);
		expect(lines.slice(1, 3)).toEqual(['# Licence (SPDX): CC-BY-4.0', '# Version: 3']);
		expect(lines).toContain('# Citation note: Please also cite the invented field report.');
		const [head, ...rows] = Papa.parse<string[]>(text.trim(), { comments: '#' }).data;
		const at = (r: string[], h: string) => r[head.indexOf(h)];
		expect(rows).toHaveLength(2);
		expect(at(rows[0], 'site_code')).toBe(`DL-1-${run}`);
		expect(at(rows[0], 'site_name')).toBe(`'=HYPERLINK("http://x.example","click")`);
		expect(at(rows[0], 'longitude_deg')).toBe('12.5');
		expect(at(rows[0], 'latitude_deg')).toBe('-33.25');
		expect(at(rows[0], 'corrections')).toBe('topographic, palaeoclimatic');
		expect(at(rows[1], 'site_name')).toBe("'-2+3");
		expect(at(rows[1], 'heat_flow_mW_m2')).toBe('-4.5');
		const [logged] = await downloads(d.id);
		expect(logged).toMatchObject({
			actorId: null,
			organisationId: ORG,
			details: { format: 'csv', sites: 2, version: 3 }
		});
	});

	it('GeoJSON: a metadata member with the citation, licence and version', async () => {
		const d = await datasetWithSites('public', 'geojson');
		const res = await outsider.get(`/datasets/${d.id}/download/sites.geojson`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/geo+json; charset=utf-8');
		const body = await res.json();
		expect(body.type).toBe('FeatureCollection');
		expect(body.metadata).toMatchObject({
			licence: 'CC-BY-4.0',
			version: 3,
			year: '2026',
			authors: 'Holm, A.; Varga, K.',
			citationNote: 'Please also cite the invented field report.'
		});
		expect(body.metadata.citation).toContain(`Downloads geojson ${run}, version 3`);
		expect(body.metadata.url).toMatch(new RegExp(`/datasets/${d.id}$`));
		const one = body.features.find(
			(f: { properties: Record<string, unknown> }) => f.properties.site_code === `DL-1-${run}`
		);
		expect(one.geometry).toEqual({ type: 'Point', coordinates: [12.5, -33.25] });
		expect(one.properties.heat_flow_mW_m2).toBe(61.5);
		const [logged] = await downloads(d.id);
		expect(logged).toMatchObject({
			actorEmail: 'owner@lindmark-thermics.example',
			details: { format: 'geojson', sites: 2 }
		});
	});

	it('only for those who may see the dataset: the same 404 otherwise, and nothing recorded', async () => {
		const d = await datasetWithSites('private', 'private');
		for (const client of [anonymous, outsider])
			for (const f of ['csv', 'geojson']) {
				const res = await client.get(`/datasets/${d.id}/download/sites.${f}`);
				expect(res.status).toBe(404);
				expect(await res.text()).not.toContain('DL-1');
			}
		expect(await downloads(d.id)).toEqual([]);
		const res = await orgViewer.get(`/datasets/${d.id}/download/sites.csv`);
		expect(res.status).toBe(200);
		expect(await res.text()).toContain(`DL-1-${run}`);
		expect(await downloads(d.id)).toHaveLength(1);
	});

	it('the dataset page says how to cite it and links both downloads', async () => {
		const d = await datasetWithSites('public', 'page');
		const html = (await (await anonymous.get(`/datasets/${d.id}`)).text()).replace(
			/<!--[^>]*-->/g,
			''
		);
		expect(html).toContain('How to cite');
		expect(html).toMatch(/Holm, A\.; Varga, K\. \(2026\)\. Downloads page \w+, version 3/);
		expect(html).toContain(`/datasets/${d.id}/download/sites.csv`);
		expect(html).toContain(`/datasets/${d.id}/download/sites.geojson`);
	});
});
