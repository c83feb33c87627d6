import { readFile } from 'node:fs/promises';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, watchForErrors } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

describe('heat-flow grid on the map', () => {
	it('grids the view by kriging: progress, overlay with legend, σ, variogram, download', async () => {
		const context = await browser.newContext({
			viewport: { width: 1100, height: 800 },
			acceptDownloads: true
		});
		const page = await context.newPage();
		const errors = watchForErrors(page);
		await page.goto(`${appUrl()}/map`, { waitUntil: 'networkidle' });
		const map = page.getByTestId('map');
		await expect
			.poll(async () => Number(await map.getAttribute('data-sites')), { timeout: 15_000 })
			.toBeGreaterThan(3);
		// One step closer, as a user would, so the view is a region rather than half a continent.
		await page.getByRole('button', { name: 'Zoom in' }).click();
		await expect.poll(() => map.getAttribute('data-bounds'), { timeout: 10_000 }).not.toBeNull();

		await page.getByRole('button', { name: 'Heat-flow grid…' }).click();
		const panel = page.getByTestId('grid-panel');
		await expect(panel.textContent()).resolves.toMatch(/model estimate/i);
		await panel.getByLabel('Method').selectOption('kriging');
		await panel.getByLabel('Cell size (km)').fill('4');
		await panel.getByLabel('Mask beyond (km)').fill('80');
		await panel.getByRole('button', { name: 'Compute grid for this view' }).click();

		// Progress or, on a quick machine, already the result: whichever the user sees first.
		const progress = page.getByTestId('grid-progress');
		const result = page.getByTestId('grid-result');
		await progress.or(result).first().waitFor({ timeout: 30_000 });
		if (await progress.isVisible()) await screenshot(page, 'grid-progress');
		await result.waitFor({ timeout: 60_000 });
		await expect
			.poll(() => map.getAttribute('data-grid-overlay'), { timeout: 15_000 })
			.toBe('value');
		expect(await page.locator('.leaflet-grid-pane img').count()).toBe(1);
		await expect(page.getByTestId('grid-legend').textContent()).resolves.toContain(
			'Estimated surface heat flow'
		);
		await expect(page.getByTestId('grid-crossval').textContent()).resolves.toMatch(/RMSE \d/);
		await screenshot(page, 'grid-overlay');

		await page.getByTestId('sigma-toggle').check();
		await expect
			.poll(() => map.getAttribute('data-grid-overlay'), { timeout: 15_000 })
			.toBe('sigma');
		await expect(page.getByTestId('grid-legend').textContent()).resolves.toContain(
			'standard error'
		);
		await screenshot(page, 'grid-sigma');

		await panel.getByRole('button', { name: 'Variogram' }).click();
		const variogram = page.getByTestId('variogram-panel');
		await variogram.waitFor();
		expect(await variogram.locator('circle').count()).toBeGreaterThan(2);
		expect(await variogram.locator('polyline').count()).toBe(1);
		await expect(variogram.textContent()).resolves.toMatch(/counted twice/);
		await variogram.scrollIntoViewIfNeeded();
		await screenshot(page, 'grid-variogram');

		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByTestId('grid-downloads').getByRole('link', { name: 'GeoTIFF', exact: true }).click()
		]);
		expect(download.suggestedFilename()).toMatch(/heat-flow\.tif$/);
		const bytes = await readFile((await download.path())!);
		expect(bytes.subarray(0, 2).toString()).toBe('MM'); // a big-endian TIFF
		expect(errors).toEqual([]);
		await context.close();
	});
	it('grids a drawn rectangle by IDW: contour lines on the map and the region statistics', async () => {
		const context = await browser.newContext({ viewport: { width: 1100, height: 800 } });
		const page = await context.newPage();
		const errors = watchForErrors(page);
		await page.goto(`${appUrl()}/map`, { waitUntil: 'networkidle' });
		const map = page.getByTestId('map');
		await expect
			.poll(async () => Number(await map.getAttribute('data-sites')), { timeout: 15_000 })
			.toBeGreaterThan(3);
		await page.getByRole('button', { name: 'Zoom in' }).click();
		await expect.poll(() => map.getAttribute('data-bounds'), { timeout: 10_000 }).not.toBeNull();

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
