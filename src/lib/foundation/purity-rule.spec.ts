// The ESLint purity rule (eslint.config.js) really rejects framework, database, Node and DOM use in
// the pure folders, and leaves other folders and specs alone. Runs ESLint's own API on probe text.
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

const eslint = new ESLint({ cwd: process.cwd() });

async function ruleHits(code: string, filePath: string): Promise<string[]> {
	const [result] = await eslint.lintText(code, { filePath });
	return result.messages
		.filter((m) => m.ruleId === 'no-restricted-imports' || m.ruleId === 'no-restricted-globals')
		.map((m) => m.message);
}

describe('purity rule for pure modules', () => {
	it(
		'rejects framework, database, Node and DOM in every pure folder',
		{ timeout: 120_000 },
		async () => {
			const probes: [string, RegExp][] = [
				["import { page } from '$app/state';\nexport const p = page;", /framework-free/],
				["import { mount } from 'svelte';\nexport const m = mount;", /framework-free/],
				["import { eq } from 'drizzle-orm';\nexport const e = eq;", /database/],
				["import { db } from '$lib/server/db';\nexport const d = db;", /database/],
				["import { db } from '../server/db';\nexport const d = db;", /database/],
				[
					"import { readFileSync } from 'node:fs';\nexport const r = readFileSync;",
					/Node built-ins/
				],
				["import { join } from 'path';\nexport const j = join;", /Node built-ins/],
				['export const w = window.innerWidth;', /no window/],
				['export const t = document.title;', /no document/],
				['export const e = process.env.X;', /no process/]
			];
			for (const folder of [
				'foundation',
				'geo',
				'thermal',
				'geostats',
				'imports',
				'chart-data',
				'sites',
				'csv',
				'datasets'
			]) {
				for (const [code, expected] of probes) {
					const hits = await ruleHits(code, `src/lib/${folder}/probe.ts`);
					expect(hits.join(' | '), `${folder}: ${code}`).toMatch(expected);
				}
			}
		}
	);

	it(
		'allows pure imports there, and Node in specs and server code',
		{ timeout: 60_000 },
		async () => {
			expect(
				await ruleHits(
					"import proj4 from 'proj4';\nexport const p = proj4;",
					'src/lib/geo/probe.ts'
				)
			).toEqual([]);
			expect(
				await ruleHits(
					"import { readFileSync } from 'node:fs';\nexport const r = readFileSync;",
					'src/lib/thermal/probe.spec.ts'
				)
			).toEqual([]);
			expect(
				await ruleHits(
					"import { eq } from 'drizzle-orm';\nexport const e = eq;",
					'src/lib/server/probe.ts'
				)
			).toEqual([]);
		}
	);
});
