import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client } from './http';

// Query strings that used to reach PostgreSQL unchecked and answer 500.
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let datasetId: string;
beforeAll(async () => {
	[{ id: datasetId }] = await db
		.select({ id: dataset.id })
		.from(dataset)
		.where(and(eq(dataset.status, 'published'), eq(dataset.visibility, 'public')))
		.limit(1);
});
afterAll(async () => {
	await sql.end();
});

describe('dataset page with hostile query strings', () => {
	it.each([
		'page=1e300',
		'page=9007199254740993',
		'q=%00',
		'q=KGS%00x',
		'quality=%00',
		'method=%00'
	])('answers ?%s with the page, not 500', async (query) => {
		const res = await new Client().get(`/datasets/${datasetId}?${query}`);
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('data-testid="sites-table"');
	});
});
