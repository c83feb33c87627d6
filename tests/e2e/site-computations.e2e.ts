import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import {
	conductivitySample,
	dataset,
	site,
	temperatureLog,
	type NewDataset
} from '../../src/lib/server/db/schema';
import { appUrl, launch, screenshot, signIn, watchForErrors } from './browser';

/*
 * A contributor on a site of their draft dataset: enters bottom-hole temperatures and sees the
 * Horner formation temperature and plot, computes heat production from U, Th and K, keeps a
 * log-derived heat flow as a revision and makes it current.
 */

const run = Date.now().toString(36);
const { db, client: sql } = createDb(process.env.DATABASE_URL ?? '', { max: 1 });
let browser: Browser;
let siteId = '';

beforeAll(async () => {
	browser = await launch();
	// Invented site: submitted 70 mW/m²; a log of 30 K/km and k = 2.0 ± 0.1 W/(m·K) give 60.
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: 'org-korvald-survey',
			title: `Site computations ${run}`,
			licence: 'CC-BY-4.0',
			status: 'draft',
			visibility: 'private'
		} as NewDataset)
		.returning({ id: dataset.id });
	const [s] = await db
		.insert(site)
		.values({
			datasetId: d.id,
			code: `E2E-SC-${run}`,
			location: { lon: 101.6, lat: -58.9 },
			heatFlowMWm2: 70,
			heatFlowSigmaMWm2: 7,
			method: 'other'
		})
		.returning({ id: site.id });
	siteId = s.id;
	const depthM = [100, 200, 300, 400, 500, 600];
	await db.insert(temperatureLog).values({
		siteId,
		name: 'E2E-log.csv',
		depthM,
		temperatureC: depthM.map((z, i) => 10 + 0.03 * z + (i % 2 ? 0.05 : -0.05))
	});
	await db
		.insert(conductivitySample)
		.values({ siteId, topM: 0, bottomM: 700, conductivityWmK: 2.0, sigmaWmK: 0.1 });
});

afterAll(async () => {
	await browser?.close();
	await sql.end();
});

describe('corrections, heat production and revisions on a site page', () => {
	it('BHT and heat-production entry, then choosing a log-derived revision', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		const errors = watchForErrors(page);
		await signIn(page, 'contributor@korvald-survey.example');
		await page.goto(`${appUrl()}/sites/${siteId}`);

		// Bottom-hole temperatures on T = 120 − 10 ln((4 + Δt)/Δt) (Horner 1951): T∞ = 120 °C.
		const bht = page.getByTestId('bht-form');
		await bht.getByLabel('Circulation time tc (h)').fill('4');
		for (const [i, dt] of [4, 8, 16].entries()) {
			await bht.getByLabel(`T${i + 1} (°C)`).fill((120 - 10 * Math.log((4 + dt) / dt)).toFixed(3));
			await bht.getByLabel(`Δt${i + 1} (h)`).fill(String(dt));
		}
		// The plot follows the readings while they are typed.
		await page.getByTestId('horner-point').nth(2).waitFor();
		await bht.getByRole('button', { name: 'Compute formation temperature' }).click();
		await page.getByText('Formation temperature 120.0 °C stored.').waitFor();
		await page
			.getByTestId('site-computations')
			.getByText(/Formation temperature 120\.0 ± 0\.0 °C from 3 readings/)
			.waitFor();
		await screenshot(page, 'site-bht-horner');

		// A reading left half-filled gets its message beside the field and nothing is stored.
		await bht.getByLabel('T1 (°C)').fill('95');
		await bht.getByRole('button', { name: 'Compute formation temperature' }).click();
		await bht.getByText('Enter the time since circulation (h).').waitFor();
		expect(await page.getByTestId('site-computations').locator(':scope > li').count()).toBe(1);

		// Heat production (Rybach 1988 check: 3 ppm U, 12 ppm Th, 3 % K, 2700 kg/m³ → 1.88 µW/m³).
		const hp = page.getByTestId('heat-production-form');
		await hp.getByLabel('Uranium (ppm)').fill('3');
		await hp.getByLabel('Thorium (ppm)').fill('12');
		await hp.getByLabel('Potassium (weight-%)').fill('3');
		await hp.getByLabel('Density (kg/m³)').fill('2700');
		await hp.getByRole('button', { name: 'Compute heat production' }).click();
		await page.getByText('Heat production 1.88 µW/m³ stored.').waitFor();
		// Shown as a model estimate with its assumptions and the caution.
		await page
			.getByText(
				/Formation temperatures, palaeoclimate corrections and heat production are estimates/
			)
			.waitFor();
		await page.getByText(/secular equilibrium of the decay series/).waitFor();
		await screenshot(page, 'site-heat-production');

		// Heat flow from the log, kept as a revision: the submitted value stays current.
		await page.getByLabel('keep as a revision of the site’s values').check();
		await page.getByRole('button', { name: 'Compute heat flow' }).click();
		await page.getByText(/kept as a new revision/).waitFor();
		const rows = page.getByTestId('revision-row');
		await expect.poll(() => rows.count()).toBe(2);
		expect(await rows.nth(0).getAttribute('data-current')).toBe('true');
		expect(await page.getByTestId('site-values').textContent()).toContain('70.0 ± 7.0 mW/m²');

		// Choose the computed revision: it becomes current and the site's values follow.
		await rows.nth(1).getByRole('button', { name: 'Make current' }).click();
		await page.getByText('The chosen revision is now current.').waitFor();
		await expect.poll(() => rows.nth(1).getAttribute('data-current')).toBe('true');
		await expect
			.poll(() => page.getByTestId('site-values').textContent())
			.toMatch(/60\.\d ± \d\.\d mW\/m²/);
		expect(await rows.nth(1).textContent()).toContain('Computed by');
		await screenshot(page, 'site-revisions-chosen');

		// Palaeoclimate: a 2 °C warming 10 000 years ago, applied to the log; the corrected log is
		// stored beside it and plotted with the measured one.
		const palaeo = page.getByTestId('palaeoclimate-form');
		await palaeo.getByLabel('Step 1 (°C)').fill('2');
		await palaeo.getByLabel('Years ago').first().fill('10000');
		await palaeo.getByRole('button', { name: 'Apply correction' }).click();
		await page
			.getByText(/Stored the corrected log “E2E-log\.csv \(palaeoclimate-corrected\)”/)
			.waitFor();
		await page.getByTestId('palaeo-corrected').waitFor();
		await screenshot(page, 'site-palaeoclimate');

		expect(errors.filter((e) => !e.startsWith('HTTP 400'))).toEqual([]);
		await context.close();
	});
});
