import { readFile } from 'node:fs/promises';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from './axe';
import { appUrl, launch, screenshot, watchForErrors } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

/** The map page with its sites drawn, one step closer than the start, as a user would look. */
async function openMap(page: Page) {
	await page.goto(`${appUrl()}/map`, { waitUntil: 'networkidle' });
	const map = page.getByTestId('map');
	await expect
		.poll(async () => Number(await map.getAttribute('data-sites')), { timeout: 15_000 })
		.toBeGreaterThan(3);
	await page.getByRole('button', { name: 'Zoom in' }).click();
	await expect.poll(() => map.getAttribute('data-bounds'), { timeout: 10_000 }).not.toBeNull();
	return map;
}

/** Click corners on the map (fractions of its box), then the first again to close the polygon. */
async function drawPolygon(page: Page, corners: [number, number][]) {
	const box = (await page.getByTestId('map').boundingBox())!;
	for (const [fx, fy] of [...corners, corners[0]])
		await page.mouse.click(box.x + box.width * fx, box.y + box.height * fy);
}

/** The overlay on the map once its image has loaded, and the image's address. */
async function overlayShown(page: Page, kind: string) {
	const map = page.getByTestId('map');
	await expect.poll(() => map.getAttribute('data-grid-overlay'), { timeout: 20_000 }).toBe(kind);
	const images = page.locator('.leaflet-grid-pane img');
	expect(await images.count()).toBe(1);
	return (await images.getAttribute('src'))!;
}

describe('heat-flow grid on the map', () => {
	// Two grids (the second with an edited variogram), four overlays and a download: a longer
	// timeout than the default, for a loaded machine.
	it('grids a drawn polygon by kriging: progress, overlays with legends (σ, isotherm depth, temperature at depth), variogram, download', async () => {
		const context = await browser.newContext({
			viewport: { width: 1280, height: 800 },
			acceptDownloads: true,
			bypassCSP: true
		});
		const page = await context.newPage();
		const errors = watchForErrors(page);
		await openMap(page);

		await page.getByRole('button', { name: 'Heat-flow grid…' }).click();
		const panel = page.getByTestId('grid-panel');
		await expect(panel.textContent()).resolves.toMatch(/model estimate/i);

		// A polygon whose edges cross (drawn with the region tool, which allows it) is refused by
		// the grid panel with a sentence; the current view stays the region.
		await page.getByTestId('draw-polygon').click();
		await drawPolygon(page, [
			[0.5, 0.1],
			[0.95, 0.8],
			[0.95, 0.1],
			[0.5, 0.8]
		]);
		await expect(panel.getByTestId('grid-draw-message').textContent()).resolves.toMatch(
			/crosses itself/
		);
		expect(await panel.getByTestId('grid-region-drawn').isDisabled()).toBe(true);

		// The grid panel's own polygon: four corners right of the panel.
		await panel.getByTestId('grid-draw-polygon').click();
		await drawPolygon(page, [
			[0.5, 0.08],
			[0.97, 0.1],
			[0.95, 0.85],
			[0.55, 0.8]
		]);
		await expect.poll(() => panel.getByTestId('grid-region-drawn').isChecked()).toBe(true);
		await expect(panel.getByTestId('grid-region').textContent()).resolves.toMatch(
			/drawn polygon \(4 corners/
		);
		await expect(panel.getByTestId('grid-draw-message').count()).resolves.toBe(0);

		await panel.getByLabel('Method').selectOption('kriging');
		await panel.getByLabel('Cell size (km)').fill('4');
		await panel.getByLabel('Mask beyond (km)').fill('80');
		await panel.getByRole('button', { name: 'Compute grid for the drawn polygon' }).click();

		// Progress or, on a quick machine, already the result: whichever the user sees first.
		const progress = page.getByTestId('grid-progress');
		const result = page.getByTestId('grid-result');
		await progress.or(result).first().waitFor({ timeout: 30_000 });
		if (await progress.isVisible()) await screenshot(page, 'grid-progress-1280');
		await result.waitFor({ timeout: 60_000 });
		expect(await overlayShown(page, 'value')).toMatch(/heat-flow\.png$/);
		const legend = page.getByTestId('grid-legend');
		await expect(legend.textContent()).resolves.toContain('Estimated surface heat flow (mW/m²)');
		await expect(page.getByTestId('grid-crossval').textContent()).resolves.toMatch(/RMSE \d/);

		// The statistics are the polygon's, not its box's.
		const stats = page.getByTestId('grid-region-stats');
		await expect
			.poll(() => stats.getByTestId('grid-region-mean').isVisible(), { timeout: 15_000 })
			.toBe(true);
		expect(JSON.parse((await stats.getAttribute('data-polygon'))!)).toHaveLength(5);
		await expect(stats.textContent()).resolves.toContain('In the drawn polygon');
		await legend.scrollIntoViewIfNeeded();
		await screenshot(page, 'grid-overlay-1280');

		await page.getByTestId('sigma-toggle').check();
		expect(await overlayShown(page, 'sigma')).toMatch(/sigma\.png$/);
		await expect(legend.textContent()).resolves.toContain('Kriging standard error σ (mW/m²)');
		await legend.scrollIntoViewIfNeeded();
		await screenshot(page, 'grid-sigma-1280');

		// The depth of 150 °C: its own legend in km with the not-reached class, and what it assumes.
		await page.getByTestId('overlay-isotherm-depth').check();
		expect(await overlayShown(page, 'isotherm-depth')).toMatch(
			/isotherm-depth\.png\?temperatureC=150&band=p50$/
		);
		const depthLegend = await legend.textContent();
		expect(depthLegend).toContain('Depth of 150 °C (km), P50 (median)');
		expect(depthLegend).toContain('2.8–3.5 km');
		expect(depthLegend).toContain('not reached within the 35 km crust');
		expect(depthLegend).toMatch(/viridis/);
		await expect(page.getByTestId('grid-legend-assumptions').textContent()).resolves.toMatch(
			/Model estimate\..*three-layer/
		);
		await legend.scrollIntoViewIfNeeded();
		await screenshot(page, 'grid-isotherm-depth-1280');

		// A bad isotherm is named and the drawn overlay stays; a good one redraws, as does P90.
		const isotherm = panel.getByLabel('Isotherm (°C)');
		await isotherm.fill('5');
		await isotherm.press('Tab');
		await expect(panel.getByRole('alert').textContent()).resolves.toContain(
			'Choose an isotherm from 20 to 1000 °C.'
		);
		expect(await page.locator('.leaflet-grid-pane img').getAttribute('src')).toMatch(
			/temperatureC=150/
		);
		await isotherm.fill('120');
		await isotherm.press('Tab');
		await panel.getByLabel('Percentile').selectOption('p90');
		await expect
			.poll(() => page.locator('.leaflet-grid-pane img').getAttribute('src'), { timeout: 15_000 })
			.toMatch(/temperatureC=120&band=p90$/);
		await overlayShown(page, 'isotherm-depth');
		await expect(legend.textContent()).resolves.toContain('Depth of 120 °C (km), P90');
		await expect(stats.getByTestId('grid-region-depth').textContent()).resolves.toMatch(/\d km/);
		await expect(stats.textContent()).resolves.toContain('Depth of 120 °C');

		// Another crustal model redraws the at-depth overlay in it and says what it assumes.
		await panel.getByTestId('grid-crust').selectOption('basin');
		await expect
			.poll(() => page.locator('.leaflet-grid-pane img').getAttribute('src'), { timeout: 15_000 })
			.toMatch(/temperatureC=120&band=p90&crust=basin$/);
		await overlayShown(page, 'isotherm-depth');
		await expect(page.getByTestId('grid-legend-assumptions').textContent()).resolves.toMatch(
			/Model estimate\..*Sedimentary basin/
		);
		await panel.getByTestId('grid-crust').selectOption('continental');
		await expect
			.poll(() => page.locator('.leaflet-grid-pane img').getAttribute('src'), { timeout: 15_000 })
			.toMatch(/temperatureC=120&band=p90$/);
		await overlayShown(page, 'isotherm-depth');

		await page.getByTestId('overlay-temperature-at-depth').check();
		expect(await overlayShown(page, 'temperature-at-depth')).toMatch(
			/temperature-at-depth\.png\?depthM=3000&band=p90$/
		);
		await expect(legend.textContent()).resolves.toContain('Temperature at 3 km (°C), P90');
		await expect(legend.textContent()).resolves.toContain('100–115 °C');
		expect(await seriousViolations(page, '[data-testid=grid-panel]')).toEqual([]);

		await panel.getByRole('button', { name: 'Variogram' }).click();
		const variogram = page.getByTestId('variogram-panel');
		await variogram.waitFor();
		expect(await variogram.locator('circle').count()).toBeGreaterThan(2);
		expect(await variogram.locator('polyline').count()).toBe(1);
		await expect(variogram.textContent()).resolves.toMatch(/counted twice/);
		await variogram.scrollIntoViewIfNeeded();
		await screenshot(page, 'grid-variogram-1280');

		// A nugget above the sill is refused beside the variogram form; a good variogram recomputes
		// the same grid through a new job, and the panel says whose variogram it is.
		await variogram.getByLabel('Nugget', { exact: true }).fill('500');
		await variogram.getByLabel('Sill', { exact: true }).fill('100');
		await variogram.getByRole('button', { name: 'Recompute with this variogram' }).click();
		await expect(variogram.getByTestId('variogram-message').textContent()).resolves.toMatch(
			/greater than the nugget/
		);
		await variogram.locator('select[name=model]').selectOption('spherical');
		await variogram.getByLabel('Nugget', { exact: true }).fill('10');
		await variogram.getByLabel('Sill', { exact: true }).fill('150');
		await variogram.getByRole('button', { name: 'Recompute with this variogram' }).click();
		await expect
			.poll(() => variogram.textContent(), { timeout: 60_000 })
			.toMatch(/Entered by you: spherical, nugget 10\.0,\s*sill\s*150\.0/);
		await overlayShown(page, 'temperature-at-depth');

		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByTestId('grid-downloads').getByRole('link', { name: 'GeoTIFF', exact: true }).click()
		]);
		expect(download.suggestedFilename()).toMatch(/heat-flow\.tif$/);
		const bytes = await readFile((await download.path())!);
		expect(bytes.subarray(0, 2).toString()).toBe('MM'); // a big-endian TIFF
		// The at-depth downloads follow the chosen isotherm.
		expect(
			await page
				.getByTestId('grid-downloads')
				.getByRole('link', { name: 'Depth of 120 °C (P10–P90)' })
				.getAttribute('href')
		).toMatch(/isotherm-depth\.tif\?temperatureC=120$/);
		// The refused variogram's 400 (and the browser's console line for it) were expected; so is a
		// refusal of the crossing polygon by the region tool's own route, should it refuse one.
		const expected = [
			/^HTTP 400 .*\/api\/v1\/grids$/,
			/^console: Failed to load resource: .* 400 \(Bad Request\)$/,
			/^HTTP 400 .*\/api\/v1\/map\/region/
		];
		expect(errors.some((e) => expected[0].test(e))).toBe(true);
		expect(errors.filter((e) => !expected.some((x) => x.test(e)))).toEqual([]);
		await context.close();
	}, 150_000);

	it('fits a 390 px phone: the view gridded, the isotherm-depth overlay and its legend, no sideways scroll', async () => {
		const context = await browser.newContext({
			viewport: { width: 390, height: 844 },
			bypassCSP: true
		});
		const page = await context.newPage();
		const errors = watchForErrors(page);
		await openMap(page);
		await page.getByRole('button', { name: 'Heat-flow grid…' }).click();
		const panel = page.getByTestId('grid-panel');
		await panel.getByLabel('Cell size (km)').fill('5');
		await panel.getByRole('button', { name: 'Compute grid for this view' }).click();
		await page.getByTestId('grid-result').waitFor({ timeout: 60_000 });
		await overlayShown(page, 'value');
		await page.getByTestId('overlay-isotherm-depth').check();
		await overlayShown(page, 'isotherm-depth');
		await expect(page.getByTestId('grid-legend').textContent()).resolves.toContain(
			'Depth of 150 °C (km)'
		);
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
			390
		);
		expect(await seriousViolations(page, '[data-testid=grid-panel]')).toEqual([]);
		await page.getByTestId('grid-legend').scrollIntoViewIfNeeded();
		await screenshot(page, 'grid-isotherm-depth-390');
		expect(errors).toEqual([]);
		await context.close();
	});

	it('grids a drawn rectangle by IDW: contour lines on the map and the region statistics', async () => {
		const context = await browser.newContext({ viewport: { width: 1100, height: 800 } });
		const page = await context.newPage();
		const errors = watchForErrors(page);
		const map = await openMap(page);

		await page.getByRole('button', { name: 'Heat-flow grid…' }).click();
		const panel = page.getByTestId('grid-panel');
		await panel.getByTestId('grid-draw').click();
		// Corners right of the panel, clear of the legend and the status line.
		const box = (await map.boundingBox())!;
		await page.mouse.click(box.x + box.width * 0.5, box.y + box.height * 0.08);
		await page.mouse.move(box.x + box.width * 0.8, box.y + box.height * 0.5, { steps: 5 });
		await page.mouse.click(box.x + box.width * 0.97, box.y + box.height * 0.85);
		// The rectangle becomes the grid's region, as the user sees in the panel.
		await expect.poll(() => panel.getByTestId('grid-region-drawn').isChecked()).toBe(true);

		await panel.getByLabel('Method').selectOption('idw');
		await panel.getByLabel('Cell size (km)').fill('4');
		await panel.getByRole('button', { name: 'Compute grid for the drawn rectangle' }).click();
		const result = page.getByTestId('grid-result');
		await result.waitFor({ timeout: 60_000 });
		await expect
			.poll(() => map.getAttribute('data-grid-overlay'), { timeout: 15_000 })
			.toBe('value');

		// IDW has no σ: its overlay is offered but disabled, and at depth only P50 is drawn.
		expect(await page.getByTestId('sigma-toggle').isDisabled()).toBe(true);
		await expect(page.getByTestId('grid-no-variogram').textContent()).resolves.toMatch(
			/choose ordinary kriging/
		);
		await page.getByTestId('overlay-temperature-at-depth').check();
		expect(await overlayShown(page, 'temperature-at-depth')).toMatch(/band=p50$/);
		expect(await panel.getByLabel('Percentile').isDisabled()).toBe(true);
		await page.getByTestId('overlay-value').check();
		await overlayShown(page, 'value');

		await page.getByTestId('contours-toggle').check();
		await expect
			.poll(async () => Number(await map.getAttribute('data-grid-contours')), { timeout: 15_000 })
			.toBeGreaterThan(0);
		// Drawn in their own pane (SVG paths, or a canvas when the map prefers canvas).
		expect(
			await page.locator('.leaflet-grid-contours-pane').locator('path, canvas').count()
		).toBeGreaterThan(0);

		// The panel shows what the statistics route answers for the same grid and rectangle.
		const stats = page.getByTestId('grid-region-stats');
		await expect
			.poll(() => stats.getByTestId('grid-region-mean').isVisible(), { timeout: 15_000 })
			.toBe(true);
		const bbox = await stats.getAttribute('data-bbox');
		const gridId = await result.getAttribute('data-grid-id');
		expect(gridId).not.toBeNull();
		const cookies = await context.cookies();
		const api = await (
			await fetch(`${appUrl()}/api/v1/grids/${gridId}/statistics?bbox=${bbox}`, {
				headers: { cookie: cookies.map((c) => `${c.name}=${c.value}`).join('; ') }
			})
		).json();
		expect(api.heatFlowMWm2.mean).not.toBeNull();
		await expect
			.poll(() => stats.getByTestId('grid-region-mean').textContent())
			.toBe(`${api.heatFlowMWm2.mean.toFixed(1)} mW/m²`);
		await expect(stats.getByTestId('grid-region-percentiles').textContent()).resolves.toContain(
			`${api.heatFlowMWm2.p10.toFixed(1)} / ${api.heatFlowMWm2.p50.toFixed(1)} / ${api.heatFlowMWm2.p90.toFixed(1)}`
		);
		await expect(stats.getByTestId('grid-region-depth').textContent()).resolves.toMatch(/\d km/);
		await stats.scrollIntoViewIfNeeded();
		await screenshot(page, 'grid-region-contours-statistics');
		expect(errors).toEqual([]);
		await context.close();
	});
});
