// Code, tests and documents cite docs/science.md by section; these checks keep every such
// citation pointing at a section that exists, and keep out documents that are not in the repository.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = process.cwd();
const SKIP = new Set([
	'node_modules',
	'build',
	'build-test',
	'.svelte-kit',
	'.git',
	'coverage',
	'storage'
]);
const TEXT = /\.(ts|js|svelte|md|sh|R)$/;

function files(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		if (SKIP.has(name)) return [];
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return files(path);
		return TEXT.test(name) ? [path] : [];
	});
}

const sources = [
	...['src', 'scripts', 'tests', 'bench', 'docs'].flatMap((d) => files(join(ROOT, d))),
	...readdirSync(ROOT)
		.filter((n) => n.endsWith('.md'))
		.map((n) => join(ROOT, n))
];

/** GitHub-style heading anchors of docs/science.md. */
function anchors(): Set<string> {
	const text = readFileSync(join(ROOT, 'docs/science.md'), 'utf8');
	return new Set(
		[...text.matchAll(/^#{1,6} (.+)$/gm)].map((m) =>
			m[1]
				.toLowerCase()
				.replace(/[^\p{L}\p{N} -]/gu, '')
				.replace(/ /g, '-')
		)
	);
}

describe('citations of the science document', () => {
	it('every cited section of the science document exists', () => {
		const known = anchors();
		const broken: string[] = [];
		for (const path of sources) {
			for (const m of readFileSync(path, 'utf8').matchAll(/docs\/science\.md#([a-z0-9-]+)/g)) {
				if (!known.has(m[1])) broken.push(`${path.slice(ROOT.length + 1)}: #${m[1]}`);
			}
		}
		expect(known.has('steady-conduction')).toBe(true);
		expect(broken).toEqual([]);
	});

	it('nothing cites the old science file outside the repository, or "the brief"', () => {
		const outside = ['SCIENCE', '.md'].join('');
		const citedBrief = ['(', 'brief'].join('');
		const offenders = sources
			.filter((path) => {
				const text = readFileSync(path, 'utf8');
				return text.includes(outside) || text.includes(citedBrief);
			})
			.map((path) => path.slice(ROOT.length + 1));
		expect(offenders).toEqual([]);
	});
});
