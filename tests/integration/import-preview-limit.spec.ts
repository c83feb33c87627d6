import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { USER_RATE_RULES } from '../../src/lib/server/auth/rate-rules';
import { createDb } from '../../src/lib/server/db/client';
import { rateLimit, user } from '../../src/lib/server/db/schema';
import { userRateKey } from '../../src/lib/server/rate-limit';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, uploadForImport } from './fixtures';
import { type Client, DEMO_PASSWORD, signIn } from './http';

// Finding 15: nothing limited how often one user calls the import preview (which validates a
// whole upload). The limit counts per user, so it holds from any address.
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const EMAIL = 'contributor@korvald-survey.example';
let contributor: Client;
let datasetId: string;
let key: string;

beforeAll(async () => {
	const [{ id }] = await db.select({ id: user.id }).from(user).where(eq(user.email, EMAIL));
	key = userRateKey(id, 'import-preview');
	await db.delete(rateLimit).where(eq(rateLimit.key, key));
	contributor = await signIn(EMAIL, DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `Preview limit ${Date.now()}`);
});
afterAll(async () => {
	// Later files preview as the same user.
	await db.delete(rateLimit).where(eq(rateLimit.key, key));
	await sql.end();
});

describe('import preview', () => {
	it('answers 429 with Retry-After once a user is over the limit', async () => {
		const { max } = USER_RATE_RULES['import-preview'];
		const up = await uploadForImport(contributor, datasetId, 'limit.csv', gridCsv(3, 'LIM'));
		const payload = { mapping: up.suggested };
		const url = `/api/v1/imports/${up.batchId}/preview`;
		for (let i = 0; i < max; i++) {
			const res = await contributor.json(url, payload);
			expect(res.status).toBe(200);
		}
		const over = await contributor.json(url, payload);
		expect(over.status).toBe(429);
		expect(Number(over.headers.get('retry-after'))).toBeGreaterThan(0);
		expect((await over.json()).error.message).toMatch(/Too many requests/);
	}, 120_000);
});
