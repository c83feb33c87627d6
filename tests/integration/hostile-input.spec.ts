import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, uploadAndPreview } from './fixtures';
import { Client, DEMO_PASSWORD, signIn } from './http';

// Addresses that used to reach PostgreSQL unchecked and answer 500.
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let datasetId: string;
let curator: Client;
beforeAll(async () => {
	[{ id: datasetId }] = await db
		.select({ id: dataset.id })
		.from(dataset)
		.where(and(eq(dataset.status, 'published'), eq(dataset.visibility, 'public')))
		.limit(1);
	curator = await signIn('curator@korvald-survey.example', DEMO_PASSWORD);
});
afterAll(async () => {
	await sql.end();
});

describe('hostile addresses', () => {
	it.each(['page=1e300', 'page=9007199254740993', 'q=KGS%09x', 'quality=nonsense', 'sort=x;drop'])(
		'the dataset page answers ?%s with the page',
		async (query) => {
			const res = await new Client().get(`/datasets/${datasetId}?${query}`);
			expect(res.status).toBe(200);
			expect(await res.text()).toMatch(/data-testid="sites-table"|No sites match this filter/);
		}
	);

	it('answers a NUL anywhere in the address with a clear 400, signed in or not', async () => {
		for (const client of [new Client(), curator]) {
			for (const path of [
				`/datasets/${datasetId}?q=%00`,
				`/datasets/${datasetId}?quality=%00`,
				'/organisations/%00',
				'/invitations/%00',
				'/api/v1/imports/%00'
			]) {
				const res = await client.get(path);
				expect(res.status, path).toBe(400);
				expect(await res.text(), path).toMatch(/NUL character/);
			}
		}
	});

	it('blocks a row with a NUL in a cell in the preview, naming row and site, and writes nothing', async () => {
		const contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
		const id = await createDraftDataset(contributor, `NUL test ${Date.now()}`);
		// Far enough into the file that the upload's text sniffing (first 4 KB) does not see it.
		const csv = gridCsv(300, 'NUL').replace('\nNUL-250;', '\nNUL-25\u00000;');
		const { preview } = await uploadAndPreview(contributor, id, 'nul.csv', csv);
		expect(preview.canImport).toBe(false);
		const issue = preview.issues.find((i: { code: string }) => i.code === 'text.control-character');
		expect(issue.message).toBe(
			'Row 252 (site NUL-25�0), column "site_code": "NUL-25�0" contains the control character U+0000, which cannot be stored; remove it.'
		);
	});
});
