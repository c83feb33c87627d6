import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { runEmbargoRelease } from '../../src/lib/server/jobs/embargo-release';
import { createMailTransport } from '../../src/lib/server/mail-transport';
import { appUrl, launch, screenshot, signedIn } from './browser';
import { firstLink, waitForMailAbout } from './mail';

/*
 * The whole curation journey through the UI, with the e-mail of each step read from the mail
 * catcher: a contributor imports a restricted dataset and submits it, a curator publishes it; an
 * outsider finds it in the list, asks for access, is granted it and downloads the values with the
 * citation; the contributor corrects it as version 2, adding a site and putting the new version
 * under embargo; the curator reads the diff and publishes; the release job (run from here with a
 * clock set to the release day, a hook only a test holding the database has) makes it public.
 */
const CONTRIBUTOR = 'contributor@korvald-survey.example';
const CURATOR = 'curator@korvald-survey.example';
const OUTSIDER = 'owner@skarnholt.example';
const databaseUrl = process.env.DATABASE_URL;
const smtpUrl = process.env.SMTP_URL;
if (!databaseUrl || !smtpUrl)
	throw new Error(
		'DATABASE_URL and SMTP_URL are not set: run the browser tests through `npm test`'
	);
const { db, client: sql } = createDb(databaseUrl, { max: 1 });

const run = Date.now().toString(36);
const title = `Curation journey basin (e2e ${run})`;
const HEADER =
	'site_code,site_name,longitude_deg,latitude_deg,heat_flow_mW_m2,heat_flow_sigma_mW_m2,method\n';
let browser: Browser;
let dir = '';

beforeAll(async () => {
	browser = await launch();
	dir = fs.mkdtempSync(path.join(os.tmpdir(), 'curation-journey-'));
	// Invented sites, far from the demo data.
	fs.writeFileSync(
		path.join(dir, 'first.csv'),
		HEADER +
			`CJ-A-${run},Invented site A,-140.2,-48.1,71.25,4,borehole_interval\n` +
			`CJ-B-${run},Invented site B,-140.3,-48.2,66.5,3,borehole_interval\n`
	);
	fs.writeFileSync(
		path.join(dir, 'correction.csv'),
		HEADER + `CJ-C-${run},Invented site C,-140.4,-48.3,83.4,5,borehole_interval\n`
	);
});
afterAll(async () => {
	await browser?.close();
	await sql.end();
});

const status = (page: Page) => page.getByTestId('dataset-status').textContent();

/** Import a CSV through the wizard on a draft's page and come back to the dataset. */
async function importCsv(page: Page, file: string, rows: number) {
	const datasetUrl = page.url().split('?')[0];
	await page.getByRole('link', { name: 'Import sites from a file' }).click();
	await page.waitForURL(/\/import$/);
	await page.getByLabel('A spreadsheet (CSV, XLSX) or GeoJSON file of sites').setInputFiles(file);
	await page.getByTestId('mapping-form').waitFor();
	await page.getByRole('button', { name: 'Check the rows' }).click();
	await page.getByTestId('preview-report').waitFor();
	await page.getByRole('button', { name: `Import ${rows} sites`, exact: true }).click();
	await page.getByText(`Imported ${rows} sites.`).waitFor({ timeout: 30_000 });
	await page.getByRole('link', { name: 'Open the dataset' }).click();
	await page.waitForURL(datasetUrl);
}

/** A day `days` after today (UTC), as YYYY-MM-DD. */
const dayFromNow = (days: number) =>
	new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

describe('curation journey: upload, publish, share, correct under embargo, release', () => {
	it('goes through the UI with an e-mail at each step', async () => {
		const contributor = await signedIn(browser, CONTRIBUTOR);
		const c = contributor.page;
		const curator = await signedIn(browser, CURATOR);
		const k = curator.page;
		const outsider = await signedIn(browser, OUTSIDER);
		const o = outsider.page;

		// 1. The contributor creates a restricted draft and imports two sites.
		await c.goto(`${appUrl()}/datasets/new`);
		await c
			.getByLabel('Organisation', { exact: true })
			.selectOption({ label: 'Korvald Geological Survey' });
		await c.getByLabel('Title', { exact: true }).fill(title);
		await c.getByLabel('Authors (optional)').fill('Invented, A.');
		await c.getByLabel('Licence', { exact: true }).selectOption('CC-BY-4.0');
		await c.getByLabel('Who may see it once published').selectOption('restricted');
		await c.getByRole('button', { name: 'Create draft' }).click();
		await c.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
		const v1Url = c.url();
		const v1Id = v1Url.split('/').pop()!;
		await importCsv(c, path.join(dir, 'first.csv'), 2);
		await expect(c.getByTestId('sites-table').textContent()).resolves.toContain(`CJ-A-${run}`);

		// 2. Submitted; the curator is told and publishes; the contributor is told.
		await c.getByRole('button', { name: 'Submit for review' }).click();
		await c.getByText('Submitted for review. The curators have been told.').waitFor();
		await screenshot(c, 'journey-1-submitted');
		const submitted = await waitForMailAbout(CURATOR, `"${title}" was submitted`, v1Url);
		await k.goto(firstLink(submitted.text));
		await k.getByRole('button', { name: 'Publish' }).click();
		await k.getByText('Published.', { exact: true }).waitFor();
		await expect(status(k)).resolves.toBe('Published');
		await waitForMailAbout(CONTRIBUTOR, `"${title}" was published`, v1Url);

		// 3. An outsider finds it in the list and on the organisation's page, without its values,
		// and asks for access.
		await o.goto(`${appUrl()}/datasets`);
		const listed = o.getByTestId('catalogue-entries');
		await listed.getByRole('link', { name: title }).waitFor();
		await o.goto(`${appUrl()}/organisations/korvald-survey`);
		await o.getByTestId('catalogue-entries').getByRole('link', { name: title }).click();
		await o.waitForURL(new RegExp(`/datasets/${v1Id}/about$`));
		await expect(o.getByText(`CJ-A-${run}`).count()).resolves.toBe(0);
		await o
			.getByLabel('What do you want to use the data for?')
			.fill('An invented regional compilation of oceanic heat flow.');
		await o.getByRole('button', { name: 'Ask for access' }).click();
		await o.getByText('Your request has been sent. The curators have been told.').waitFor();
		await screenshot(o, 'journey-2-requested');

		// 4. The curator approves from the mail's link; the outsider is told, sees and downloads.
		const asked = await waitForMailAbout(CURATOR, `Access requested to "${title}"`, v1Id);
		expect(asked.text).toContain('oceanic heat flow');
		await k.goto(firstLink(asked.text));
		await k.getByRole('button', { name: 'Approve' }).click();
		await k.getByText(/^Approved: .* now has access and has been told\.$/).waitFor();
		const granted = await waitForMailAbout(OUTSIDER, `Access granted to "${title}"`, v1Id);
		await o.goto(firstLink(granted.text));
		await o.waitForURL(new RegExp(`/datasets/${v1Id}$`));
		await expect(o.getByTestId('sites-table').textContent()).resolves.toContain(`CJ-A-${run}`);
		const [download] = await Promise.all([
			o.waitForEvent('download'),
			o.getByRole('link', { name: 'CSV', exact: true }).click()
		]);
		const csv = fs.readFileSync((await download.path())!, 'utf8');
		expect(csv).toContain(`Invented, A. (`);
		expect(csv).toContain(`${title}, version 1 [data set]`);
		expect(csv).toContain('CC-BY-4.0');
		expect(csv).toContain(`CJ-A-${run}`);
		expect(csv).toContain('71.25');
		await screenshot(o, 'journey-3-granted');

		// 5. The contributor corrects it as version 2: one more site, and the new version under
		// embargo (the published version 1 stays restricted, as it was published).
		const release = dayFromNow(7);
		await c.goto(v1Url);
		await c.getByRole('button', { name: 'Correct this dataset' }).click();
		await c.waitForURL(/\/datasets\/[0-9a-f-]{36}\?correcting=new$/);
		const v2Url = c.url().split('?')[0];
		const v2Id = v2Url.split('/').pop()!;
		await importCsv(c, path.join(dir, 'correction.csv'), 1);
		await c.getByLabel('Who may see it once published').selectOption('embargoed');
		await c.getByLabel('Embargo until').fill(release);
		await c.getByRole('button', { name: 'Save metadata' }).click();
		await c.getByText('Saved.', { exact: true }).waitFor();
		await expect(c.getByTestId('visibility-change').textContent()).resolves.toMatch(
			new RegExp(`this version is embargoed until ${release}\\. Version 1 stays restricted`)
		);
		await c.getByRole('button', { name: 'Submit for review' }).click();
		await c.getByText('Submitted for review. The curators have been told.').waitFor();

		// 6. The curator reads the diff (from the mail's link) and publishes version 2.
		const resubmitted = await waitForMailAbout(CURATOR, `"${title}" was submitted`, v2Url);
		await k.goto(firstLink(resubmitted.text));
		await expect(k.getByTestId('diff-summary').textContent()).resolves.toMatch(
			/1 added · 0 removed · 0 changed ·\s*2 unchanged/
		);
		await expect(k.getByTestId('diff-added').textContent()).resolves.toBe(`CJ-C-${run}`);
		await screenshot(k, 'journey-4-diff');
		await k.getByRole('button', { name: 'Publish' }).click();
		await k.getByText('Published.', { exact: true }).waitFor();
		await waitForMailAbout(CONTRIBUTOR, `"${title}" was published`, v2Url);
		await k.goto(v1Url);
		await expect(status(k)).resolves.toBe('Superseded');

		// 7. Under embargo the outsider (granted version 1 only) gets version 2's summary.
		await o.goto(v2Url);
		await o.waitForURL(new RegExp(`/datasets/${v2Id}/about$`));
		await expect(o.getByTestId('dataset-audience').textContent()).resolves.toContain(
			`Under embargo until ${release}`
		);
		await expect(o.getByText(`CJ-C-${run}`).count()).resolves.toBe(0);
		await screenshot(o, 'journey-5-embargoed');

		// 8. The release day comes: the job, run with its clock on that day, releases version 2 and
		// mails its creator through the same catcher.
		const transport = createMailTransport({ url: smtpUrl });
		const released = await runEmbargoRelease(
			db,
			new Date(`${release}T00:02:00Z`),
			async (m) => void (await transport.sendMail({ from: 'thermalith@example.org', ...m })),
			appUrl()
		);
		expect(released).toContain(v2Id);
		await waitForMailAbout(CONTRIBUTOR, `"${title}" is now public`, v2Url);
		await o.goto(v2Url);
		await expect(o.getByTestId('sites-table').textContent()).resolves.toContain(`CJ-C-${run}`);
		await expect(o.getByTestId('sites-table').textContent()).resolves.toContain('83.4');
		await screenshot(o, 'journey-6-released');

		expect(contributor.errors).toEqual([]);
		expect(curator.errors).toEqual([]);
		expect(outsider.errors).toEqual([]);
	});
});
