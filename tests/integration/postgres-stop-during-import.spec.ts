/**
 * PostgreSQL stops while an import's transaction is open: the import must end as failed with a
 * clear message once the database is back, nothing of the file may stay, and the product must
 * work again without a restart (the same file then imports completely).
 * The import is held at a known point, not raced: this test holds a SHARE lock on the site table
 * (reads go on, inserts wait), so the import's transaction waits at its first insert; then the
 * test cluster is stopped (fast mode drops every session) and started again.
 */
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { count, eq } from 'drizzle-orm';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { site } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, importPayload, waitForImport } from './fixtures';
import { type Client, DEMO_PASSWORD, signIn } from './http';

const PG_CTL = '/usr/lib/postgresql/15/bin/pg_ctl';
let contributor: Client;
let datasetId: string;

/** The test cluster's data folder, as `npm test` recorded it. */
function clusterDir(): string {
	const record = path.resolve('storage/test/run/postgres.json');
	return JSON.parse(fs.readFileSync(record, 'utf8')).dataDir;
}

/** pg_ctl as the cluster's owner (the `postgres` user when the tests run as root); exit code. */
function pgCtlStatus(args: string[]) {
	const asRoot = process.getuid?.() === 0;
	const [cmd, argv] = asRoot
		? ['runuser', ['-u', 'postgres', '--', PG_CTL, ...args]]
		: [PG_CTL, args];
	const result = spawnSync(cmd, argv as string[], { encoding: 'utf8', cwd: '/' });
	return { code: result.status, stderr: result.stderr };
}

function pgCtl(args: string[]) {
	const { code, stderr } = pgCtlStatus(args);
	if (code !== 0) throw new Error(`pg_ctl ${args.join(' ')}: ${stderr}`);
}

async function sitesIn(id: string) {
	const { db, client } = createDb(testEnv.databaseUrl(), { max: 1 });
	try {
		return (await db.select({ n: count() }).from(site).where(eq(site.datasetId, id)))[0].n;
	} finally {
		await client.end();
	}
}

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `PostgreSQL stop ${Date.now()}`);
});

afterAll(() => {
	// Whatever happened above, leave the cluster running for the files after this one.
	const dir = clusterDir();
	if (pgCtlStatus(['-D', dir, 'status']).code !== 0)
		pgCtl(['-D', dir, '-w', '-t', '60', '-l', path.join(dir, 'server.log'), 'start']);
});

describe('PostgreSQL stopped during an import', () => {
	it('ends the import as failed, keeps nothing of it, and works again after the restart', async () => {
		const payload = importPayload('pg-stop.csv', gridCsv(3000, 'PGSTOP'));
		const locker = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
		let release!: () => void;
		const held = new Promise<void>((r) => (release = r));
		const lock = locker
			.begin(async (tx) => {
				await tx`LOCK TABLE site IN SHARE MODE`;
				await held;
			})
			.catch(() => 'ended by the shutdown');

		const started = await contributor.json(`/api/v1/datasets/${datasetId}/imports`, payload);
		expect(started.status).toBe(202);
		const { batchId } = await started.json();

		// The import's transaction is open and waiting on the lock.
		const watcher = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
		await expect
			.poll(
				async () =>
					(
						await watcher`SELECT count(*)::int AS n FROM pg_stat_activity
							WHERE wait_event_type = 'Lock' AND query ILIKE 'insert into "site"%'`
					)[0].n,
				{ timeout: 60_000, interval: 100 }
			)
			.toBe(1);
		await watcher.end();

		const dir = clusterDir();
		pgCtl(['-D', dir, '-m', 'fast', '-w', '-t', '60', 'stop']);
		pgCtl(['-D', dir, '-w', '-t', '60', '-l', path.join(dir, 'server.log'), 'start']);
		// Only now: ending the lock's transaction needs a server to talk to.
		release();
		await lock;
		await locker.end({ timeout: 1 }).catch(() => {});

		// The app reconnects on its own; the import ends as failed with a message, not "running".
		await expect
			.poll(
				async () => {
					const res = await contributor.get(`/api/v1/imports/${batchId}`).catch(() => null);
					return res?.ok ? (await res.json()).status : 'unreachable';
				},
				{ timeout: 60_000, interval: 500 }
			)
			.toBe('failed');
		const batch = await (await contributor.get(`/api/v1/imports/${batchId}`)).json();
		expect(batch.error).toMatch(/rolled back; nothing was written/);
		expect(batch.doneRows).toBe(0);
		expect(await sitesIn(datasetId)).toBe(0);

		// The product works again: health, and the same file imports completely.
		expect((await fetch(`${testEnv.appUrl()}/api/health`)).status).toBe(200);
		const again = await contributor.json(`/api/v1/datasets/${datasetId}/imports`, payload);
		expect(again.status).toBe(202);
		const done = await waitForImport(contributor, (await again.json()).batchId);
		expect(done.status).toBe('done');
		expect(await sitesIn(datasetId)).toBe(3000);
	}, 180_000);
});
