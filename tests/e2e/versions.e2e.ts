import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, site } from '../../src/lib/server/db/schema';
import { testEnv } from '../integration/env';
import { appUrl, launch, screenshot, signedIn } from './browser';

/*
 * A curator corrects a published dataset as a new version: opens the correction, adds a site
 * with the import wizard, reads the diff, submits and publishes; the old version then says it is
 * superseded and the new one links back to it.
 */
let browser: Browser;
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 1 });
const run = Date.now().toString(36);
const title = `Versioned shield (e2e ${run})`;
let v1Id = '';
let csvFile = '';

beforeAll(async () => {
	browser = await launch();
	// The published first version (invented): two sites far from the demo data.
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: 'org-korvald-survey',
			title,
			authors: 'Holm, A.',
			licence: 'CC-BY-4.0',
			status: 'published',
			visibility: 'public',
			publishedAt: new Date('2025-05-01T00:00:00Z')
		})
		.returning({ id: dataset.id });
	v1Id = d.id;
	await db.insert(site).values(
		['A', 'B'].map((c, i) => ({
			datasetId: d.id,
			code: `V-${c}-${run}`,
			location: { lon: 150.1 + i * 0.01, lat: -20 },
			heatFlowMWm2: 55 + i,
			heatFlowSigmaMWm2: 4
		}))
	);
	// The correction adds one site, in the upload template's columns.
	csvFile = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'versions-e2e-')), 'added-site.csv');
	fs.writeFileSync(
		csvFile,
		'site_code,site_name,longitude_deg,latitude_deg,heat_flow_mW_m2,heat_flow_sigma_mW_m2,method\n' +
			`V-C-${run},Invented added site,150.3,-20,61.5,3.5,borehole_interval\n`
	);
});
afterAll(async () => {
	await browser?.close();
	await sql.end();
});

describe('versions, as a curator would correct a published dataset', () => {
	it('correct, see the diff, publish; the old version says it is superseded', async () => {
		const { page, errors } = await signedIn(browser, 'curator@korvald-survey.example');
		const v1Url = `${appUrl()}/datasets/${v1Id}`;
		await page.goto(v1Url);
		await page.getByTestId('citation').waitFor();
		await expect(page.getByTestId('citation').textContent()).resolves.toContain(
			`Holm, A. (2025). ${title}, version 1 [data set]`
		);
		// A published version offers no import, only a correction.
		await expect(
			page.getByRole('link', { name: 'Import sites from a file' }).count()
		).resolves.toBe(0);
		await page.getByRole('button', { name: 'Correct this dataset' }).click();
		await page.waitForURL(/\/datasets\/[0-9a-f-]{36}\?correcting=new$/);
		const v2Url = page.url().split('?')[0];
		expect(v2Url).not.toBe(v1Url);
		await page.getByText('Version 2 opened as a draft copy of version 1.').waitFor();
		await expect(page.getByTestId('dataset-status').textContent()).resolves.toBe('Draft');
		await expect(page.getByTestId('diff-summary').textContent()).resolves.toMatch(
			/0 added · 0 removed · 0 changed ·\s*2 unchanged/
		);

		// The correction: one more site through the import wizard.
		await page.getByRole('link', { name: 'Import sites from a file' }).click();
		await page.waitForURL(/\/import$/);
		await page
			.getByLabel('A spreadsheet (CSV, XLSX) or GeoJSON file of sites')
			.setInputFiles(csvFile);
		await page.getByTestId('mapping-form').waitFor();
		await page.getByRole('button', { name: 'Check the rows' }).click();
		await page.getByTestId('preview-report').waitFor();
		await page.getByRole('button', { name: 'Import 1 sites', exact: true }).click();
		await page.getByText('Imported 1 sites.').waitFor({ timeout: 30_000 });
		await page.getByRole('link', { name: 'Open the dataset' }).click();
		await page.waitForURL(v2Url);

		// The diff the curator reads before publishing.
		await expect(page.getByTestId('diff-summary').textContent()).resolves.toMatch(
			/1 added · 0 removed · 0 changed ·\s*2 unchanged/
		);
		await expect(page.getByTestId('diff-added').textContent()).resolves.toBe(`V-C-${run}`);
		await expect(page.getByTestId('previous-version').textContent()).resolves.toContain(
			'version 1'
		);
		await screenshot(page, 'versions-diff');

		await page.getByRole('button', { name: 'Submit for review' }).click();
		await page.getByText('Submitted for review. The curators have been told.').waitFor();
		await page.getByRole('button', { name: 'Publish' }).click();
		await page.getByText('Published.', { exact: true }).waitFor();
		await expect(page.getByTestId('dataset-status').textContent()).resolves.toBe('Published');
		await expect(page.getByTestId('citation').textContent()).resolves.toContain('version 2');
		await screenshot(page, 'versions-published');

		// The first version stays readable, with its own citation and a link to the new one.
		await page.goto(v1Url);
		await expect(page.getByTestId('superseded-by').textContent()).resolves.toMatch(
			/Superseded by\s+version 2/
		);
		await expect(page.getByTestId('citation').textContent()).resolves.toContain('version 1');
		await expect(page.getByRole('button', { name: 'Correct this dataset' }).count()).resolves.toBe(
			0
		);
		await screenshot(page, 'versions-superseded');
		await page.getByTestId('superseded-by').getByRole('link').click();
		await page.waitForURL(v2Url);
		expect(errors).toEqual([]);
	});
});
