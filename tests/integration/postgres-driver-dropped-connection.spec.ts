/**
 * postgres.js 3.4.9 ended the app process when PostgreSQL went away under an open transaction:
 * the driver's own ROLLBACK was written from a timer to a socket it had already dropped
 * ("Cannot read properties of null (reading 'write')", an uncaught exception), and the pooled
 * connection kept the stale write, so it could never open again (CONNECT_TIMEOUT for every
 * query it got). patches/postgres+3.4.9.patch (applied by `npm install` through patch-package)
 * fixes both; this test fails without it.
 */
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { testEnv } from './env';

describe('postgres.js when a transaction loses its server session', () => {
	it('rejects the transaction, does not crash, and every pooled connection works again', () => {
		const run = spawnSync(
			process.execPath,
			[
				'--import',
				'tsx',
				path.resolve('tests/integration/helpers/dropped-transaction.ts'),
				testEnv.databaseUrl()
			],
			{ encoding: 'utf8', timeout: 60_000 }
		);
		expect(run.status, run.stderr).toBe(0);
		const result = JSON.parse(run.stdout.trim().split('\n').at(-1)!);
		expect(result.ended).toBe('CONNECTION_CLOSED');
		expect(result.uncaught).toEqual([]);
		expect(result.after).toEqual(['ok', 'ok', 'ok', 'ok']);
	});
});
