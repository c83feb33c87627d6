import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, signIn, watchForErrors } from './browser';

let browser: Browser;
let tmp: string;
beforeAll(async () => {
	browser = await launch();
	tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'thermalith-uploads-'));
});
afterAll(async () => {
	await browser?.close();
	if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

const EXAMPLE = path.resolve('static/examples/korvald-boreholes-utm32.csv');
const contributor = {
	email: 'contributor@korvald-survey.example',
	password: 'korvald-demo-2026'
};

/**
 * The example file without the two rows the preview rejects. Spreadsheet row n is line n - 1 of
 * the file (the header is row 1); the rows are checked by their Borehole codes before dropping them.
 */
function writeCorrectedCopy(): { file: string; codes: string[] } {
	const lines = fs.readFileSync(EXAMPLE, 'utf8').split(/\r?\n/);
	expect(lines[6 - 1].split(';')[0]).toBe('KGS-005'); // Northing empty
	expect(lines[10 - 1].split(';')[0]).toBe('KGS-009'); // HF sigma -3,5
	const kept = lines.filter((_, i) => i + 1 !== 6 && i + 1 !== 10);
	const file = path.join(tmp, 'korvald-boreholes-utm32-corrected.csv');
	fs.writeFileSync(file, kept.join('\n'), 'utf8');
	const codes = kept
		.slice(1)
		.filter((l) => l.trim() !== '')
		.map((l) => l.split(';')[0]);
	return { file, codes };
}

/** On the mapping step: the x / y columns are projected metres, so pick EPSG:25832 for them. */
async function chooseUtm32(page: Page) {
	const crsSelect = page.getByLabel('Coordinate system', { exact: true });
	await page.getByLabel('Coordinate system of the x / y columns').fill('25832');
	await expect.poll(() => crsSelect.locator('option[value="25832"]').count()).toBeGreaterThan(0);
	await crsSelect.selectOption('25832');
	await expect(crsSelect.inputValue()).resolves.toBe('25832');
	// The reminder about degrees is shown only while EPSG:4326 is chosen.
	await expect
		.poll(() => page.getByText('Easting and northing columns are mapped').count())
		.toBe(0);
}

const selectedLabel = (page: Page, label: string) =>
	page.getByLabel(label, { exact: true }).evaluate((el) => {
		const s = el as HTMLSelectElement;
		return s.selectedOptions[0]?.textContent?.trim() ?? '';
	});

const countOf = async (page: Page, testId: string) =>
	Number((await page.getByTestId(testId).textContent())?.trim());

describe('uploading sites and files, as a contributor would do it', () => {
	it('creates a draft, imports the UTM example after fixing the mapping and the file, and attaches a core photo', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		const errors = watchForErrors(page);
		const corrected = writeCorrectedCopy();

		await signIn(page, contributor.email, contributor.password);

		// A new draft dataset.
		const title = `Korvald boreholes (e2e ${Date.now()})`;
		await page.goto(`${appUrl()}/datasets/new`);
		await page
			.getByLabel('Organisation', { exact: true })
			.selectOption({ label: 'Korvald Geological Survey' });
		await page.getByLabel('Title', { exact: true }).fill(title);
		await page.getByLabel('Licence', { exact: true }).selectOption('CC-BY-4.0');
		await page
			.getByLabel('Who may see it once published')
			.selectOption({ label: 'Only our organisation' });
		await page.getByRole('button', { name: 'Create draft' }).click();
		await page.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
		const datasetUrl = page.url();
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(title);
		await expect(page.getByTestId('dataset-status').textContent()).resolves.toBe('Draft');

		// The import wizard, with the example file as it is.
		await page.getByRole('link', { name: 'Import sites from a file' }).click();
		await page.waitForURL(/\/datasets\/[0-9a-f-]{36}\/import$/);
		await page
			.getByLabel('A spreadsheet (CSV, XLSX) or GeoJSON file of sites')
			.setInputFiles(EXAMPLE);
		await page.getByTestId('mapping-form').waitFor();
		await page.getByText('korvald-boreholes-utm32.csv', { exact: true }).waitFor();

		// Thermalith guessed the columns and units from the headers, but not the coordinate system.
		await expect(selectedLabel(page, 'Temperature gradient')).resolves.toBe('Gradient (°C/km)');
		await expect(selectedLabel(page, 'Unit of Temperature gradient')).resolves.toBe('°C/km');
		await expect(page.getByLabel('Coordinate system', { exact: true }).inputValue()).resolves.toBe(
			'4326'
		);
		await page.getByText('Easting and northing columns are mapped').waitFor();
		await chooseUtm32(page);
		await page.getByRole('button', { name: 'Check the rows' }).click();
		await page.getByTestId('preview-report').waitFor();

		// Two rows are wrong on purpose: nothing may be imported until they are fixed.
		expect(await countOf(page, 'error-count')).toBe(2);
		const issues = page.getByTestId('issues');
		const errorItems = issues.locator('li', { hasText: 'Error:' });
		await expect(errorItems.count()).resolves.toBe(2);
		await expect(errorItems.nth(0).textContent()).resolves.toMatch(
			/Row 6 \(site KGS-005\), column "Northing": empty .*coordinate is missing/
		);
		await expect(errorItems.nth(1).textContent()).resolves.toMatch(
			/Row 10 \(site KGS-009\), column "HF sigma \(mW\/m2\)": "-3,5" is negative/
		);
		const importButton = page.getByRole('button', { name: /^Import \d+ sites$/ });
		await expect(importButton.isDisabled()).resolves.toBe(true);
		await page.getByText('an import takes all the rows shown or none').waitFor();
		await screenshot(page, 'upload-preview-errors');

		// Back to the file step with the corrected copy.
		await page.getByRole('button', { name: 'Change the mapping' }).click();
		await page.getByTestId('mapping-form').waitFor();
		await page.getByRole('button', { name: 'Choose another file' }).click();
		await page
			.getByLabel('A spreadsheet (CSV, XLSX) or GeoJSON file of sites')
			.setInputFiles(corrected.file);
		await page.getByText('korvald-boreholes-utm32-corrected.csv', { exact: true }).waitFor();
		await chooseUtm32(page);
		await page.getByRole('button', { name: 'Check the rows' }).click();
		await page.getByTestId('preview-report').waitFor();

		expect(await countOf(page, 'error-count')).toBe(0);
		expect(await countOf(page, 'warning-count')).toBeGreaterThanOrEqual(1);
		// KGS-007 (14,2 µW/m³) was row 8 and is row 7 of the corrected copy.
		await expect(page.getByTestId('issues').textContent()).resolves.toMatch(
			/Warning:\s*Row 7 \(site KGS-007\), column "A \(µW\/m³\)": "14,2".*high even for granite/
		);
		const valid = await countOf(page, 'valid-count');
		expect(valid).toBe(corrected.codes.length);
		const importNow = page.getByRole('button', { name: `Import ${valid} sites`, exact: true });
		await expect(importNow.isEnabled()).resolves.toBe(true);
		await importNow.click();
		// The progress bar may come and go before it can be seen; the notice is what counts.
		await page.getByText(`Imported ${valid} sites.`).waitFor({ timeout: 30_000 });
		await page.getByRole('link', { name: 'Open the dataset' }).click();
		await page.waitForURL(datasetUrl);

		// The dataset lists exactly the imported sites.
		const table = page.getByTestId('sites-table');
		await table.waitFor();
		await expect(page.getByRole('heading', { name: `Sites (${valid})` }).count()).resolves.toBe(1);
		const listed = await table.locator('tbody tr td:first-child a').allTextContents();
		expect(listed.map((c) => c.trim()).sort()).toEqual([...corrected.codes].sort());
		expect(listed).not.toContain('KGS-005');
		expect(listed).not.toContain('KGS-009');

		// One site, as stored: decimal commas read, coordinates kept as entered and reprojected.
		await table.getByRole('link', { name: 'KGS-001', exact: true }).click();
		await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
		const values = page.getByTestId('site-values');
		const value = (label: string) => values.locator(`dt:text-is("${label}") + dd`).textContent();
		await expect(value('Heat flow')).resolves.toBe('67.4 ± 8.5 mW/m²');
		await expect(value('Gradient')).resolves.toBe('23.3 ± 1.0 K/km');
		await expect(value('As entered')).resolves.toBe('362529.3, 6521338.7 (EPSG:25832)');
		// KGS-001 was placed at 58.81° N, 6.62° E (see src/lib/imports/examples.spec.ts).
		const [lat, lon] = ((await value('Location (WGS 84)')) ?? '').match(/[\d.]+/g)!.map(Number);
		expect(lat).toBeCloseTo(58.81, 4);
		expect(lon).toBeCloseTo(6.62, 4);
		const geotherm = page.locator('section[aria-labelledby="geotherm-heading"]');
		await geotherm.getByRole('img').first().waitFor();
		expect(
			await geotherm
				.getByRole('img')
				.first()
				.evaluate((el) => el.tagName.toLowerCase())
		).toBe('svg');

		// A core photo: the browser sends it to the app, which checks and stores it; the thumbnail
		// comes back from the app too. The browser never talks to the object store.
		const photo = path.join(tmp, 'core-photo.png');
		fs.writeFileSync(
			photo,
			await sharp({
				create: { width: 640, height: 480, channels: 3, background: '#b45a16' }
			})
				.png()
				.toBuffer()
		);
		const appOrigin = new URL(appUrl()).origin;
		// As for a browser on another machine, the object store cannot be reached from here.
		const storeOrigin = new URL(process.env.S3_ENDPOINT ?? 'http://127.0.0.1:1').origin;
		await context.route(
			(url) => url.origin === storeOrigin,
			(route) => route.abort('addressunreachable')
		);
		const fileRequests: { method: string; url: string }[] = [];
		page.on('request', (r) => {
			if (['PUT', 'POST'].includes(r.method()) || /attachments|thumbnail/.test(r.url()))
				fileRequests.push({ method: r.method(), url: r.url() });
		});
		const thumbnailResponses: { status: number; type: string; url: string }[] = [];
		page.on('response', (r) => {
			if (/\/api\/v1\/attachments\/[^/]+\/thumbnail$/.test(new URL(r.url()).pathname))
				thumbnailResponses.push({
					status: r.status(),
					type: r.headers()['content-type'] ?? '',
					url: r.url()
				});
		});
		await page
			.getByLabel('Attach files (reports, logs, core photos; up to 50 MB each)')
			.setInputFiles(photo);
		const item = page.getByTestId('upload-item');
		await item.getByText('attached', { exact: true }).waitFor({ timeout: 30_000 });
		await expect(item.textContent()).resolves.toContain('core-photo.png');
		const thumbnail = page.locator('img[data-testid="thumbnail"]');
		await thumbnail.waitFor();
		await expect(thumbnail.getAttribute('alt')).resolves.toBe('Preview of core-photo.png');
		await expect
			.poll(
				() =>
					thumbnail.evaluate((img) => {
						const i = img as HTMLImageElement;
						return i.complete ? i.naturalWidth : -1;
					}),
				{ timeout: 15_000 }
			)
			.toBeGreaterThan(0);
		await expect(page.getByTestId('site-files').textContent()).resolves.toContain('image/png');
		// The bytes went to the app's own origin, and every file request stayed there.
		const puts = fileRequests.filter((r) => r.method === 'PUT');
		expect(puts).toHaveLength(1);
		expect(puts[0].url).toMatch(/\/api\/v1\/attachments\/[0-9a-f-]{36}\/content$/);
		for (const r of fileRequests) expect(new URL(r.url).origin).toBe(appOrigin);
		expect(thumbnailResponses.length).toBeGreaterThan(0);
		for (const r of thumbnailResponses) {
			expect(r.status).toBe(200);
			expect(r.type).toBe('image/webp');
			expect(new URL(r.url).origin).toBe(appOrigin);
		}
		await screenshot(page, 'site-with-thumbnail');

		expect(errors).toEqual([]);
		await context.close();
	});
});
