import adapter from '@sveltejs/adapter-node';
import { readFileSync } from 'node:fs';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8'));

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	compilerOptions: { runes: true },
	kit: {
		adapter: adapter({ out: process.env.BUILD_DIR ?? 'build' }),
		version: { name: pkg.version }
	}
};

export default config;
