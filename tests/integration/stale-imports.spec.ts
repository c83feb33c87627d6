import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, importBatch, organisation } from '../../src/lib/server/db/schema';
import { failStaleImports, STALE_IMPORT_MS } from '../../src/lib/server/imports/stale';
import { testEnv } from './env';

const { db, client } = createDb(testEnv.databaseUrl(), { max: 1 });
afterAll(async () => {
	await client.end();
});

describe('interrupted imports', () => {
	it('are marked failed after the stale period, while recent ones keep running', async () => {
		const orgId = `org-stale-${randomUUID()}`;
		await db.insert(organisation).values({ id: orgId, name: 'Stale Org', slug: orgId });
		const [ds] = await db
			.insert(dataset)
			.values({ organisationId: orgId, title: 'stale', licence: 'CC0-1.0' })
			.returning({ id: dataset.id });
		const now = new Date();
		const [old, recent] = await db
			.insert(importBatch)
			.values([
				{
					datasetId: ds.id,
					fileName: 'old.csv',
					fileSha256: 'a'.repeat(64),
					totalRows: 10,
					doneRows: 4,
					createdAt: new Date(now.getTime() - STALE_IMPORT_MS - 1000)
				},
				{
					datasetId: ds.id,
					fileName: 'new.csv',
					fileSha256: 'b'.repeat(64),
					totalRows: 10,
					doneRows: 4,
					createdAt: new Date(now.getTime() - 60_000)
				}
			])
			.returning({ id: importBatch.id });
		expect(await failStaleImports(db, now)).toBeGreaterThanOrEqual(1);
		const [o] = await db.select().from(importBatch).where(eq(importBatch.id, old.id));
		const [r] = await db.select().from(importBatch).where(eq(importBatch.id, recent.id));
		expect(o).toMatchObject({ status: 'failed', doneRows: 0 });
		expect(o.error).toContain('nothing was written');
		expect(r.status).toBe('running');
		await db.delete(organisation).where(eq(organisation.id, orgId));
	});
});
