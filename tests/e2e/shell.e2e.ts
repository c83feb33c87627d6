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

describe('landing page', () => {
	it('loads without console errors, says what the product is for and serves Lato itself', async () => {
		const page = await browser.newPage();
		const errors = watchForErrors(page);
		const fonts: string[] = [];
		page.on('response', (r) => {
			if (/lato.*\.woff2/i.test(r.url())) fonts.push(r.url());
		});
		await page.goto(appUrl(), { waitUntil: 'networkidle' });
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toMatch(
			/heat-flow/i
		);
		expect(Number(await page.getByTestId('count-sites').textContent())).toBeGreaterThan(0);
		expect(await page.evaluate(() => document.fonts.check('16px Lato'))).toBe(true);
		expect(fonts.length).toBeGreaterThan(0);
		for (const url of fonts) expect(url.startsWith(appUrl())).toBe(true);
		await screenshot(page, 'landing');
		expect(errors).toEqual([]);
		await page.close();
	});

	it('shows the error page with a safe message for an unknown address', async () => {
		const page = await browser.newPage();
		const res = await page.goto(`${appUrl()}/no-such-page`);
		expect(res?.status()).toBe(404);
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(
			'Page not found'
		);
		await page.close();
	});
});

describe('map page', () => {
	it('draws the offline basemap and the demo sites, and opens a site panel on click', async () => {
		const page = await browser.newPage({ viewport: { width: 1280, height: 860 } });
		const errors = watchForErrors(page);
		await page.goto(`${appUrl()}/map`, { waitUntil: 'networkidle' });
		const map = page.getByTestId('map');
		await expect.poll(() => map.getAttribute('data-basemap'), { timeout: 15_000 }).toBe('loaded');
		await expect
			.poll(async () => Number(await map.getAttribute('data-sites')), { timeout: 15_000 })
			.toBeGreaterThan(10);
		// Land polygons are SVG paths in the basemap pane; sites are drawn on a canvas above them.
		expect(await page.locator('.leaflet-basemap-pane path').count()).toBeGreaterThan(0);
		await expect(page.getByTestId('map-status').textContent()).resolves.toMatch(
			/\d+\s+sites in view/
		);

		// Click a site marker as a user would: find its pixel from the map's bounds (Web Mercator).
		const sites = await (await fetch(`${appUrl()}/api/v1/sites.geojson?bbox=3,56,12,61`)).json();
		const [west, south, east, north] = (await map.getAttribute('data-bounds'))!
			.split(',')
			.map(Number);
		type F = { geometry: { coordinates: [number, number] }; properties: { code: string } };
		const features: F[] = sites.features;
		// The marker farthest from its neighbours, away from the overlays at the map's edges.
		const inner = features.filter(
			({
				geometry: {
					coordinates: [lo, la]
				}
			}) =>
				lo > west + 0.25 * (east - west) &&
				lo < east - 0.35 * (east - west) &&
				la > south + 0.25 * (north - south) &&
				la < north - 0.2 * (north - south)
		);
		const isolation = (f: F) =>
			Math.min(
				...features
					.filter((g) => g !== f)
					.map((g) =>
						Math.hypot(
							g.geometry.coordinates[0] - f.geometry.coordinates[0],
							g.geometry.coordinates[1] - f.geometry.coordinates[1]
						)
					)
			);
		const target = inner.reduce((best, f) => (isolation(f) > isolation(best) ? f : best));
		const box = (await map.boundingBox())!;
		const mercY = (lat: number) => Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360));
		const [lon, lat] = target.geometry.coordinates;
		const x = box.x + ((lon - west) / (east - west)) * box.width;
		const y = box.y + ((mercY(north) - mercY(lat)) / (mercY(north) - mercY(south))) * box.height;
		await page.mouse.click(x, y);
		const panel = page.getByTestId('site-panel');
		await panel.waitFor({ timeout: 5000 });
		await expect(panel.textContent()).resolves.toContain(target.properties.code);
		await screenshot(page, 'map');

		// Filter to marine probes: the URL keeps the filter and the map shows only those sites.
		const before = Number(await map.getAttribute('data-sites'));
		await page.getByLabel('Marine probe').check();
		await page.waitForURL(/method=marine_probe/);
		const bounds = (await map.getAttribute('data-bounds'))!;
		const marine = await (
			await fetch(`${appUrl()}/api/v1/sites.geojson?bbox=${bounds}&method=marine_probe`)
		).json();
		expect(marine.features.length).toBeGreaterThan(0);
		expect(marine.features.length).toBeLessThan(before);
		await expect
			.poll(async () => Number(await map.getAttribute('data-sites')), { timeout: 10_000 })
			.toBe(marine.features.length);

		// Search by code, the same parameter the dataset tables and the API take.
		const code: string = marine.features[0].properties.code;
		const search = page.getByLabel('Site code or name contains');
		await search.fill(code);
		await search.press('Enter');
		await page.waitForURL((url) => url.searchParams.get('q') === code);
		const searched = await (
			await fetch(
				`${appUrl()}/api/v1/sites.geojson?bbox=${bounds}&method=marine_probe&q=${encodeURIComponent(code)}`
			)
		).json();
		expect(
			searched.features.map((f: { properties: { code: string } }) => f.properties.code)
		).toContain(code);
		for (const f of searched.features) {
			expect(f.properties.code.toLowerCase()).toContain(code.toLowerCase());
		}
		await expect
			.poll(async () => Number(await map.getAttribute('data-sites')), { timeout: 10_000 })
			.toBe(searched.features.length);

		await page.reload({ waitUntil: 'networkidle' });
		expect(await page.getByLabel('Marine probe').isChecked()).toBe(true);
		expect(await search.inputValue()).toBe(code);
		expect(errors).toEqual([]);
		await page.close();
	});
});
