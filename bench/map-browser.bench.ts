/**
 * The map page in a browser: how long until it is interactive with its markers drawn, in headless
 * Debian Chromium (/usr/bin/chromium through playwright-core) against the built app (vite build,
 * into build-bench/, skipped when up to date) serving the demo data, then the same with the
 * large invented scenario (1,000,000 sites, scripts/lib/large-seed.js) added, which is removed
 * again at the end.
 *
 * What is timed, per run (a fresh browser context: empty cache, no cookies, anonymous; a
 * 1280 × 800 px window): from the navigation's start (performance.timeOrigin of the map page) to
 * the first moment after the map's first data layer is drawn at which the page runs a new task.
 * The map element gets `data-kind` ("cells" or "sites") once the first /api/v1/map answer is on
 * the map (HeatFlowMap.svelte); Leaflet paints those markers in the next animation frame; a task
 * queued from that frame runs only when the main thread is free again, which is when a click or
 * key pressed at that moment would be handled. An init script records that time in the page
 * (`performance.now()`), so the browser's own clock measures it, not this process.
 * Needs DATABASE_URL (scripts/bench.js starts a private cluster) and the app's environment.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import postgres from 'postgres';
import { chromium, type Browser } from 'playwright-core';
import { percentilesInPlace } from '$lib/thermal/percentile';
import { buildApp } from '../scripts/lib/app.js';
import { removeLarge, seedLarge } from '../scripts/lib/large-seed.js';
import { waitForPort } from '../scripts/lib/proc.js';
import { seedDemoData } from '../scripts/lib/seed-runner.js';
import { dryRun, figure, size } from './report';

const RUNS = size(9, 1);
const LARGE_SITES = size(1_000_000, 2_000);
const TARGET_MS = 2000;
const BUILD_DIR = 'build-bench';

const url = process.env.DATABASE_URL;
const port = process.env.PORT;
const host = process.env.HOST ?? '127.0.0.1';
if (!url || !port)
	throw new Error('DATABASE_URL and PORT are not set; run through `npm run bench`');
const origin = `http://${host}:${port}`;

/**
 * Records, in the page, when it is interactive with markers drawn (see the header). A string, not
 * a function: tsx compiles functions with name helpers the page does not have.
 */
const MARK_INTERACTIVE = `(() => {
	const check = () => {
		if (window.__mapInteractiveMs !== undefined) return true;
		if (!document.querySelector('[data-testid="map"][data-kind]')) return false;
		requestAnimationFrame(() =>
			setTimeout(() => {
				if (window.__mapInteractiveMs === undefined) window.__mapInteractiveMs = performance.now();
			}, 0)
		);
		return true;
	};
	new MutationObserver((_records, observer) => {
		if (check()) observer.disconnect();
	}).observe(document, { subtree: true, childList: true, attributes: true });
})();`;

type Marked = Window & { __mapInteractiveMs?: number };

async function timeMapPage(browser: Browser): Promise<{ ms: number; shown: string }> {
	const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
	try {
		const page = await context.newPage();
		await page.addInitScript({ content: MARK_INTERACTIVE });
		await page.goto(`${origin}/map`);
		await page
			.waitForFunction(() => (window as Marked).__mapInteractiveMs !== undefined, undefined, {
				timeout: 60_000
			})
			.catch(async (err: Error) => {
				const status = await page
					.getByTestId('map-status')
					.textContent()
					.catch(() => null);
				throw new Error(`the map was not drawn (status: ${status}): ${err.message}`);
			});
		const kind = await page.getByTestId('map').getAttribute('data-kind');
		const count = Number(await page.getByTestId('map').getAttribute('data-sites'));
		if (!kind || !(count > 0)) throw new Error(`the map drew no markers (kind ${kind}, ${count})`);
		const ms = await page.evaluate(() => (window as Marked).__mapInteractiveMs!);
		return { ms, shown: `${count.toLocaleString('en')} sites as ${kind}` };
	} finally {
		await context.close();
	}
}

async function measure(browser: Browser, id: string, what: string) {
	// One visit first, unmeasured: the server's first compile of each route and query plan.
	const { shown } = await timeMapPage(browser);
	const ms: number[] = [];
	for (let i = 0; i < RUNS; i++) ms.push((await timeMapPage(browser)).ms);
	const [p50, p95] = percentilesInPlace(Float64Array.from(ms), [0.5, 0.95]);
	const note = `${RUNS} runs, fresh anonymous context each, first view ${shown}; all: ${ms.map((v) => v.toFixed(0)).join(', ')} ms`;
	figure({
		id: `${id}.p50`,
		label: `Map page interactive with markers drawn, ${what}, p50`,
		value: p50,
		unit: 'ms',
		target: TARGET_MS,
		better: 'lower',
		note
	});
	figure({
		id: `${id}.p95`,
		label: `Map page interactive with markers drawn, ${what}, p95`,
		value: p95,
		unit: 'ms',
		target: TARGET_MS,
		better: 'lower',
		note
	});
}

const sql = postgres(url, { max: 2, onnotice: () => {} });
let app: ChildProcess | undefined;
let browser: Browser | undefined;
try {
	const appEnv = Object.fromEntries(
		Object.entries(process.env).filter((e): e is [string, string] => e[1] !== undefined)
	);
	if (!dryRun) {
		await seedDemoData({ ...appEnv, THERMALITH_SEED: 'if-empty' });
		await buildApp(BUILD_DIR, appEnv);
		app = spawn(process.execPath, [path.resolve(BUILD_DIR, 'index.js')], {
			env: { ...appEnv, ORIGIN: origin },
			stdio: ['ignore', 'ignore', 'inherit']
		});
		await waitForPort(host, Number(port), 30_000);
		browser = await chromium.launch({
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			headless: true,
			args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking']
		});
		await measure(browser, 'map.browser-interactive-demo', 'demo data');
		await removeLarge(sql);
		await seedLarge(sql, LARGE_SITES);
		await measure(
			browser,
			'map.browser-interactive-1m',
			`${LARGE_SITES.toLocaleString('en')} sites`
		);
	} else {
		// A dry run proves the modules load; building and seeding take minutes.
		figure({
			id: 'map.browser-interactive-demo.p50',
			label: 'Map page interactive with markers drawn (dry run: not measured)',
			value: 0,
			unit: 'ms',
			better: 'lower'
		});
	}
} finally {
	await browser?.close();
	app?.kill('SIGTERM');
	await removeLarge(sql).catch(() => {});
	await sql.end();
}
