import { count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { importBatch } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, uploadForImport } from './fixtures';
import { type Client, DEMO_PASSWORD, signIn } from './http';

// A page on another origin must not drive the JSON API with the visitor's session cookie.
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let contributor: Client;
let datasetId: string;
const batches = async () =>
	(await db.select({ n: count() }).from(importBatch).where(eq(importBatch.datasetId, datasetId)))[0]
		.n;

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `Origin check ${Date.now()}`);
});
afterAll(async () => {
	await sql.end();
});

describe('Origin check on state-changing API requests', () => {
	const payload = () => ({ attachmentId: crypto.randomUUID() });

	it('refuses a cookie-carrying POST from another origin with a JSON 403 and changes nothing', async () => {
		for (const origin of ['https://evil.example', 'null', `${testEnv.appUrl()}.evil.example`]) {
			const res = await contributor.json(
				`/api/v1/datasets/${datasetId}/imports`,
				payload(),
				'POST',
				{
					origin
				}
			);
			expect(res.status).toBe(403);
			expect(res.headers.get('content-type')).toContain('application/json');
			expect((await res.json()).error.message).toMatch(/Cross-site request refused/);
		}
		expect(await batches()).toBe(0);
	});

	it('refuses DELETE and PUT from another origin too', async () => {
		for (const method of ['DELETE', 'PUT', 'PATCH']) {
			const res = await contributor.json(`/api/v1/attachments/${crypto.randomUUID()}`, {}, method, {
				origin: 'https://evil.example'
			});
			expect(res.status).toBe(403);
		}
	});

	it('accepts the same requests from the app’s own pages', async () => {
		await uploadForImport(contributor, datasetId, 'origin.csv', gridCsv(3, 'ORIG'));
		expect(await batches()).toBe(1);
	});
});
