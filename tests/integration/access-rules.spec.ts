import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from 'vitest';
import { NOT_FOUND_MESSAGE } from '../../src/lib/server/access/not-found';
import { createDb } from '../../src/lib/server/db/client';
import { attachment, importBatch, invitation, user } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { createDraftDataset } from './fixtures';
import { Client, DEMO_PASSWORD, signIn } from './http';

/* Single access rules that the visibility matrix does not show on its own. */

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let contributor: Client;
let curator: Client;
let outsider: Client;
let datasetId: string;
const userIds: Record<string, string> = {};

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	curator = await signIn('curator@korvald-survey.example', DEMO_PASSWORD);
	outsider = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `Access rules ${Date.now()}`);
	for (const who of ['owner', 'contributor']) {
		const [row] = await db
			.select({ id: user.id })
			.from(user)
			.where(eq(user.email, `${who}@korvald-survey.example`));
		userIds[who] = row.id;
	}
});
afterAll(async () => {
	await sql.end();
});

/** A checked file row of the draft, as if uploaded by `who` (no object needed to delete it). */
async function fileBy(who: string) {
	const [row] = await db
		.insert(attachment)
		.values({
			datasetId,
			objectKey: `access-rules/${randomUUID()}/f.txt`,
			fileName: 'f.txt',
			contentType: 'text/plain',
			sizeBytes: 3,
			status: 'ready',
			uploadedBy: userIds[who]
		})
		.returning({ id: attachment.id });
	return row.id;
}
const exists = async (id: string) =>
	(await db.select().from(attachment).where(eq(attachment.id, id))).length === 1;

describe('deleting files', () => {
	it('lets a contributor delete only the files they uploaded', async () => {
		const owners = await fileBy('owner');
		const res = await contributor.json(`/api/v1/attachments/${owners}`, undefined, 'DELETE');
		expect(res.status).toBe(403);
		expect((await res.json()).error.message).toBe(
			'You may delete only files you uploaded; ask a curator of the organisation.'
		);
		expect(await exists(owners)).toBe(true);

		const own = await fileBy('contributor');
		expect((await contributor.json(`/api/v1/attachments/${own}`, undefined, 'DELETE')).status).toBe(
			204
		);
		expect(await exists(own)).toBe(false);
	});

	it('lets a curator (dataset:delete) delete anyone’s file', async () => {
		const owners = await fileBy('owner');
		expect((await curator.json(`/api/v1/attachments/${owners}`, undefined, 'DELETE')).status).toBe(
			204
		);
		expect(await exists(owners)).toBe(false);
	});
});

describe('ids', () => {
	it('answers 404, not 500, for ids that are not UUIDs, on every [id] route', async () => {
		for (const [method, p] of [
			['PUT', '/api/v1/attachments/not-a-uuid/content'],
			['DELETE', '/api/v1/attachments/not-a-uuid'],
			['GET', '/api/v1/attachments/not-a-uuid/download'],
			['GET', '/api/v1/imports/not-a-uuid'],
			['POST', '/api/v1/datasets/not-a-uuid/imports'],
			['GET', '/datasets/not-a-uuid'],
			['GET', '/sites/not-a-uuid']
		]) {
			const res = await contributor.json(p, method === 'GET' ? undefined : {}, method);
			expect(res.status, `${method} ${p}`).toBe(404);
		}
	});

	it('gives an unknown id and a hidden id the same answer, word for word', async () => {
		const hiddenFile = await fileBy('owner');
		const [batch] = await db
			.insert(importBatch)
			// A draft, as a new upload is: the column's default ('running') would leave a batch
			// that looks interrupted to every later test that resumes imports.
			.values({
				datasetId,
				fileName: 'x.csv',
				fileSha256: 'y'.repeat(64),
				totalRows: 0,
				status: 'draft'
			})
			.returning({ id: importBatch.id });
		onTestFinished(async () => {
			await db.delete(importBatch).where(eq(importBatch.id, batch.id));
		});
		const unknown = randomUUID();
		for (const [hidden, template] of [
			[hiddenFile, '/api/v1/attachments/{id}/download'],
			[hiddenFile, '/api/v1/attachments/{id}/thumbnail'],
			[hiddenFile, '/api/v1/attachments/{id}/content'],
			[batch.id, '/api/v1/imports/{id}'],
			[datasetId, '/api/v1/datasets/{id}/imports']
		]) {
			const method =
				template.endsWith('download') ||
				template.endsWith('thumbnail') ||
				template.includes('imports/{id}')
					? 'GET'
					: template.endsWith('content')
						? 'PUT'
						: 'POST';
			const ask = async (id: string) => {
				const res = await outsider.json(
					template.replace('{id}', id),
					method === 'GET' ? undefined : {},
					method
				);
				return { status: res.status, body: await res.json() };
			};
			const a = await ask(hidden);
			const b = await ask(unknown);
			expect(a, template).toEqual(b);
			expect(a).toEqual({
				status: 404,
				body: { error: { code: 'not_found', message: NOT_FOUND_MESSAGE, details: {} } }
			});
		}
		const page = async (id: string) => {
			const res = await outsider.get(`/datasets/${id}`);
			return { status: res.status, h1: (await res.text()).match(/<h1[^>]*>([^<]*)</)?.[1] };
		};
		expect(await page(datasetId)).toEqual(await page(unknown));
		expect((await page(unknown)).h1).toBe(NOT_FOUND_MESSAGE);
	});
});

describe('invitations', () => {
	it('shows someone holding another address’s invitation no organisation, role or state', async () => {
		const owner = await signIn('owner@korvald-survey.example', DEMO_PASSWORD);
		const email = `invited-${randomUUID()}@example.test`;
		const sent = await owner.post('/organisations/korvald-survey/settings?/invite', {
			email,
			role: 'curator'
		});
		expect(sent.status).toBe(200);
		const [inv] = await db.select().from(invitation).where(eq(invitation.email, email));
		const body = await (await outsider.get(`/invitations/${inv.id}/__data.json`)).text();
		expect(body).toContain('forMe');
		for (const secret of ['Korvald Geological Survey', 'curator', 'pending', 'expired'])
			expect(body).not.toContain(secret);
		const html = await (await outsider.get(`/invitations/${inv.id}`)).text();
		expect(html).toContain('This invitation was sent to another e-mail address.');
		expect(html).not.toContain('Korvald Geological Survey');

		// Signed out, the link explains itself and offers both ways in, each coming back to it,
		// and still says nothing of what the invitation is for.
		const anonymous = new Client();
		const page = await anonymous.get(`/invitations/${inv.id}`);
		expect(page.status).toBe(200);
		const signedOut = await page.text();
		const back = encodeURIComponent(`/invitations/${inv.id}`);
		expect(signedOut).toContain(`/sign-in?next=${back}`);
		expect(signedOut).toContain(`/sign-up?next=${back}`);
		for (const secret of ['Korvald Geological Survey', 'curator', 'pending', 'expired'])
			expect(signedOut).not.toContain(secret);
	});
});
