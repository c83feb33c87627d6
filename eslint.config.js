import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default ts.config(
	{
		ignores: [
			'build/',
			'build-test/',
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
	}
);
