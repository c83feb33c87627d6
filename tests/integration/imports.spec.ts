import { and, asc, count, eq, sql } from 'drizzle-orm';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { attachment, importBatch, site } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import {
	commitRequest,
	createDraftDataset,
	gridCsv,
	previewRequest,
	uploadAndPreview,
	uploadForImport,
	waitForImport
} from './fixtures';
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

describe('table imports owned by the server', () => {
	it('keeps the uploaded file with the dataset and refuses to commit while a row is blocked', async () => {
		const csv = gridCsv(20, 'BAD').replace(/\nBAD-7;[^;]*;/, '\nBAD-7;;'); // row 9 loses its latitude
		const { batchId, preview } = await uploadAndPreview(contributor, datasetId, 'bad.csv', csv);
		expect(preview.errorCount).toBe(1);
		expect(preview.blockedCount).toBe(1);
		// Other files in this database may lie near these sites (warnings); the error is the one.
		const errors = preview.issues.filter((i: { severity: string }) => i.severity === 'error');
		expect(errors).toHaveLength(1);
		expect(errors[0].message).toMatch(/^Row 9 \(site BAD-7\), column "latitude"/);
		expect(preview.reportCsv.split('\n')[0]).toBe('row,code,severity,column,message');
		expect(preview.reportCsv).toContain('9,BAD-7,error,latitude,');
		expect(preview.canImport).toBe(false);
		const blocked = preview.rows.find((r: { row: number }) => r.row === 9);
		expect(blocked).toMatchObject({ status: 'blocked', code: 'BAD-7' });
		const res = await commitRequest(contributor, batchId, preview.revision);
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toContain('Nothing was written');
		expect(await sitesIn(datasetId)).toBe(0);
		// The original file is an attachment of the dataset, named by the batch.
		const [b] = await db
			.select({ status: importBatch.status, file: attachment.fileName, sha: attachment.sha256 })
			.from(importBatch)
			.innerJoin(attachment, eq(importBatch.attachmentId, attachment.id))
			.where(eq(importBatch.id, batchId));
		expect(b).toMatchObject({ status: 'draft', file: 'bad.csv' });
		expect(b.sha).toMatch(/^[0-9a-f]{64}$/);
	});

	it('commits 10,000 rows by batch id on the job queue, with progress, and notices the same file again', async () => {
		const csv = gridCsv(10_000, 'BIG');
		const { batchId, preview } = await uploadAndPreview(contributor, datasetId, 'big.csv', csv);
		expect(preview.canImport).toBe(true);
		// The preview shows product labels, rounded values, lat/lon and the coordinates as entered.
		expect(preview.columns.map((c: { label: string }) => c.label)).toContain('Heat flow (mW/m²)');
		expect(preview.rows[0].values).toMatchObject({ code: 'BIG-0', lat: '-50', lon: '-30' });
		const res = await commitRequest(contributor, batchId, preview.revision);
		expect(res.status).toBe(202);
		expect((await res.json()).rows).toBe(10_000);
		const done = await waitForImport(contributor, batchId);
		expect(done).toMatchObject({ status: 'done', totalRows: 10_000, doneRows: 10_000 });
		expect(await sitesIn(datasetId)).toBe(10_000);
		const [stored] = await db
			.select({
				srid: sql<number>`ST_SRID(${site.location})`,
				hf: site.heatFlowMWm2,
				q: site.qualityClass,
				batch: site.importBatchId
			})
			.from(site)
			.where(and(eq(site.datasetId, datasetId), eq(site.code, 'BIG-101')));
		// 60 + 101 mod 40; σ 6/81 ≈ 7 %, no conductivity samples → one step down
		expect(stored).toEqual({ srid: 4326, hf: 81, q: 'constrained', batch: batchId });
		// A committed batch cannot be committed or previewed again.
		expect((await commitRequest(contributor, batchId, preview.revision)).status).toBe(409);

		const again = await uploadAndPreview(contributor, datasetId, 'big-again.csv', csv);
		expect(again.preview.previousImport).not.toBeNull();
		expect(again.preview.errorCount).toBe(10_000);
		expect(again.preview.issuesTruncated).toBe(true);
		const messages: string[] = again.preview.issues.map((i: { message: string }) => i.message);
		expect(messages[0]).toBe(
			'Row 2 (site BIG-0), column "site_code": site "BIG-0" exists in this dataset already.'
		);
	}, 180_000);

	it('warns about a site near an existing one (configurable distance) and keeps the flag on the site', async () => {
		const [demo] = await db
			.select({
				lon: sql<number>`ST_X(${site.location})`,
				lat: sql<number>`ST_Y(${site.location})`
			})
			.from(site)
			.where(eq(site.code, 'KGS-001'));
		// 0.0005° of latitude is about 55.6 m (1° ≈ 111.2 km on the sphere; common practice).
		const near = `site_code;latitude;longitude;heat_flow_mw_m2\nNEAR-1;${demo.lat + 0.0005};${demo.lon};70\nFAR-1;${demo.lat + 0.01};${demo.lon};70\n`;
		const ds = await createDraftDataset(contributor, `Near test ${Date.now()}`);
		const { batchId, mapping, preview } = await uploadAndPreview(contributor, ds, 'near.csv', near);
		const warnings = preview.issues
			.filter((i: { severity: string }) => i.severity === 'warning')
			.map((i: { message: string }) => i.message);
		expect(warnings.find((m: string) => m.includes('existing site KGS-001'))).toMatch(
			/^Row 2 \(site NEAR-1\): the site at .* is 5[4-7] m from existing site KGS-001/
		);
		expect(warnings.some((m: string) => m.startsWith('Row 3') && m.includes('existing'))).toBe(
			false
		);
		// 50 m: no longer near.
		const closer = await (
			await previewRequest(contributor, batchId, {
				mapping,
				nearDistanceM: 50
			})
		).json();
		expect(closer.issues.some((i: { code: string }) => i.code === 'location.near-existing')).toBe(
			false
		);
		const again = await (await previewRequest(contributor, batchId, { mapping })).json();
		expect((await commitRequest(contributor, batchId, again.revision)).status).toBe(202);
		expect((await waitForImport(contributor, batchId)).status).toBe('done');
		const [flagged] = await db
			.select({ flags: site.flags })
			.from(site)
			.where(and(eq(site.datasetId, ds), eq(site.code, 'NEAR-1')));
		expect(flagged.flags).toEqual(['near-existing-site']);
	});

	it('stores exactly the rows shown after a correction and an exclusion, and records both', async () => {
		const ds = await createDraftDataset(contributor, `Fix test ${Date.now()}`);
		const csv =
			'site_code;latitude;longitude;heat_flow_mw_m2\nFX-1;61,0;10,0;70\nFX-2;;10,1;71\nFX-3;61,2;10,2;1e999\nFX-4;61,3;10,3;586\n';
		const { batchId, headers, mapping, preview } = await uploadAndPreview(
			contributor,
			ds,
			'fix.csv',
			csv
		);
		expect(preview.blockedCount).toBe(2);
		expect(preview.issues.find((i: { row: number }) => i.row === 4).message).toMatch(
			/^Row 4 \(site FX-3\), column "heat_flow_mw_m2": "1e999" is not a finite number/
		);
		expect((await commitRequest(contributor, batchId, preview.revision)).status).toBe(400);
		const fixed = await (
			await previewRequest(contributor, batchId, {
				mapping,
				edits: {
					corrections: [{ row: 3, column: headers.indexOf('latitude'), value: '61,1' }],
					excluded: [4]
				}
			})
		).json();
		expect(fixed).toMatchObject({ canImport: true, validCount: 3, excludedCount: 1 });
		// An older revision cannot be committed.
		expect((await commitRequest(contributor, batchId, preview.revision)).status).toBe(409);
		expect((await commitRequest(contributor, batchId, fixed.revision)).status).toBe(202);
		expect((await waitForImport(contributor, batchId)).status).toBe('done');
		const stored = await db
			.select({ code: site.code, lat: sql<number>`ST_Y(${site.location})`, flags: site.flags })
			.from(site)
			.where(eq(site.datasetId, ds))
			.orderBy(asc(site.code));
		expect(stored).toEqual([
			{ code: 'FX-1', lat: 61, flags: [] },
			{ code: 'FX-2', lat: 61.1, flags: [] },
			{ code: 'FX-4', lat: 61.3, flags: ['heat-flow-implausible'] }
		]);
		const [b] = await db
			.select({ edits: importBatch.edits })
			.from(importBatch)
			.where(eq(importBatch.id, batchId));
		expect(b.edits).toEqual({
			corrections: [
				{ row: 3, column: headers.indexOf('latitude'), value: '61,1', header: 'latitude', was: '' }
			],
			excluded: [4]
		});
	});

	it('reads XLSX date cells on the server as years', async () => {
		const ds = await createDraftDataset(contributor, `XLSX test ${Date.now()}`);
		const wb = new ExcelJS.Workbook();
		const sheet = wb.addWorksheet('Boreholes');
		sheet.addRow(['Site', 'Latitude', 'Longitude', 'Heat flow (HFU)', 'Year']);
		sheet.addRow(['XD-1', 59.12, 7.41, 1.5, new Date(Date.UTC(1987, 5, 1))]);
		sheet.addRow(['XD-2', 59.3, 7.9, 1.75, 2001]);
		const bytes = new Uint8Array(await wb.xlsx.writeBuffer());
		const { batchId, preview } = await uploadAndPreview(contributor, ds, 'dates.xlsx', bytes);
		expect(preview.errorCount).toBe(0);
		expect((await commitRequest(contributor, batchId, preview.revision)).status).toBe(202);
		expect((await waitForImport(contributor, batchId)).status).toBe('done');
		const years = await db
			.select({ code: site.code, year: site.yearMeasured })
			.from(site)
			.where(eq(site.datasetId, ds))
			.orderBy(asc(site.code));
		expect(years).toEqual([
			{ code: 'XD-1', year: 1987 },
			{ code: 'XD-2', year: 2001 }
		]);
	});

	it('runs two imports into one dataset at once, each completely', async () => {
		const ds = await createDraftDataset(contributor, `Two at once ${Date.now()}`);
		const a = await uploadAndPreview(contributor, ds, 'a.csv', gridCsv(3000, 'TA'));
		const b = await uploadAndPreview(
			contributor,
			ds,
			'b.csv',
			gridCsv(3000, 'TB', { lon: 20, lat: 40 })
		);
		const [ra, rb] = await Promise.all([
			commitRequest(contributor, a.batchId, a.preview.revision),
			commitRequest(contributor, b.batchId, b.preview.revision)
		]);
		expect([ra.status, rb.status]).toEqual([202, 202]);
		const [da, db_] = await Promise.all([
			waitForImport(contributor, a.batchId),
			waitForImport(contributor, b.batchId)
		]);
		expect([da.status, db_.status]).toEqual(['done', 'done']);
		expect(await sitesIn(ds)).toBe(6000);
	}, 120_000);

	it('does not let a viewer, another organisation or another contributor work on an import', async () => {
		const viewer = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
		const other = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
		const body = { attachmentId: crypto.randomUUID() };
		expect((await viewer.json(`/api/v1/datasets/${datasetId}/imports`, body)).status).toBe(403);
		// A private dataset of another organisation does not exist as far as they can tell.
		expect((await other.json(`/api/v1/datasets/${datasetId}/imports`, body)).status).toBe(404);
		expect((await new Client().json(`/api/v1/datasets/${datasetId}/imports`, body)).status).toBe(
			401
		);
		const { batchId } = await uploadForImport(contributor, datasetId, 'mine.csv', gridCsv(2, 'M'));
		const curator = await signIn('curator@korvald-survey.example', DEMO_PASSWORD);
		expect((await previewRequest(curator, batchId, { mapping: {} })).status).toBe(404);
		expect((await commitRequest(other, batchId, 1)).status).toBe(404);
	});
});
