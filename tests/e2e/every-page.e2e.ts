import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, signIn } from './browser';

/*
 * Every main page, as each kind of user reaches it, at a laptop and a phone size: axe-core's
 * checks find no serious or critical violation, and nothing is wider than the screen (no sideways
 * scrolling). Screenshots of each land in tests/artifacts/pages/.
 */

const AXE_SOURCE = fs.readFileSync(
	createRequire(import.meta.url).resolve('axe-core/axe.min.js'),
	'utf8'
);
const SIZES = [
	{ name: 'laptop', width: 1280, height: 800 },
	{ name: 'phone', width: 390, height: 844 }
] as const;

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

/** A context whose pages may take axe's injected script (the app's CSP would refuse it). */
async function contextFor(email: string | null): Promise<BrowserContext> {
	const context = await browser.newContext({ bypassCSP: true });
	if (!email) return context;
	const page = await context.newPage();
	await signIn(page, email);
	await page.close();
	return context;
}

type Finding = { id: string; impact: string; help: string; targets: string[] };

async function serious(page: Page): Promise<Finding[]> {
	await page.addScriptTag({ content: AXE_SOURCE });
	return page.evaluate(async () => {
		const axe = (window as unknown as { axe: { run: (o: object) => Promise<AxeResults> } }).axe;
		type AxeResults = {
			violations: {
				id: string;
				impact: string | null;
				help: string;
				nodes: { target: string[] }[];
			}[];
		};
		const result = await axe.run({ resultTypes: ['violations'] });
		return result.violations
			.filter((v) => v.impact === 'serious' || v.impact === 'critical')
			.map((v) => ({
				id: v.id,
				impact: v.impact ?? '',
				help: v.help,
				targets: v.nodes.slice(0, 5).map((n) => n.target.join(' '))
			}));
	});
}

/**
 * How far the page is wider than the window, in CSS pixels (0: no sideways scrolling), and the
 * outermost elements that stick out, so a failure says where to look.
 */
const overflowOf = (page: Page) =>
	page.evaluate(() => {
		const width = window.innerWidth;
		const over = document.documentElement.scrollWidth - width;
		const culprits: string[] = [];
		if (over > 0) {
			for (const el of Array.from(document.body.querySelectorAll('*'))) {
				const right = el.getBoundingClientRect().right;
				const parent = el.parentElement;
				// Parts of a box that clips them (a scrolling table, a map) do not widen the page.
				let clipped = false;
				for (let a = parent; a && a !== document.body; a = a.parentElement) {
					if (getComputedStyle(a).overflowX !== 'visible') clipped = true;
				}
				if (
					!clipped &&
					right > width + 1 &&
					!(parent && parent.getBoundingClientRect().right > width + 1)
				) {
					const cls = (el.getAttribute('class') ?? '').split(/\s+/).slice(0, 3).join('.');
					culprits.push(
						`${el.tagName.toLowerCase()}${cls ? '.' + cls : ''} (${Math.round(right)} px)`
					);
					if (culprits.length === 3) break;
				}
			}
		}
		return { over, culprits };
	});

/** One page at both sizes: a list of what is wrong, empty when nothing is. */
async function problemsOf(context: BrowserContext, who: string, p: string) {
	const page = await context.newPage();
	const problems: string[] = [];
	for (const size of SIZES) {
		await page.setViewportSize({ width: size.width, height: size.height });
		const response = await page.goto(`${appUrl()}${p}`, { waitUntil: 'networkidle' });
		expect(response?.status(), p).toBeLessThan(400);
		const name = `${who}${p === '/' ? '-home' : p.replace(/[^a-z0-9]+/gi, '-')}`.slice(0, 80);
		await screenshot(page, `pages/${name}-${size.name}`);
		const { over, culprits } = await overflowOf(page);
		if (over > 0)
			problems.push(`${p} at ${size.width} px is ${over} px too wide: ${culprits.join(', ')}`);
		for (const f of await serious(page))
			problems.push(`${p} at ${size.width} px: ${f.impact} ${f.id} (${f.help}) at ${f.targets}`);
	}
	await page.close();
	return problems;
}

/** Pages whose address depends on the data: the first public dataset and site the app lists. */
async function resolve(p: string): Promise<string> {
	if (p === 'a public dataset') {
		const list = await (await fetch(`${appUrl()}/datasets`)).text();
		return /href="(\/datasets\/[0-9a-f-]{36})"/.exec(list)![1];
	}
	if (p === 'a public site') {
		const res = await fetch(`${appUrl()}/api/v1/sites.geojson?bbox=-180,-90,180,90`);
		return `/sites/${(await res.json()).features[0].id}`;
	}
	return p;
}

const PAGES: { who: string; email: string | null; paths: string[] }[] = [
	{
		who: 'a visitor',
		email: null,
		paths: [
			'/',
			'/map',
			'/datasets',
			'a public dataset',
			'a public site',
			'/organisations',
			'/organisations/korvald-survey',
			'/help',
			'/help/publish',
			'/help/import',
			'/help/fix-rows',
			'/help/roles',
			'/help/visibility',
			'/help/citing',
			'/help/models',
			'/api',
			'/sign-in',
			'/sign-up',
			'/forgot-password'
		]
	},
	{
		who: 'an organisation owner',
		email: 'owner@korvald-survey.example',
		paths: [
			'/account',
			// Signed in, the map's panel also holds the saved regions.
			'/map',
			'/datasets/new',
			'/organisations/new',
			'/organisations/korvald-survey/settings',
			'/audit'
		]
	},
	{ who: 'a platform administrator', email: 'admin@thermalith.example', paths: ['/admin'] }
];

for (const { who, email, paths } of PAGES) {
	describe(`as ${who}, on a laptop and a phone`, () => {
		let context: BrowserContext;
		beforeAll(async () => {
			context = await contextFor(email);
		});
		afterAll(async () => {
			await context?.close();
		});
		for (const p of paths) {
			it(`${p} fits the screen and passes axe-core`, async () => {
				const slug = who.split(' ').pop()!;
				expect(await problemsOf(context, slug, await resolve(p))).toEqual([]);
			});
		}
	});
}
