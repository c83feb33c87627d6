import { and, count, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { importBatch, site } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, importPayload, waitForImport } from './fixtures';
import { Client, DEMO_PASSWORD, signIn } from './http';

const { db, client: sql_ } = createDb(testEnv.databaseUrl(), { max: 2 });
let contributor: Client;
let datasetId: string;
const sitesIn = async (id: string) =>
	(await db.select({ n: count() }).from(site).where(eq(site.datasetId, id)))[0].n;

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `Import test ${Date.now()}`);
});
afterAll(async () => {
	await sql_.end();
});

describe('table imports', () => {
	it('refuses a file with one bad row and writes nothing', async () => {
		const csv = gridCsv(20, 'BAD').replace(/\nBAD-7;[^;]*;/, '\nBAD-7;;'); // row 9 loses its latitude
		const payload = importPayload('bad.csv', csv);
		const preview = await (
			await contributor.json(`/api/v1/datasets/${datasetId}/imports/preview`, payload)
		).json();
		expect(preview.errorCount).toBe(1);
		expect(preview.issues[0].message).toMatch(/^Row 9, column "latitude"/);
		expect(preview.canImport).toBe(false);
		const res = await contributor.json(`/api/v1/datasets/${datasetId}/imports`, payload);
		expect(res.status).toBe(400);
		expect((await res.json()).message).toContain('Nothing was written');
		expect(await sitesIn(datasetId)).toBe(0);
		const batches = await db
			.select({ n: count() })
			.from(importBatch)
			.where(eq(importBatch.datasetId, datasetId));
		expect(batches[0].n).toBe(0);
	});

	it('imports 10,000 rows completely, with progress, and notices the same file again', async () => {
		const csv = gridCsv(10_000, 'BIG');
		const payload = importPayload('big.csv', csv);
		const res = await contributor.json(`/api/v1/datasets/${datasetId}/imports`, payload);
		expect(res.status).toBe(202);
		const { batchId, rows } = await res.json();
		expect(rows).toBe(10_000);
		const done = await waitForImport(contributor, batchId);
		expect(done).toMatchObject({ status: 'done', totalRows: 10_000, doneRows: 10_000 });
		expect(await sitesIn(datasetId)).toBe(10_000);
		const [stored] = await db
			.select({
				srid: sql<number>`ST_SRID(${site.location})`,
				hf: site.heatFlowMWm2,
				q: site.qualityClass
			})
			.from(site)
			.where(and(eq(site.datasetId, datasetId), eq(site.code, 'BIG-101')));
		expect(stored).toEqual({ srid: 4326, hf: 81, q: 'constrained' }); // 60 + 101 mod 40; σ 6/81 ≈ 7 %, no conductivity samples → one step down

		const again = await (
			await contributor.json(`/api/v1/datasets/${datasetId}/imports/preview`, payload)
		).json();
		expect(again.previousImport).not.toBeNull();
		const messages: string[] = again.issues.map((i: { message: string }) => i.message);
		expect(again.errorCount).toBe(10_000);
		expect(again.issuesTruncated).toBe(true);
		expect(messages[0]).toBe(
			'Row 2, column "site_code": site "BIG-0" exists in this dataset already.'
		);
		// The same places are now taken by the sites just imported: each row is also flagged as near one.
		expect(
			messages.some((m) => /^Row 2: the site at .* is 0 m from existing site BIG-0/.test(m))
		).toBe(true);
	});

	it('warns about a site within 100 m of an existing one, using PostGIS distance', async () => {
		const [demo] = await db
			.select({
				lon: sql<number>`ST_X(${site.location})`,
				lat: sql<number>`ST_Y(${site.location})`
			})
			.from(site)
			.where(eq(site.code, 'KGS-001'));
		// 0.0005° of latitude is about 55.6 m (1° ≈ 111.2 km on the sphere; common practice).
		const near = `site_code;latitude;longitude;heat_flow_mw_m2\nNEAR-1;${demo.lat + 0.0005};${demo.lon};70\nFAR-1;${demo.lat + 0.01};${demo.lon};70\n`;
		const preview = await (
			await contributor.json(
				`/api/v1/datasets/${datasetId}/imports/preview`,
				importPayload('near.csv', near)
			)
		).json();
		const warnings = preview.issues
			.filter((i: { severity: string }) => i.severity === 'warning')
			.map((i: { message: string }) => i.message);
		const nearWarning = warnings.find((m: string) => m.includes('existing site KGS-001'));
		expect(nearWarning).toMatch(/^Row 2: the site at .* is 5[4-7] m from existing site KGS-001/);
		expect(warnings.some((m: string) => m.startsWith('Row 3') && m.includes('existing site'))).toBe(
			false
		);
	});

	it('does not let a viewer or another organisation import', async () => {
		const viewer = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
		const other = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
		const payload = importPayload('x.csv', gridCsv(2, 'X'));
		expect((await viewer.json(`/api/v1/datasets/${datasetId}/imports`, payload)).status).toBe(403);
		// A private dataset of another organisation does not exist as far as they can tell.
		expect((await other.json(`/api/v1/datasets/${datasetId}/imports`, payload)).status).toBe(404);
		expect((await new Client().json(`/api/v1/datasets/${datasetId}/imports`, payload)).status).toBe(
			401
		);
	});
});
