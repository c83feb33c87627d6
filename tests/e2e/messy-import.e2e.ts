import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, signIn, watchForErrors } from './browser';

let browser: Browser;
let tmp: string;
beforeAll(async () => {
	browser = await launch();
	tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'thermalith-messy-'));
});
afterAll(async () => {
	await browser?.close();
	if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

/**
 * A contributor's own spreadsheet (invented): a byte-order mark, semicolons and decimal commas,
 * UTM zone 32 easting/northing, heat flow in HFU, and header names of its own. Row 3 lies 40 m
 * north of row 2; row 4 has no usable gradient; row 5 holds an overflowing number; row 6 has an
 * implausible 586 mW/m² (14 HFU × 41.84; NIST SP 811).
 */
const MESSY =
	'\uFEFFWell ID;Locality;Easting (m);Northing_m;q (HFU);dT/dz (K/km);λ (W/m/K);Method;Year\n' +
	'LV-01;Lervik north;500000;6600000;1,60;23,9;2,8;Bullard;1998\n' +
	'LV-02;Lervik north 2;500000;6600040;1,62;24,2;2,8;Bullard;1999\n' +
	'LV-03;Hagen;503000;6604000;1,55;n/a;2,8;Bullard;2003\n' +
	'LV-04;Brattli;507000;6608000;1e999;22,0;2,9;Bullard;2004\n' +
	'LV-05;Kvernhus;511000;6612000;14,0;209;2,8;Bullard;2005\n' +
	'LV-06;Solbakk;515000;6616000;1,70;25,4;2,8;Bullard;2007\n';

const countOf = async (page: Page, testId: string) =>
	Number((await page.getByTestId(testId).textContent())?.trim());

const selectedLabel = (page: Page, label: string) =>
	page.getByLabel(label, { exact: true }).evaluate((el) => {
		const s = el as HTMLSelectElement;
		return s.selectedOptions[0]?.textContent?.trim() ?? '';
	});

describe('the messy-spreadsheet journey', () => {
	it('reads a contributor’s own file, fixes one row and leaves one out in the preview, and imports exactly the rest', async () => {
		const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
		const page = await context.newPage();
		const errors = watchForErrors(page);
		const file = path.join(tmp, 'lervik-boreholes.csv');
		fs.writeFileSync(file, MESSY, 'utf8');

		await signIn(page, 'contributor@korvald-survey.example');

		await page.goto(`${appUrl()}/datasets/new`);
		await page
			.getByLabel('Organisation', { exact: true })
			.selectOption({ label: 'Korvald Geological Survey' });
		await page.getByLabel('Title', { exact: true }).fill(`Lervik boreholes (e2e ${Date.now()})`);
		await page.getByLabel('Licence', { exact: true }).selectOption('CC-BY-4.0');
		await page.getByRole('button', { name: 'Create draft' }).click();
		await page.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
		const datasetUrl = page.url();

		await page.getByRole('link', { name: 'Import sites from a file' }).click();
		await page.getByLabel('A spreadsheet (CSV, XLSX) or GeoJSON file of sites').setInputFiles(file);
		await page.getByTestId('mapping-form').waitFor();
		await page.getByText('6 rows, 9 columns (csv, delimiter “;”)').waitFor();
		// The file's own headers, slashes, brackets and symbols included, are recognised.
		await expect(selectedLabel(page, 'Temperature gradient')).resolves.toBe('dT/dz (K/km)');
		await expect(selectedLabel(page, 'Thermal conductivity')).resolves.toBe('λ (W/m/K)');
		await expect(selectedLabel(page, 'Northing / y')).resolves.toBe('Northing_m');
		await expect(page.locator('#unit-heatFlow').inputValue()).resolves.toBe('HFU');
		const crsSelect = page.getByLabel('Coordinate system', { exact: true });
		await page.getByLabel('Coordinate system of the x / y columns').fill('25832');
		await expect.poll(() => crsSelect.locator('option[value="25832"]').count()).toBeGreaterThan(0);
		await crsSelect.selectOption('25832');
		await page.getByRole('button', { name: 'Check the rows' }).click();
		await page.getByTestId('preview-report').waitFor();

		// Two rows are not stored; each message names row and site; the near pair is named.
		expect(await countOf(page, 'blocked-count')).toBe(2);
		expect(await countOf(page, 'valid-count')).toBe(4);
		const issues = page.getByTestId('issues');
		await expect(issues.textContent()).resolves.toContain(
			'Row 4 (site LV-03), column "dT/dz (K/km)": "n/a" is not a number'
		);
		await expect(issues.textContent()).resolves.toContain(
			'Row 5 (site LV-04), column "q (HFU)": "1e999" is not a finite number'
		);
		await expect(issues.textContent()).resolves.toContain(
			'Row 3 (site LV-02) is 40 m from row 2 (site LV-01) of this file'
		);
		await expect(page.getByTestId('preview-row-4').textContent()).resolves.toContain('not stored');
		// Readable values: product labels with units, rounded, lat/lon and as entered.
		const header = await page.getByTestId('preview-rows').locator('thead').textContent();
		expect(header).toContain('Heat flow (mW/m²)');
		expect(header).toContain('Latitude (°)');
		const first = await page.getByTestId('preview-row-2').textContent();
		expect(first).toContain('66.9'); // 1.60 HFU = 66.944 mW/m²
		expect(first).toContain('500000 / 6600000 (EPSG:25832)');
		const importButton = page.getByRole('button', { name: /^Import \d+ sites$/ });
		await expect(importButton.isDisabled()).resolves.toBe(true);
		await screenshot(page, 'messy-import-preview');

		// Fix row 4's gradient in place, leave row 5 out, and check again.
		await page.getByTestId('fix-row-4').getByLabel('Row 4, dT/dz (K/km)').fill('23,1');
		await page.getByTestId('fix-row-5').getByLabel('Leave row 5 out').check();
		await page.getByRole('button', { name: 'Apply the fixes and check again' }).click();
		await expect.poll(() => countOf(page, 'blocked-count'), { timeout: 30_000 }).toBe(0);
		expect(await countOf(page, 'excluded-count')).toBe(1);
		expect(await countOf(page, 'valid-count')).toBe(5);
		await screenshot(page, 'messy-import-fixed');

		const importNow = page.getByRole('button', { name: 'Import 5 sites', exact: true });
		await expect(importNow.isEnabled()).resolves.toBe(true);
		await importNow.click();
		await page.getByText('Imported 5 sites.').waitFor({ timeout: 60_000 });
		await page.getByRole('link', { name: 'Open the dataset' }).click();
		await page.waitForURL(datasetUrl);
		const table = page.getByTestId('sites-table');
		await table.waitFor();
		const listed = (await table.locator('tbody tr td:first-child a').allTextContents()).map((c) =>
			c.trim()
		);
		expect(listed.sort()).toEqual(['LV-01', 'LV-02', 'LV-03', 'LV-05', 'LV-06']);

		// The implausible value was imported on purpose, and the site says it was flagged.
		await table.getByRole('link', { name: 'LV-05', exact: true }).click();
		await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
		await expect(page.getByTestId('site-flags').textContent()).resolves.toContain(
			'Heat flow above the plausible range'
		);
		await screenshot(page, 'messy-import-flagged-site');
		expect(errors).toEqual([]);
		await context.close();
	}, 180_000);
});
