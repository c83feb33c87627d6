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

describe('saved regions on the map', () => {
	it('saves a drawn rectangle, picks it after a reload, reads its statistics, renames, shares and deletes it', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
		const page = await context.newPage();
		const errors = watchForErrors(page);
		await page.goto(`${appUrl()}/sign-in`);
		await page.getByLabel('E-mail address').fill('curator@korvald-survey.example');
		await page.getByLabel('Password').fill('korvald-demo-2026');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL(/\/account$/);

		await page.goto(`${appUrl()}/map`);
		const map = page.getByTestId('map');
		await expect.poll(() => map.getAttribute('data-kind'), { timeout: 15_000 }).not.toBeNull();

		// Draw a rectangle over most of the map, clear of the legend and the status line.
		await page.getByTestId('draw-region').click();
		const box = (await map.boundingBox())!;
		await page.mouse.click(box.x + box.width * 0.3, box.y + box.height * 0.1);
		await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.5, { steps: 5 });
		await page.mouse.click(box.x + box.width * 0.9, box.y + box.height * 0.8);
		const stats = page.getByTestId('region-stats');
		await stats.waitFor({ timeout: 15_000 });
		const drawnCount = await page.getByTestId('region-count').textContent();

		// A name already refused while typing: empty.
		const name = `Survey block ${Date.now().toString(36)}`;
		await page.getByTestId('save-region').click();
		await expect
			.poll(() => page.getByTestId('saved-region-message').textContent())
			.toBe('Give the region a name.');
		await page.getByTestId('region-name').fill(name);
		await page.getByTestId('save-region').click();
		await expect
			.poll(() => page.getByTestId('saved-region-message').textContent(), { timeout: 15_000 })
			.toBe(`Saved “${name}”.`);

		// After a reload the region is one of the saved ones; picking it asks by its id.
		await page.reload();
		await expect.poll(() => map.getAttribute('data-kind'), { timeout: 15_000 }).not.toBeNull();
		const picker = page.getByTestId('pick-region');
		await expect.poll(() => picker.locator('option', { hasText: name }).count()).toBe(1);
		await picker.selectOption({ label: name });
		await expect
			.poll(() => stats.getAttribute('data-region'), { timeout: 15_000 })
			.toMatch(/^region=[0-9a-f-]{36}$/);
		const id = (await stats.getAttribute('data-region'))!.slice('region='.length);
		const byApi = await (
			await page.request.get(`${appUrl()}/api/v1/map/region?region=${id}`)
		).json();
		await expect
			.poll(() => page.getByTestId('region-count').textContent(), { timeout: 15_000 })
			.toBe(byApi.count.toLocaleString('en'));
		expect(byApi.count.toLocaleString('en')).toBe(drawnCount);
		await screenshot(page, 'saved-region-picked-1280');

		await page.getByTestId('rename-region').click();
		await page.getByTestId('region-new-name').fill(`${name} (west)`);
		await page.getByRole('button', { name: 'Rename', exact: true }).click();
		await expect
			.poll(() => page.getByTestId('saved-region-message').textContent(), { timeout: 15_000 })
			.toBe(`Renamed to “${name} (west)”.`);
		await expect
			.poll(() => picker.locator('option', { hasText: `${name} (west)` }).count())
			.toBe(1);

		// Shared with the curator's organisation: its members may pick it.
		await page.getByTestId('share-region').selectOption({ label: 'Korvald Geological Survey' });
		await expect
			.poll(() => page.getByTestId('saved-region-message').textContent(), { timeout: 15_000 })
			.toBe('Shared with Korvald Geological Survey.');
		const shared = await (await page.request.get(`${appUrl()}/api/v1/regions/${id}`)).json();
		expect(shared.organisation.id).toBe('org-korvald-survey');

		await page.getByTestId('delete-region').click();
		await expect
			.poll(() => page.getByTestId('saved-region-message').textContent(), { timeout: 15_000 })
			.toBe(`Deleted “${name} (west)”.`);
		await expect.poll(() => picker.locator('option', { hasText: name }).count()).toBe(0);
		expect((await page.request.get(`${appUrl()}/api/v1/regions/${id}`)).status()).toBe(404);
		expect(errors).toEqual([]);
		await context.close();
	});
});
