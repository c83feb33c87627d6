import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type ConsoleMessage, type Page } from 'playwright-core';

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
	return chromium.launch({
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
