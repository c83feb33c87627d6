import { and, desc, eq, sql as dsql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { auditEvent, dataset, user } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn, waitForMail } from './http';

/*
 * Each lifecycle transition by each kind of viewer, through the dataset page's form actions:
 * allowed ones change the state, write one audit row and mail those concerned; refused ones
 * answer 401/403/404 with a sentence and change nothing.
 */
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const ORG = 'org-korvald-survey';
const EMAIL = {
	outsider: 'owner@lindmark-thermics.example',
	orgViewer: 'viewer@korvald-survey.example',
	contributor: 'contributor@korvald-survey.example',
	curator: 'curator@korvald-survey.example',
	owner: 'owner@korvald-survey.example',
	platformAdmin: 'admin@thermalith.example'
} as const;
type Kind = 'anonymous' | keyof typeof EMAIL;
const kinds: Kind[] = ['anonymous', ...(Object.keys(EMAIL) as (keyof typeof EMAIL)[])];
const clients = {} as Record<Kind, Client>;
let contributorId = '';

beforeAll(async () => {
	clients.anonymous = new Client();
	for (const [k, email] of Object.entries(EMAIL))
		clients[k as Kind] = await signIn(email, DEMO_PASSWORD);
	const [c] = await db.select({ id: user.id }).from(user).where(eq(user.email, EMAIL.contributor));
	contributorId = c.id;
});
afterAll(async () => {
	await sql.end();
});

/** A public dataset of the organisation in a given state, created by the contributor. */
async function datasetIn(status: 'draft' | 'in_review' | 'published', title: string) {
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: ORG,
			title: `${title} ${Date.now()}`,
			licence: 'CC-BY-4.0',
			status,
			visibility: 'public',
			createdBy: contributorId
		})
		.returning({ id: dataset.id, title: dataset.title });
	return d;
}
const statusOf = async (id: string) =>
	(await db.select({ s: dataset.status }).from(dataset).where(eq(dataset.id, id)))[0].s;
const auditOf = (id: string) =>
	db.select().from(auditEvent).where(eq(auditEvent.datasetId, id)).orderBy(desc(auditEvent.at));

const ROLE_SENTENCE = {
	submit: 'Only contributors, curators and owners of its organisation may submit a dataset.',
	return: 'Only curators and owners of its organisation may return a dataset.',
	publish: 'Only curators and owners of its organisation may publish a dataset.',
	retire: 'Only curators and owners of its organisation may retire a dataset.'
};

/**
 * Expected answer per transition and viewer kind. The datasets are public, so outsiders and the
 * platform administrator cannot see them before publication (404) and are refused after (403).
 */
const TABLE = [
	{
		name: 'submit',
		from: 'draft',
		to: 'in_review',
		expected: {
			anonymous: 401,
			outsider: 404,
			platformAdmin: 404,
			orgViewer: 403,
			contributor: 200,
			curator: 200,
			owner: 200
		}
	},
	{
		name: 'return',
		from: 'in_review',
		to: 'returned',
		expected: {
			anonymous: 401,
			outsider: 404,
			platformAdmin: 404,
			orgViewer: 403,
			contributor: 403,
			curator: 200,
			owner: 200
		}
	},
	{
		name: 'publish',
		from: 'in_review',
		to: 'published',
		expected: {
			anonymous: 401,
			outsider: 404,
			platformAdmin: 404,
			orgViewer: 403,
			contributor: 403,
			curator: 200,
			owner: 200
		}
	},
	{
		name: 'retire',
		from: 'published',
		to: 'retired',
		expected: {
			anonymous: 401,
			outsider: 403,
			platformAdmin: 403,
			orgViewer: 403,
			contributor: 403,
			curator: 200,
			owner: 200
		}
	}
] as const;

describe.each(TABLE)('$name ($from → $to)', ({ name, from, to, expected }) => {
	it.each(kinds)('as %s', async (k) => {
		const d = await datasetIn(from, `Lifecycle ${name} by ${k}`);
		const res = await clients[k].post(`/datasets/${d.id}?/${name}`, {
			comment: 'Please give the conductivity method of every site.'
		});
		expect(res.status).toBe(expected[k]);
		const audit = await auditOf(d.id);
		if (expected[k] === 200) {
			expect(await statusOf(d.id)).toBe(to);
			expect(audit).toHaveLength(1);
			expect(audit[0]).toMatchObject({
				action: name,
				actorEmail: EMAIL[k as keyof typeof EMAIL],
				organisationId: ORG,
				details: { from, to }
			});
		} else {
			expect(await statusOf(d.id)).toBe(from);
			expect(audit).toEqual([]);
			if (expected[k] === 403) expect(await res.text()).toContain(ROLE_SENTENCE[name]);
		}
	});
});

describe('refusals from the wrong state', () => {
	it.each([
		['publish', 'draft', 'This dataset is a draft; only datasets in review can be published.'],
		[
			'submit',
			'in_review',
			'This dataset is in review; only drafts and returned datasets can be submitted.'
		],
		['retire', 'in_review', 'This dataset is in review; only published datasets can be retired.'],
		['return', 'published', 'This dataset is published; only datasets in review can be returned.']
	] as const)('%s from %s: 403 with a sentence, nothing changed', async (name, from, sentence) => {
		const d = await datasetIn(from, `Wrong state ${name}`);
		const res = await clients.curator.post(`/datasets/${d.id}?/${name}`, { comment: 'x' });
		expect(res.status).toBe(403);
		const body = await res.text();
		expect(body).toContain(sentence);
		expect(body).toContain('Nothing was changed.');
		expect(await statusOf(d.id)).toBe(from);
		expect(await auditOf(d.id)).toEqual([]);
	});

	it('refuses a return without a comment', async () => {
		const d = await datasetIn('in_review', 'Return without comment');
		const res = await clients.curator.post(`/datasets/${d.id}?/return`, { comment: '   ' });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('returning a dataset needs a comment');
		expect(await statusOf(d.id)).toBe('in_review');
		expect(await auditOf(d.id)).toEqual([]);
	});
});

describe('the round trip, with mail', () => {
	it('submit → return with a comment → resubmit → publish, each mailed to those concerned', async () => {
		const d = await datasetIn('draft', 'Round trip');
		expect((await clients.contributor.post(`/datasets/${d.id}?/submit`, {})).status).toBe(200);
		const toCurator = await waitForMail(EMAIL.curator, `"${d.title}" was submitted`);
		expect(toCurator.text).toContain(`/datasets/${d.id}`);
		await waitForMail(EMAIL.owner, `"${d.title}" was submitted`);

		const comment = 'Site KGS-7 has no uncertainty; add it.';
		expect((await clients.curator.post(`/datasets/${d.id}?/return`, { comment })).status).toBe(200);
		const returned = await waitForMail(EMAIL.contributor, `"${d.title}" was returned`);
		expect(returned.text).toContain(comment);
		// The contributor sees the comment on the page.
		expect(await (await clients.contributor.get(`/datasets/${d.id}`)).text()).toContain(comment);

		expect((await clients.contributor.post(`/datasets/${d.id}?/submit`, {})).status).toBe(200);
		expect((await clients.owner.post(`/datasets/${d.id}?/publish`, {})).status).toBe(200);
		await waitForMail(EMAIL.contributor, `"${d.title}" was published`);
		expect((await auditOf(d.id)).map((a) => a.action)).toEqual([
			'publish',
			'submit',
			'return',
			'submit'
		]);
		// Published and public: now anyone sees it, with its state in plain words.
		const page = await (await new Client().get(`/datasets/${d.id}`)).text();
		expect(page).toContain('Published');
		expect(page).toContain('Anyone can see it.');
	});
});

describe('two curators publishing at once', () => {
	it('lets exactly one win; the other is told who published it', async () => {
		const d = await datasetIn('in_review', 'Race');
		const [a, b] = await Promise.all([
			clients.curator.post(`/datasets/${d.id}?/publish`, {}),
			clients.owner.post(`/datasets/${d.id}?/publish`, {})
		]);
		expect([a.status, b.status].sort()).toEqual([200, 403]);
		const loser = a.status === 403 ? a : b;
		expect(await loser.text()).toMatch(
			/(Jonas Brekke|Astrid Veum) published it on \d{4}-\d{2}-\d{2}/
		);
		const audit = await auditOf(d.id);
		expect(audit.filter((e) => e.action === 'publish')).toHaveLength(1);
		expect(await statusOf(d.id)).toBe('published');
	});
});

describe('the audit log', () => {
	it('records metadata edits with the fields that changed', async () => {
		const d = await datasetIn('draft', 'Edited');
		const res = await clients.contributor.post(`/datasets/${d.id}?/update`, {
			title: `${d.title} (edited)`,
			abstract: '',
			keywords: '',
			licence: 'CC-BY-4.0',
			citation: 'Korvald Geological Survey (2026). Edited. Thermalith demo.',
			doi: '',
			visibility: 'public',
			embargoUntil: ''
		});
		expect(res.status).toBe(200);
		const [edit] = await auditOf(d.id);
		expect(edit).toMatchObject({ action: 'edit', actorEmail: EMAIL.contributor });
		expect((edit.details as { fields: string[] }).fields.sort()).toEqual(['citation', 'title']);
	});

	it('is append-only: the database refuses to change or delete a row', async () => {
		const d = await datasetIn('draft', 'Append only');
		await clients.contributor.post(`/datasets/${d.id}?/submit`, {});
		// Drizzle wraps the database error; the trigger's message is its cause.
		const refusal = (p: Promise<unknown>) =>
			p.then(
				() => 'accepted',
				(err: Error & { cause?: Error }) => (err.cause ?? err).message
			);
		expect(
			await refusal(
				db.update(auditEvent).set({ action: 'forged' }).where(eq(auditEvent.datasetId, d.id))
			)
		).toMatch(/append-only \(UPDATE refused\)/);
		expect(await refusal(db.delete(auditEvent).where(eq(auditEvent.datasetId, d.id)))).toMatch(
			/append-only \(DELETE refused\)/
		);
		expect(await refusal(db.execute(dsql`TRUNCATE audit_event`))).toMatch(
			/append-only \(TRUNCATE refused\)/
		);
		expect(
			await db
				.select()
				.from(auditEvent)
				.where(and(eq(auditEvent.datasetId, d.id), eq(auditEvent.action, 'submit')))
		).toHaveLength(1);
	});
});
