import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { svelteTesting } from '@testing-library/svelte/vite';
import { configDefaults, defineConfig } from 'vitest/config';
import { SLOW_TESTS } from './tests/slow-tests.js';

// Set by scripts/test.js: 'fast' for `npm test`, 'slow' for `npm run test:slow`, unset for both.
const tier = process.env.THERMALITH_TEST_TIER;

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: { host: '127.0.0.1' },
	test: {
		expect: { requireAssertions: true },
		projects: [
			{
				extends: './vite.config.ts',
				test: {
					name: 'server',
					environment: 'node',
					include: ['src/**/*.spec.ts'],
					exclude: ['src/**/*.svelte.spec.ts']
				}
			},
			{
				extends: './vite.config.ts',
				plugins: [svelteTesting()],
				test: {
					name: 'client',
					environment: 'jsdom',
					setupFiles: ['tests/setup/jsdom.ts'],
					include: ['src/**/*.svelte.spec.ts']
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					environment: 'node',
					include: tier === 'slow' ? SLOW_TESTS : ['tests/integration/**/*.spec.ts'],
					exclude: [...configDefaults.exclude, ...(tier === 'fast' ? SLOW_TESTS : [])],
					// One shared database: files run one after another so fixtures never race.
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'e2e',
					environment: 'node',
					include: ['tests/e2e/**/*.e2e.ts'],
					fileParallelism: false,
					// After the other projects (which run together in group 0): the browser tests share
					// the app and database with the integration tests, and their timeouts should not
					// depend on how hard those are hitting the app at the same moment.
					sequence: { groupOrder: 1 },
					testTimeout: 60_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
