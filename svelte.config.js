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
		version: { name: pkg.version },
		// Content-Security-Policy of every page: SvelteKit adds a fresh nonce (or, for prerendered
		// pages, hashes) for its own inline script, so nothing injected into a page can run.
		// hooks.server.ts adds the object store's origin (known only at run time) to connect-src and
		// img-src, and gives API responses a CSP that allows nothing.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self'],
				// Svelte's style: directives are server-rendered as style="" attributes (map legend);
				// attributes cannot load or run anything, <style> elements stay nonce-only.
				'style-src-attr': ['unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				// Vite inlines the smallest Lato subsets as data: URLs; a font cannot run code.
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'worker-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
