import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, hydrated, launch, signIn } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

describe('a page whose script arrives late (slow network, busy machine)', () => {
	it('keeps what the user typed before the script ran, and the form still submits', async () => {
		const page = await browser.newPage();
		await signIn(page, 'curator@korvald-survey.example');

		// Hold back the app's scripts until the user has typed.
		let release: () => void = () => {};
		const scriptsMayLoad = new Promise<void>((resolve) => (release = resolve));
		await page.route(/\/_app\/immutable\/.*\.js$/, async (route) => {
			await scriptsMayLoad;
			await route.continue();
		});

		const title = `Typed before the script (${Date.now()})`;
		const loading = page.goto(`${appUrl()}/datasets/new`);
		await page.getByLabel('Title', { exact: true }).fill(title);
		expect(await page.locator('html[data-hydrated]').count()).toBe(0);
		release();
		await loading;
		await hydrated(page);

		await expect(page.getByLabel('Title', { exact: true }).inputValue()).resolves.toBe(title);
		await page.getByRole('button', { name: 'Create draft' }).click();
		await page.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(title);
		await page.close();
	});
});
