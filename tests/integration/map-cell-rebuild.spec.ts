/**
 * The map's background rebuild of stale cells (refreshStaleCells) meets a dataset that is being
 * deleted, or was deleted since it was found stale: it skips it quietly and drops its marker,
 * instead of failing on the cells' foreign key.
 */
import { randomUUID } from 'node:crypto';
import postgres from 'postgres';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, organisation, site } from '../../src/lib/server/db/schema';
import { refreshStaleCells } from '../../src/lib/server/repositories/map-cells';
import { testEnv } from './env';

const { db, client } = createDb(testEnv.databaseUrl(), { max: 2 });
const sql = postgres(testEnv.databaseUrl(), { max: 3, onnotice: () => {} });
const orgs: string[] = [];
afterAll(async () => {
	for (const id of orgs) await sql`DELETE FROM organisation WHERE id = ${id}`;
	await sql.end();
	await client.end();
});

/** A draft dataset with three sites (their insert marks it stale). */
async function datasetWithSites(): Promise<string> {
	const orgId = `org-cells-${randomUUID()}`;
	orgs.push(orgId);
	await db.insert(organisation).values({ id: orgId, name: 'Cells Org', slug: orgId });
	const [ds] = await db
		.insert(dataset)
		.values({ organisationId: orgId, title: 'cells', licence: 'CC0-1.0' })
		.returning({ id: dataset.id });
	await db.insert(site).values(
		[0, 1, 2].map((i) => ({
			datasetId: ds.id,
			code: `CELL-${i}`,
			location: { lon: 30 + i, lat: -70 },
			heatFlowMWm2: 60 + i
		}))
	);
	return ds.id;
}

const markers = async (id: string) =>
	(await sql`SELECT count(*)::int AS n FROM map_cell_stale WHERE dataset_id = ${id}`)[0].n;
const cells = async (id: string) =>
	(await sql`SELECT count(*)::int AS n FROM map_cell WHERE dataset_id = ${id}`)[0].n;

describe('map cell rebuild of a deleted dataset', () => {
	it('skips a dataset deleted since it was found stale, and drops its marker', async () => {
		const id = await datasetWithSites();
		expect(await markers(id)).toBe(1);
		await sql`DELETE FROM dataset WHERE id = ${id}`;
		// The sites' delete marked it stale again: the marker outlives the dataset.
		expect(await markers(id)).toBe(1);
		await refreshStaleCells(db, [id]);
		expect(await markers(id)).toBe(0);
		expect(await cells(id)).toBe(0);
	});

	it('does not fail when the dataset is deleted while its rebuild runs', async () => {
		const id = await datasetWithSites();
		// No marker yet and no cells: the rebuild then waits on nothing of the delete's but the
		// dataset row, and reads the sites the delete has not committed away yet. Unchecked, it
		// writes cells for them and fails on the foreign key once the delete commits.
		await sql`DELETE FROM map_cell_stale WHERE dataset_id = ${id}`;
		let commit = () => {};
		const held = new Promise<void>((resolve) => (commit = resolve));
		let deleterPid = 0;
		const deleting = sql.begin(async (tx) => {
			deleterPid = (await tx`SELECT pg_backend_pid() AS pid`)[0].pid;
			await tx`DELETE FROM dataset WHERE id = ${id}`;
			await held;
		});
		await expect.poll(() => deleterPid, { timeout: 10_000, interval: 20 }).not.toBe(0);
		await expect
			.poll(async () => (await sql`SELECT count(*)::int AS n FROM dataset WHERE id = ${id}`)[0].n)
			.toBe(1); // still there for others until the delete commits
		const rebuild = refreshStaleCells(db, [id]).then(
			() => 'done',
			(err: Error) => `failed: ${err.message}`
		);
		// The rebuild is waiting on the open delete.
		await expect
			.poll(
				async () =>
					(
						await sql`SELECT count(*)::int AS n FROM pg_stat_activity
							WHERE ${deleterPid}::int = ANY (pg_blocking_pids(pid))`
					)[0].n,
				{ timeout: 20_000, interval: 50 }
			)
			.toBe(1);
		commit();
		await deleting;
		expect(await rebuild).toBe('done');
		expect(await cells(id)).toBe(0);
		expect(await markers(id)).toBe(0);
	});
});
