import fs from 'node:fs';
import Papa from 'papaparse';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, watchForErrors } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

const attr = (page: Page, name: string) => page.getByTestId('map').getAttribute(name);

/** Wait until the map has drawn a view of this kind (cells or single sites). */
async function drawn(page: Page, kind: 'cells' | 'sites') {
	await expect.poll(() => attr(page, 'data-kind'), { timeout: 15_000 }).toBe(kind);
}

describe('the map at scale, in a browser', () => {
	it('zooms from cells to sites, filters, searches a code and reads a region', async () => {
		const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
		const errors = watchForErrors(page);
		await page.goto(`${appUrl()}/map`, { waitUntil: 'networkidle' });
		await drawn(page, 'sites');
		await expect
			.poll(async () => Number(await attr(page, 'data-sites')), { timeout: 15_000 })
			.toBeGreaterThan(10);
		await screenshot(page, 'map-scale-1280');

		// Zoom out with the keyboard as a user can: the view becomes cells, with the same sites.
		const before = Number(await attr(page, 'data-sites'));
		await page.getByTestId('map').focus();
		await page.keyboard.press('Minus');
		await drawn(page, 'cells');
		await expect
			.poll(async () => Number(await attr(page, 'data-sites')), { timeout: 15_000 })
			.toBeGreaterThanOrEqual(before);
		await page.keyboard.press('Equal');
		await drawn(page, 'sites');

		// A filter: in the URL, and the live count agrees with the API.
		await page.getByLabel('Minimum heat flow in mW/m²').fill('70');
		await page.getByLabel('Minimum heat flow in mW/m²').press('Tab');
		await page.waitForURL(/minHeatFlow=70/);
		const expected = (await (await fetch(`${appUrl()}/api/v1/map/count?minHeatFlow=70`)).json())
			.count as number;
		await expect
			.poll(() => page.getByTestId('matching-count').textContent(), { timeout: 10_000 })
			.toBe(expected.toLocaleString('en'));

		// An impossible range is named in the panel, and the map asks for nothing.
		await page.getByLabel('Maximum heat flow in mW/m²').fill('40');
		await page.getByLabel('Maximum heat flow in mW/m²').press('Tab');
		await page.waitForURL(/maxHeatFlow=40/);
		await expect
			.poll(() => page.getByTestId('filter-status').textContent())
			.toContain('the minimum heat flow is above the maximum');
		await expect
			.poll(() => page.getByTestId('map-status').textContent())
			.toContain('Fix the filters');
		await page.getByText('Clear filters').click();
		await page.waitForURL((u) => u.search === '');

		// Search a code: the map flies to the site and opens it.
		const hits = (await (await fetch(`${appUrl()}/api/v1/map/search?q=KGS`)).json()).sites as {
			code: string;
		}[];
		expect(hits.length).toBeGreaterThan(0);
		const code = hits[0].code;
		await page.getByTestId('site-search').fill(code.toLowerCase());
		await page.getByRole('button', { name: new RegExp(code) }).click();
		const panel = page.getByTestId('site-panel');
		await panel.waitFor({ timeout: 15_000 });
		await expect.poll(() => panel.textContent()).toContain(code);
		await page.getByLabel('Close site panel').click();

		// Zoom back out, draw a rectangle over most of the map, read its statistics.
		// One key press at a time, each waiting for the map to ask for its new view.
		await page.getByTestId('map').focus();
		for (let i = 0; i < 10 && (await attr(page, 'data-kind')) !== 'cells'; i++) {
			const shown = await attr(page, 'data-bounds');
			await page.keyboard.press('Minus');
			await expect.poll(() => attr(page, 'data-bounds'), { timeout: 15_000 }).not.toBe(shown);
		}
		await drawn(page, 'cells');
		await page.getByTestId('draw-region').click();
		const box = (await page.getByTestId('map').boundingBox())!;
		// Corners on open map, clear of the legend (bottom left) and the status (bottom right); the
		// rectangle holds the searched site, now in the middle of the map.
		await page.mouse.click(box.x + box.width * 0.4, box.y + box.height * 0.1);
		await page.mouse.move(box.x + box.width * 0.7, box.y + box.height * 0.6, { steps: 5 });
		await page.mouse.click(box.x + box.width * 0.9, box.y + box.height * 0.85);
		const stats = page.getByTestId('region-stats');
		await stats.waitFor({ timeout: 15_000 });
		const bbox = await stats.getAttribute('data-bbox');
		const region = await (await fetch(`${appUrl()}/api/v1/map/region?bbox=${bbox}`)).json();
		await expect
			.poll(() => page.getByTestId('region-count').textContent())
			.toBe(region.count.toLocaleString('en'));
		expect(region.count).toBeGreaterThan(0);
		await expect
			.poll(() => page.getByTestId('region-median').textContent())
			.toBe(`${region.medianMWm2.toFixed(1)} mW/m²`);
		await screenshot(page, 'map-scale-region-1280');

		// Download the region as CSV: every site counted, each dataset's citation block above them.
		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByTestId('region-download-csv').click()
		]);
		const csv = fs.readFileSync((await download.path())!, 'utf8');
		const lines = csv.trimEnd().split('\n');
		const comments = lines.filter((l) => l.startsWith('#'));
		expect(comments.some((l) => l.startsWith('# Cite as: '))).toBe(true);
		expect(comments.some((l) => l.startsWith('# Licence (SPDX): '))).toBe(true);
		const rows = Papa.parse(csv, { comments: '#', header: true, skipEmptyLines: true }).data;
		expect(rows.length).toBe(region.count);

		// A polygon instead: three corners, then the first again; its statistics are the API's.
		await page.getByTestId('draw-polygon').click();
		const corners = [
			[0.4, 0.15],
			[0.9, 0.2],
			[0.65, 0.8]
		];
		for (const [fx, fy] of [...corners, corners[0]]) {
			await page.mouse.click(box.x + box.width * fx, box.y + box.height * fy);
		}
		await expect
			.poll(() => stats.getAttribute('data-region'), { timeout: 15_000 })
			.toMatch(/^polygon=/);
		const param = (await stats.getAttribute('data-region'))!.slice('polygon='.length);
		const inPolygon = await (await fetch(`${appUrl()}/api/v1/map/region?polygon=${param}`)).json();
		await expect
			.poll(() => page.getByTestId('region-count').textContent(), { timeout: 15_000 })
			.toBe(inPolygon.count.toLocaleString('en'));
		await screenshot(page, 'map-scale-polygon-1280');
		expect(errors).toEqual([]);
		await page.close();
	});

	it('fits a 390 px phone: folded legend, filters in a drawer', async () => {
		const page = await browser.newPage({ viewport: { width: 390, height: 844 } });
		const errors = watchForErrors(page);
		await page.goto(`${appUrl()}/map`, { waitUntil: 'networkidle' });
		await drawn(page, 'sites');
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
			390
		);
		expect(await page.getByTestId('legend').getAttribute('open')).toBeNull();
		expect(await page.getByTestId('map-filters').isVisible()).toBe(false);
		await screenshot(page, 'map-scale-390');
		await page.getByTestId('open-filters').click();
		await page.getByTestId('map-filters').waitFor({ state: 'visible' });
		await screenshot(page, 'map-scale-390-filters');
		// The region tool by keyboard: the current view as the region.
		await page.getByTestId('region-view').focus();
		await page.keyboard.press('Enter');
		const stats = page.getByTestId('region-stats');
		await stats.waitFor({ timeout: 15_000 });
		const bbox = await stats.getAttribute('data-bbox');
		const region = await (await fetch(`${appUrl()}/api/v1/map/region?bbox=${bbox}`)).json();
		expect(region.count).toBeGreaterThan(0);
		await expect
			.poll(() => page.getByTestId('region-count').textContent())
			.toBe(region.count.toLocaleString('en'));
		await page.getByLabel('Close filters').click();
		await page.getByTestId('map-filters').waitFor({ state: 'hidden' });
		expect(errors).toEqual([]);
		await page.close();
	});
});
