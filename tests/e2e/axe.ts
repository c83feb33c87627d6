import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const AXE_SOURCE = fs.readFileSync(
	createRequire(import.meta.url).resolve('axe-core/axe.min.js'),
	'utf8'
);

/**
 * axe-core's serious and critical violations on the page, or inside `include` (a CSS selector)
 * only, each as "rule: target". The page's context needs `bypassCSP: true` for the injected script.
 */
export async function seriousViolations(page: Page, include?: string): Promise<string[]> {
	await page.addScriptTag({ content: AXE_SOURCE });
	return page.evaluate(async (selector) => {
		type AxeResults = {
			violations: { id: string; impact: string | null; nodes: { target: string[] }[] }[];
		};
		const axe = (
			window as unknown as { axe: { run: (c: object, o: object) => Promise<AxeResults> } }
		).axe;
		const result = await axe.run(selector ? { include: [selector] } : document, {
			resultTypes: ['violations']
		});
		return result.violations
			.filter((v) => v.impact === 'serious' || v.impact === 'critical')
			.flatMap((v) => v.nodes.slice(0, 3).map((n) => `${v.id}: ${n.target.join(' ')}`));
	}, include ?? null);
}
