import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, signIn, watchForErrors } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

describe('API keys on the account page, as a user would manage them', () => {
	it('creates a read key shown once, uses it from a script, and revokes it', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		const errors = watchForErrors(page);
		await signIn(page, 'viewer@korvald-survey.example');

		const name = `e2e key ${Date.now()}`;
		await page.getByLabel('Key name').fill(name);
		await page.getByLabel('Access').selectOption('read');
		await page.getByLabel('Expires after').selectOption('90');
		await page.getByRole('button', { name: 'Create API key' }).click();
		const shown = page.getByTestId('new-api-key');
		await shown.waitFor();
		const key = (await shown.textContent())!.trim();
		expect(key).toMatch(/^thl_[A-Za-z0-9_-]{43}$/);
		const row = page.getByTestId('api-key').filter({ hasText: name });
		await expect(row.textContent()).resolves.toContain(key.slice(0, 12));
		await expect(row.textContent()).resolves.toContain('never used');
		await screenshot(page, 'api-key-created');

		// A script with the key: it reads what this account sees.
		const script = await fetch(`${appUrl()}/api/v1/datasets?limit=5`, {
			headers: { authorization: `Bearer ${key}` }
		});
		expect(script.status).toBe(200);

		// Shown once: a fresh load lists the key by its prefix only, now with its last use.
		await page.reload();
		expect(await page.content()).not.toContain(key);
		await expect(row.textContent()).resolves.toContain('last used');

		await row.getByRole('button', { name: 'Revoke' }).click();
		await row.getByText('revoked').waitFor();
		const after = await fetch(`${appUrl()}/api/v1/datasets?limit=5`, {
			headers: { authorization: `Bearer ${key}` }
		});
		expect(after.status).toBe(401);
		expect(errors).toEqual([]);
		await context.close();
	});
});
