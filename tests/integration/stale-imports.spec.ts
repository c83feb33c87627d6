/**
 * Imports left "running" when a worker starts (its predecessor was restarted or crashed): one
 * rule (`interruptedImportAction`) resumes those with tries left once their heartbeat is stale,
 * and ends those out of tries failed with a message. The queue is injected, so the test sees
 * exactly what would be queued and when.
 */
import { randomUUID } from 'node:crypto';
import { eq, type SQL, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, importBatch, organisation } from '../../src/lib/server/db/schema';
import {
	IMPORT_HEARTBEAT_STALE_S,
	IMPORT_MAX_ATTEMPTS,
	recoverInterruptedImports
} from '../../src/lib/server/imports/interrupted';
import { testEnv } from './env';

const { db, client } = createDb(testEnv.databaseUrl(), { max: 1 });
afterAll(async () => {
	await client.end();
});

describe('interrupted imports at a worker start', () => {
	it('resumes those with tries left once stale, fails those out of tries, and leaves the rest', async () => {
		const orgId = `org-stale-${randomUUID()}`;
		await db.insert(organisation).values({ id: orgId, name: 'Stale Org', slug: orgId });
		try {
			const [ds] = await db
				.insert(dataset)
				.values({ organisationId: orgId, title: 'stale', licence: 'CC0-1.0' })
				.returning({ id: dataset.id });
			const batch = (
				fileName: string,
				values: { attempts?: number; heartbeatAt?: SQL; status?: 'queued' }
			) => ({
				datasetId: ds.id,
				fileName,
				fileSha256: 'a'.repeat(64),
				totalRows: 10,
				doneRows: 4,
				status: 'running' as const,
				...values
			});
			const hourAgo = sql`now() - interval '1 hour'`;
			const rows = await db
				.insert(importBatch)
				.values([
					batch('dead.csv', { attempts: 1, heartbeatAt: hourAgo }),
					batch('dead-thrice.csv', { attempts: IMPORT_MAX_ATTEMPTS, heartbeatAt: hourAgo }),
					batch('alive.csv', { attempts: 1, heartbeatAt: sql`now()` }),
					batch('alive-last-try.csv', { attempts: IMPORT_MAX_ATTEMPTS, heartbeatAt: sql`now()` }),
					batch('queued.csv', { status: 'queued' })
				])
				.returning({ id: importBatch.id });
			const [dead, deadThrice, alive, aliveLastTry, queued] = rows.map((r) => r.id);

			const queuedNow = new Map<string, number>();
			const recovered = await recoverInterruptedImports(
				db,
				async (id, startAfterS) => queuedNow.set(id, startAfterS),
				{ batchIds: rows.map((r) => r.id) }
			);

			expect(recovered.failed).toEqual([deadThrice]);
			expect(recovered.requeued.sort()).toEqual([dead, alive, aliveLastTry].sort());
			// Stale: at once. Fresh heartbeat: once it would be stale (a live worker keeps its batch).
			expect(queuedNow.get(dead)).toBe(0);
			for (const id of [alive, aliveLastTry]) {
				expect(queuedNow.get(id)).toBeGreaterThan(IMPORT_HEARTBEAT_STALE_S - 10);
				expect(queuedNow.get(id)).toBeLessThanOrEqual(IMPORT_HEARTBEAT_STALE_S + 1);
			}
			const status = async (id: string) =>
				(await db.select().from(importBatch).where(eq(importBatch.id, id)))[0];
			expect(await status(deadThrice)).toMatchObject({ status: 'failed', doneRows: 0 });
			expect((await status(deadThrice)).error).toMatch(/interrupted 3 times.*nothing was written/);
			for (const id of [dead, alive, aliveLastTry])
				expect((await status(id)).status).toBe('running');
			expect((await status(queued)).status).toBe('queued');
			expect(queuedNow.has(queued)).toBe(false);
		} finally {
			// The batches go with the organisation's dataset: none is left running for later files.
			await db.delete(organisation).where(eq(organisation.id, orgId));
		}
	});
});
