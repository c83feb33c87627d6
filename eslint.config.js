import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

// What pure modules must not import: each group with the reason a reader sees in the lint error.
const PURE_MODULE_IMPORT_BANS = [
	{
		group: ['$app', '$app/*', '$env/*', '$service-worker', '@sveltejs/*', 'svelte', 'svelte/*'],
		message: 'Pure modules are framework-free: keep SvelteKit and Svelte out of this folder.'
	},
	{
		group: [
			'drizzle-orm',
			'drizzle-orm/*',
			'postgres',
			'$lib/server',
			'$lib/server/*',
			'**/server/**'
		],
		message: 'Pure modules never touch the database or server-only code; pass the data in.'
	},
	{
		regex:
			'^(node:.*|fs|fs/.*|path|path/.*|os|child_process|crypto|url|http|https|net|stream|stream/.*|util|buffer|worker_threads|zlib|module|process)$',
		message: 'Pure modules run in the browser too: no Node built-ins.'
	}
];

// Browser-only and Node-only globals a pure module must not reach for.
const PURE_MODULE_GLOBAL_BANS = [
	'window',
	'document',
	'navigator',
	'location',
	'localStorage',
	'sessionStorage',
	'fetch',
	'XMLHttpRequest',
	'HTMLElement',
	'Element',
	'requestAnimationFrame',
	'process',
	'Buffer',
	'require',
	'__dirname',
	'__filename',
	'global'
].map((name) => ({ name, message: `Pure modules run in the browser and in Node: no ${name}.` }));

export default ts.config(
	{
		ignores: [
			'build/',
			'build-test/',
			'build-bench/',
			'.svelte-kit/',
			'storage/',
			'coverage/',
			'tests/artifacts/',
			'drizzle/'
		]
	},
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	prettier,
	...svelte.configs.prettier,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } },
		rules: {
			// TypeScript already reports undefined names, with types.
			'no-undef': 'off',
			// The app is served at the root (no paths.base), so plain hrefs are correct.
			'svelte/no-navigation-without-resolve': 'off',
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }
			]
		}
	},
	{
		// Routes call repositories (src/lib/server/repositories) with the viewer; the access layer
		// decides what they may see. No query is written in a route.
		files: ['src/routes/**'],
		rules: {
			'no-restricted-imports': [
				'error',
				{
					patterns: [
						{
							group: ['drizzle-orm', 'drizzle-orm/*'],
							message: 'Routes call repositories in $lib/server/repositories instead.'
						},
						{
							group: [
								'$lib/server/db/schema',
								'$lib/server/db/schema/*',
								'**/db/schema',
								'**/db/schema/*'
							],
							message: 'Routes call repositories in $lib/server/repositories instead.'
						}
					]
				}
			]
		}
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: {
			parserOptions: {
				projectService: true,
				extraFileExtensions: ['.svelte'],
				parser: ts.parser,
				svelteConfig
			}
		}
	},
	{
		// Pure modules (science, units, upload parsing, chart view models): they run unchanged in the
		// browser, on the server and in scripts, so they import no framework, database, Node or DOM.
		files: [
			'src/lib/foundation/**/*.ts',
			'src/lib/geo/**/*.ts',
			'src/lib/thermal/**/*.ts',
			'src/lib/geostats/**/*.ts',
			'src/lib/imports/**/*.ts',
			'src/lib/chart-data/**/*.ts',
			'src/lib/sites/**/*.ts',
			'src/lib/csv/**/*.ts',
			'src/lib/datasets/**/*.ts'
		],
		// Specs and their fixture loaders run in Node under Vitest and may read files.
		ignores: ['**/*.spec.ts', '**/fixtures/**'],
		rules: {
			'no-restricted-imports': ['error', { patterns: PURE_MODULE_IMPORT_BANS }],
			'no-restricted-globals': ['error', ...PURE_MODULE_GLOBAL_BANS]
		}
	}
);
