import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, watchForErrors } from './browser';

// The main pages work under the Content-Security-Policy: no violation reported, the map, charts
// and forms reach the state a user sees, and an injected inline script is refused.
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

declare global {
	interface Window {
		__cspViolations: string[];
	}
}

/** A page that records CSP violation events (the init script runs through DevTools, outside the CSP). */
async function watchedPage(): Promise<{ page: Page; errors: string[] }> {
	const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
	await page.addInitScript(() => {
		window.__cspViolations = [];
		document.addEventListener('securitypolicyviolation', (e) =>
			window.__cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`)
		);
	});
	return { page, errors: watchForErrors(page) };
}

async function visit(page: Page, path: string) {
	const res = await page.goto(`${appUrl()}${path}`, { waitUntil: 'networkidle' });
	const csp = (await res?.headerValue('content-security-policy')) ?? '';
	expect(csp, path).toMatch(/script-src 'self' 'nonce-/);
	return csp;
}

const violations = (page: Page) => page.evaluate(() => window.__cspViolations);

describe('Content-Security-Policy in Chromium', () => {
	it('lets the public pages, the map and the charts work with no violation', async () => {
		const { page, errors } = await watchedPage();
		await visit(page, '/');
		expect(Number(await page.getByTestId('count-sites').textContent())).toBeGreaterThan(0);

		await visit(page, '/map');
		const map = page.getByTestId('map');
		await expect.poll(() => map.getAttribute('data-basemap'), { timeout: 15_000 }).toBe('loaded');
		await expect
			.poll(async () => Number(await map.getAttribute('data-sites')), { timeout: 15_000 })
			.toBeGreaterThan(0);

		const sites = await (await fetch(`${appUrl()}/api/v1/sites.geojson?bbox=3,56,12,61`)).json();
		const withHeatFlow = sites.features.find(
			(f: { properties: { heatFlowMWm2: number | null } }) => (f.properties.heatFlowMWm2 ?? 0) > 0
		);
		await visit(page, `/sites/${withHeatFlow.properties.id}`);
		await page.getByTestId('geotherm-chart').waitFor();
		await page.getByTestId('geotherm-p50').waitFor({ state: 'attached' });
		await page.getByTestId('locator-map').waitFor();

		const datasetHref = await page.locator('a[href^="/datasets/"]').first().getAttribute('href');
		await visit(page, datasetHref!);
		await page.getByTestId('sites-table').waitFor();
		const orgHref = await page.locator('a[href^="/organisations/"]').first().getAttribute('href');
		await visit(page, orgHref!);
		await page.getByRole('heading', { level: 1 }).waitFor();

		expect(await violations(page)).toEqual([]);
		expect(errors).toEqual([]);
		await page.close();
	});

	it('lets a person sign in through the form and use the signed-in pages with no violation', async () => {
		const { page, errors } = await watchedPage();
		await visit(page, '/sign-in?next=/organisations/korvald-survey');
		await page.getByLabel('E-mail address').fill('curator@korvald-survey.example');
		await page.getByLabel('Password').fill('korvald-demo-2026');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL(/\/organisations\/korvald-survey$/);
		await page.getByText('Members and settings').waitFor();
		await visit(page, '/organisations/korvald-survey/settings');
		await page.getByTestId('members-table').waitFor();
		await visit(page, '/datasets/new');
		await page.getByRole('heading', { level: 1 }).waitFor();
		expect(await violations(page)).toEqual([]);
		expect(errors).toEqual([]);
		await page.close();
	});

	it('refuses to run a script injected into a page', async () => {
		const { page } = await watchedPage();
		await visit(page, '/');
		const ran = await page.evaluate(() => {
			const script = document.createElement('script');
			script.textContent = 'window.__injected = true';
			document.body.append(script);
			return (window as unknown as { __injected?: boolean }).__injected === true;
		});
		expect(ran).toBe(false);
		await expect
			.poll(() => violations(page))
			.toEqual(expect.arrayContaining([expect.stringMatching(/^script-src/)]));
		await page.close();
	});
});
