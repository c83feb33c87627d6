/**
 * PostgreSQL stops (pg_ctl stop -m immediate: every session cut, no goodbye) while an import's
 * transaction is open. The app process must survive, answer 503 while the database is gone, and
 * work again after the restart without being restarted itself; the import must end (never stay
 * "running") and nothing partial of the file may stay.
 * The import is held at a known point, not raced: this test holds a SHARE lock on the site table
 * (reads go on, inserts wait), so the import's transaction waits at its first insert.
 * Written against what a user sees (the batch's status and the dataset's sites), not against how
 * the import runs, so it holds whether the import runs in the request's process or on the queue.
 */
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, importFile } from './fixtures';
import { type Client, DEMO_PASSWORD, signIn } from './http';

const PG_CTL = '/usr/lib/postgresql/15/bin/pg_ctl';
const ROWS = 3000;
let contributor: Client;
let datasetId: string;

/** The test cluster's data folder, as `npm test` recorded it. */
function clusterDir(): string {
	const record = path.resolve('storage/test/run/postgres.json');
	return JSON.parse(fs.readFileSync(record, 'utf8')).dataDir;
}

/** pg_ctl as the cluster's owner (the `postgres` user when the tests run as root). */
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

function startCluster() {
	const dir = clusterDir();
	pgCtl(['-D', dir, '-w', '-t', '120', '-l', path.join(dir, 'server.log'), 'start']);
}

async function sitesIn(id: string): Promise<number> {
	const sql = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
	try {
		return (await sql`SELECT count(*)::int AS n FROM site WHERE dataset_id = ${id}`)[0].n;
	} finally {
		await sql.end();
	}
}

interface BatchState {
	status: string;
	error?: string | null;
	doneRows?: number;
}

/** The batch as its owner sees it, or the HTTP status when the app cannot say. */
async function batchState(batchId: string): Promise<BatchState> {
	const res = await contributor.get(`/api/v1/imports/${batchId}`).catch(() => null);
	if (!res) return { status: 'unreachable' };
	if (!res.ok) return { status: `http ${res.status}` };
	return (await res.json()) as BatchState;
}

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `PostgreSQL stop ${Date.now()}`);
});

afterAll(() => {
	// Whatever happened above, leave the cluster running for the files after this one.
	if (pgCtlStatus(['-D', clusterDir(), 'status']).code !== 0) startCluster();
});

describe('PostgreSQL stopped during an import', () => {
	it('answers 503 meanwhile, keeps nothing partial, ends the import, and works after the restart', async () => {
		const csv = gridCsv(ROWS, 'PGSTOP');
		const locker = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
		const lock = locker
			.begin(async (tx) => {
				await tx`LOCK TABLE site IN SHARE MODE`;
				await new Promise(() => {}); // held until the cluster stops
			})
			.catch(() => 'ended by the shutdown');

		// Upload and preview only read the site table; the queued commit then waits on the lock.
		const batchId = await importFile(contributor, datasetId, 'pg-stop.csv', csv);

		// The import's transaction is open and waiting on the lock.
		const watcher = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
		await expect
			.poll(
				async () =>
					(
						await watcher`SELECT count(*)::int AS n FROM pg_stat_activity
							WHERE wait_event_type = 'Lock' AND query ~* '^\\s*insert into "?site"? '`
					)[0].n,
				{ timeout: 120_000, interval: 100 }
			)
			.toBe(1);
		await watcher.end();

		pgCtl(['-D', clusterDir(), '-m', 'immediate', '-w', '-t', '60', 'stop']);
		await lock;
		await locker.end({ timeout: 1 }).catch(() => {});

		// The app is still up and says the database is unavailable (not a 500, not a dropped connection).
		const health = await fetch(`${testEnv.appUrl()}/api/health`);
		expect(health.status).toBe(503);
		expect((await health.json()).services.database.status).toBe('down');
		const meanwhile = await contributor.get(`/api/v1/imports/${batchId}`);
		expect(meanwhile.status).toBe(503);
		expect(meanwhile.headers.get('retry-after')).toBeTruthy();
		expect((await meanwhile.json()).error.message).toMatch(/database is not reachable/);

		startCluster();

		// The app reconnects on its own; the import ends (not left "running").
		await expect
			.poll(async () => (await batchState(batchId)).status, { timeout: 120_000, interval: 500 })
			.toMatch(/^(failed|done)$/);
		const batch = await batchState(batchId);
		const rows = await sitesIn(datasetId);
		if (batch.status === 'failed') {
			// Run once: the transaction was rolled back and the batch says so.
			expect(batch.error).toMatch(/rolled back; nothing was written/);
			expect(batch.doneRows).toBe(0);
			expect(rows).toBe(0);
		} else {
			// Run again by a job queue once the database was back: all of it, once.
			expect(rows).toBe(ROWS);
		}

		// The product works again: health, and a file imports completely.
		expect((await fetch(`${testEnv.appUrl()}/api/health`)).status).toBe(200);
		if (batch.status === 'failed') {
			const againId = await importFile(contributor, datasetId, 'pg-stop.csv', csv, true);
			await expect
				.poll(async () => (await batchState(againId)).status, { timeout: 120_000, interval: 500 })
				.toBe('done');
			expect(await sitesIn(datasetId)).toBe(ROWS);
		}
	}, 420_000);
});
