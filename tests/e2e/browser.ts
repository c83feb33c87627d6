import fs from 'node:fs';
import path from 'node:path';
import {
	chromium,
	type Browser,
	type ConsoleMessage,
	type Page,
	type Response
} from 'playwright-core';

/** Where screenshots go (git-ignored). */
export const ARTIFACTS = path.resolve('tests/artifacts');

export const appUrl = () => {
	const url = process.env.TEST_APP_URL;
	if (!url) throw new Error('TEST_APP_URL is not set: run the end-to-end tests through `npm test`');
	return url;
};

/**
 * Debian's Chromium, headless, with the flags this closed network needs (no background
 * networking, no component updates); Playwright gives every launch a fresh temporary profile.
 * Never a downloaded browser.
 */
export async function launch(): Promise<Browser> {
	const browser = await chromium.launch({
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		headless: true,
		args: [
			'--no-sandbox',
			'--disable-gpu',
			'--disable-quic',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync'
		]
	});
	const newPage = browser.newPage.bind(browser);
	browser.newPage = async (...args) => waitForHydrationAfterLoads(await newPage(...args));
	const newContext = browser.newContext.bind(browser);
	browser.newContext = async (...args) => {
		const context = await newContext(...args);
		const contextPage = context.newPage.bind(context);
		context.newPage = async () => waitForHydrationAfterLoads(await contextPage());
		return context;
	};
	return browser;
}

/** A page of the app itself (not an error, a file or another site), which hydrates. */
function isAppPage(response: Response | null) {
	return (
		response !== null &&
		response.ok() &&
		response.url().startsWith(appUrl()) &&
		(response.headers()['content-type'] ?? '').startsWith('text/html')
	);
}

/** Resolves once the page's script has taken over (the root layout marks <html data-hydrated>). */
export async function hydrated(page: Page) {
	await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
}

/**
 * A user waits until a page responds; a test must too. After every full page load the test would
 * otherwise type into fields and click buttons before the page's script runs: the click does
 * nothing and the test waits in vain (seen on a busy machine). So the calls that load a page
 * (goto, reload, waitForURL) resolve only once the page is hydrated.
 */
function waitForHydrationAfterLoads(page: Page): Page {
	const goto = page.goto.bind(page);
	page.goto = async (...args) => {
		const response = await goto(...args);
		if (isAppPage(response)) await hydrated(page);
		return response;
	};
	const reload = page.reload.bind(page);
	page.reload = async (...args) => {
		const response = await reload(...args);
		if (isAppPage(response)) await hydrated(page);
		return response;
	};
	const waitForURL = page.waitForURL.bind(page);
	page.waitForURL = async (...args) => {
		await waitForURL(...args);
		if (page.url().startsWith(appUrl())) await hydrated(page);
	};
	return page;
}

/** Collect console errors and failed requests of a page, so a test can assert there were none. */
export function watchForErrors(page: Page): string[] {
	const errors: string[] = [];
	page.on('console', (m: ConsoleMessage) => {
		if (m.type() === 'error') errors.push(`console: ${m.text()}`);
	});
	page.on('pageerror', (e) => errors.push(`page error: ${e.message}`));
	page.on('response', (r) => {
		if (r.status() >= 400) errors.push(`HTTP ${r.status()} ${r.url()}`);
	});
	return errors;
}

export async function screenshot(page: Page, name: string) {
	fs.mkdirSync(ARTIFACTS, { recursive: true });
	await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`), fullPage: true });
}

/** The demo accounts' password (the seeded demo organisations). */
export const DEMO_PASSWORD = 'korvald-demo-2026';

/** Sign in through the sign-in page, as a user does; resolves once the account page is shown. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto(`${appUrl()}/sign-in`);
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL(/\/account$/);
}

/** A new browser context (a desktop window) signed in as `email`: its page and the page's errors. */
export async function signedIn(
	browser: Browser,
	email: string,
	password = DEMO_PASSWORD
): Promise<{ page: Page; errors: string[] }> {
	const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
	const page = await context.newPage();
	const errors = watchForErrors(page);
	await signIn(page, email, password);
	return { page, errors };
}
