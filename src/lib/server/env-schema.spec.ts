import { describe, expect, it } from 'vitest';
import { validateEnvironment } from '../../../scripts/lib/validate-env.js';
import { envProblems, parseEnv } from './env-schema.js';

const usable = {
	DATABASE_URL: 'postgres://postgres@127.0.0.1:54330/thermalith',
	S3_ENDPOINT: 'http://127.0.0.1:54331',
	S3_BUCKET: 'thermalith',
	S3_ACCESS_KEY_ID: 'key',
	S3_SECRET_ACCESS_KEY: 'secret',
	SMTP_URL: 'smtp://127.0.0.1:54332',
	BETTER_AUTH_SECRET: 'x'.repeat(32)
};

describe('one environment schema for the app and the scripts', () => {
	it('accepts a usable environment and fills in defaults', () => {
		expect(envProblems(usable)).toEqual([]);
		expect(parseEnv(usable).THERMALITH_WORKERS).toBe('on');
		expect(parseEnv(usable).THERMALITH_MAP_INDEX_MAX_SITES).toBe(5_000_000);
	});

	it('takes a map index cap of 0 (off) and refuses a negative one', () => {
		expect(
			parseEnv({ ...usable, THERMALITH_MAP_INDEX_MAX_SITES: '0' }).THERMALITH_MAP_INDEX_MAX_SITES
		).toBe(0);
		expect(envProblems({ ...usable, THERMALITH_MAP_INDEX_MAX_SITES: '-1' })[0]).toMatch(
			/^THERMALITH_MAP_INDEX_MAX_SITES:/
		);
	});

	it('takes a grid thread count of 1 or more and refuses 0 or a fraction', () => {
		expect(parseEnv(usable).THERMALITH_GRID_THREADS).toBeUndefined();
		expect(parseEnv({ ...usable, THERMALITH_GRID_THREADS: '1' }).THERMALITH_GRID_THREADS).toBe(1);
		expect(envProblems({ ...usable, THERMALITH_GRID_THREADS: '0' })[0]).toMatch(
			/^THERMALITH_GRID_THREADS:/
		);
		expect(envProblems({ ...usable, THERMALITH_GRID_THREADS: '1.5' })[0]).toMatch(
			/^THERMALITH_GRID_THREADS:/
		);
	});

	it('names every bad variable, including the ones only the scripts used to check', () => {
		const problems = envProblems({
			...usable,
			PORT: '70000',
			PUBLIC_TILE_URL: 'ftp://tiles.example/{z}/{x}/{y}.png',
			S3_BUCKET: 'x',
			SMTP_URL: undefined
		});
		expect(problems.map((p) => p.split(':')[0]).sort()).toEqual([
			'PORT',
			'PUBLIC_TILE_URL',
			'S3_BUCKET',
			'SMTP_URL'
		]);
	});

	it('the scripts refuse exactly what the app refuses, with the same words', () => {
		const bad = { ...usable, BETTER_AUTH_SECRET: 'short' };
		const [problem] = envProblems(bad);
		expect(() => validateEnvironment(bad)).toThrow(problem);
		expect(() => parseEnv(bad)).toThrow(problem);
		expect(() => validateEnvironment(usable)).not.toThrow();
	});
});
