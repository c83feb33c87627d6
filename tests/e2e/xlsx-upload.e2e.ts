import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, signIn, watchForErrors } from './browser';

let browser: Browser;
let tmp: string;
beforeAll(async () => {
	browser = await launch();
	tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'thermalith-xlsx-'));
});
afterAll(async () => {
	await browser?.close();
	if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

/** An invented workbook with numeric cells, a formula and a text cell, as spreadsheets hold them. */
async function writeWorkbook(): Promise<string> {
	const wb = new ExcelJS.Workbook();
	const sheet = wb.addWorksheet('Boreholes');
	sheet.addRow(['Site', 'Latitude', 'Longitude', 'Heat flow (HFU)', 'HF error (HFU)', 'Method']);
	sheet.addRow(['XL-1', 59.12, 7.41, 1.5, 0.1, 'Bullard']);
	sheet.addRow(['XL-2', 59.3, 7.9, { formula: 'D2+0.25', result: 1.75 }, 0.12, 'interval']);
	const file = path.join(tmp, 'korvald-workbook.xlsx');
	await wb.xlsx.writeFile(file);
	return file;
}

describe('XLSX upload in the browser', () => {
	it('reads a workbook in the page, converts HFU and previews it without errors', async () => {
		const page = await browser.newPage();
		const errors = watchForErrors(page);
		await signIn(page, 'curator@korvald-survey.example');

		await page.goto(`${appUrl()}/datasets/new`);
		await page.getByLabel('Title').fill(`Workbook test ${Date.now()}`);
		await page.getByRole('button', { name: 'Create draft' }).click();
		await page.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
		await page.getByRole('link', { name: 'Import sites from a file' }).click();

		await page
			.getByLabel('A spreadsheet (CSV, XLSX) or GeoJSON file of sites')
			.setInputFiles(await writeWorkbook());
		await page.getByText('2 rows, 6 columns (xlsx').waitFor();
		// 1 HFU = 41.84 mW/m² (NIST SP 811, exact from 1 cal = 4.184 J; docs/science.md#units): the unit is read from the header.
		await expect(page.locator('#unit-heatFlow').inputValue()).resolves.toBe('HFU');
		await page.getByRole('button', { name: 'Check the rows' }).click();
		await expect(page.getByTestId('error-count').textContent()).resolves.toBe('0');
		const table = await page.getByTestId('preview-report').locator('table').textContent();
		expect(table).toContain('62.8'); // 1.5 HFU = 62.76 mW/m², shown to 0.1 mW/m²
		expect(table).toContain('73.2'); // the formula's 1.75 HFU = 73.22 mW/m²
		expect(errors).toEqual([]);
		await page.close();
	});
});
