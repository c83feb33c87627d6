import { and, eq } from 'drizzle-orm';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { visibleDatasets } from '../../src/lib/server/access';
import { createDb } from '../../src/lib/server/db/client';
import {
	accessGrant,
	accessRequest,
	auditEvent,
	dataset,
	site,
	user,
	type NewDataset
} from '../../src/lib/server/db/schema';
import { runEmbargoRelease } from '../../src/lib/server/jobs/embargo-release';
import type { OutgoingMail } from '../../src/lib/server/jobs/mail-queue';
import { SCHEDULES } from '../../src/lib/server/jobs/queues';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn, waitForMail } from './http';

/*
 * Embargo release, access requests and grants (src/lib/server/access/README.md, "Sharing"),
 * through the app as people use it, plus the release job run with an injected clock.
 */
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const ORG = 'org-korvald-survey';
const run = Date.now().toString(36);
const DAY_MS = 86_400_000;
const day = (offset: number) => new Date(Date.now() + offset * DAY_MS).toISOString().slice(0, 10);
const CURATOR = 'curator@korvald-survey.example';
const OWNER = 'owner@korvald-survey.example';
const CONTRIBUTOR = 'contributor@korvald-survey.example';
const LINDMARK_OWNER = 'owner@lindmark-thermics.example';
const PASSWORD = 'sharing-test-password-1';
const PURPOSE = 'A heat-flow compilation of the northern margin for a PhD chapter.';

let curator: Client;
let contributor: Client;
let contributorId = '';

/** A new signed-in account outside every organisation, with its id. */
async function newOutsider(name: string) {
	const email = `${name}-${run}@example.test`;
	const res = await new Client().post('/sign-up', {
		name: `Sharing ${name}`,
		email,
		password: PASSWORD,
		confirm: PASSWORD
	});
	expect(res.status).toBe(303);
	const [u] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
	return { email, id: u.id, client: await signIn(email, PASSWORD) };
}

/** A dataset of the organisation with one site of a recognisable value and code. */
async function datasetWith(state: Partial<NewDataset>, heatFlowMWm2: number, name: string) {
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: ORG,
			title: `Sharing ${name} ${run}`,
			licence: 'CC-BY-4.0',
			status: 'published',
			createdBy: contributorId,
			...state
		} as NewDataset)
		.returning({ id: dataset.id, title: dataset.title });
	const code = `SH-${name}-${run}`;
	const [s] = await db
		.insert(site)
		.values({ datasetId: d.id, code, location: { lon: 12.34, lat: 61.27 }, heatFlowMWm2 })
		.returning({ id: site.id });
	return { ...d, siteId: s.id, code };
}

const auditOf = async (datasetId: string) =>
	(await db.select().from(auditEvent).where(eq(auditEvent.datasetId, datasetId))).map(
		(a) => a.action
	);

/** Everything an outsider could read a site's value or code from. */
async function outsiderReads(client: Client, d: { id: string; siteId: string }) {
	const parts = await Promise.all([
		client.get(`/datasets/${d.id}`).then((r) => r.text()),
		client.get(`/datasets/${d.id}/__data.json`).then((r) => r.text()),
		client.get(`/datasets/${d.id}/about`).then((r) => r.text()),
		client.get(`/sites/${d.siteId}`).then((r) => r.text()),
		client.get(`/api/v1/sites.geojson?bbox=12,61,13,62`).then((r) => r.text()),
		client.get(`/ogc/collections/sites/items/${d.siteId}?f=json`).then((r) => r.text())
	]);
	return parts.join('\n');
}

beforeAll(async () => {
	curator = await signIn(CURATOR, DEMO_PASSWORD);
	contributor = await signIn(CONTRIBUTOR, DEMO_PASSWORD);
	const [c] = await db.select({ id: user.id }).from(user).where(eq(user.email, CONTRIBUTOR));
	contributorId = c.id;
});
afterAll(async () => {
	await sql.end();
});

describe('embargo release with an injected clock', () => {
	it('a value changed under embargo reaches an outsider only once the release day comes', async () => {
		const release = day(1);
		const d = await datasetWith({ visibility: 'embargoed', embargoUntil: release }, 81.5173, 'EMB');
		const anonymous = new Client();
		const outsider = (await newOutsider('embargo-outsider')).client;
		// A correction while under embargo (a stand-in for a new version's value).
		await db.update(site).set({ heatFlowMWm2: 93.217 }).where(eq(site.id, d.siteId));
		for (const c of [anonymous, outsider]) {
			const seen = await outsiderReads(c, d);
			expect(seen).toContain(d.title); // the public summary
			expect(seen).not.toContain('93.217');
			expect(seen).not.toContain('81.5173');
			expect(seen).not.toContain(d.code);
		}

		const mails: OutgoingMail[] = [];
		const send = async (m: OutgoingMail) => void mails.push(m);
		// The day before: nothing is released.
		expect(
			await runEmbargoRelease(db, new Date(`${day(0)}T23:59:59Z`), send, 'http://x')
		).not.toContain(d.id);
		expect(await outsiderReads(anonymous, d)).not.toContain('93.217');

		// The release day: public, recorded without an actor, owner and creator told.
		const released = await runEmbargoRelease(
			db,
			new Date(`${release}T00:02:00Z`),
			send,
			'http://x'
		);
		expect(released).toContain(d.id);
		const [now] = await db.select().from(dataset).where(eq(dataset.id, d.id));
		expect(now.visibility).toBe('public');
		const [audit] = await db
			.select()
			.from(auditEvent)
			.where(and(eq(auditEvent.datasetId, d.id), eq(auditEvent.action, 'release')));
		expect(audit).toMatchObject({ actorId: null, organisationId: ORG });
		const told = mails.filter((m) => m.subject.startsWith(`"${d.title}" is now public`));
		expect(told.map((m) => m.to)).toEqual(expect.arrayContaining([CONTRIBUTOR, OWNER]));
		for (const c of [anonymous, outsider]) expect(await outsiderReads(c, d)).toContain('93.217');

		// A second pass releases nothing again.
		expect(
			await runEmbargoRelease(db, new Date(`${release}T01:02:00Z`), send, 'http://x')
		).not.toContain(d.id);
	});

	it('is scheduled on the job queue by the running app', async () => {
		const pg = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
		try {
			await expect
				.poll(
					async () =>
						(await pg`SELECT cron FROM pgboss.schedule WHERE name = 'embargo-release'`).map(
							(r) => r.cron
						),
					{ timeout: 30_000 }
				)
				.toEqual([SCHEDULES.embargoRelease]);
		} finally {
			await pg.end();
		}
	});

	it('refuses a new embargo whose release date is past, and changes nothing', async () => {
		const title = `Sharing past embargo ${run}`;
		const created = await contributor.post('/datasets/new', {
			organisationId: ORG,
			title,
			licence: 'CC-BY-4.0',
			abstract: '',
			keywords: '',
			citation: '',
			doi: '',
			visibility: 'embargoed',
			embargoUntil: day(-1)
		});
		expect(created.status).toBe(400);
		expect(await created.text()).toContain(
			'The release date of a new embargo cannot be in the past.'
		);
		expect(await db.select().from(dataset).where(eq(dataset.title, title))).toEqual([]);

		const d = await datasetWith({ status: 'draft', visibility: 'private' }, 60, 'PAST');
		const res = await contributor.post(`/datasets/${d.id}?/update`, {
			title: d.title,
			licence: 'CC-BY-4.0',
			abstract: '',
			keywords: '',
			citation: '',
			doi: '',
			visibility: 'embargoed',
			embargoUntil: day(-3)
		});
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('The release date of a new embargo cannot be in the past.');
		const [after] = await db.select().from(dataset).where(eq(dataset.id, d.id));
		expect(after).toMatchObject({ visibility: 'private', embargoUntil: null });
		expect(await auditOf(d.id)).toEqual([]);
	});
});

describe('access requests and grants', () => {
	it('request → approve with a last day: both sides mailed, the grantee sees the values until then', async () => {
		const d = await datasetWith({ visibility: 'restricted' }, 77.123, 'REQ');
		const asker = await newOutsider('requester');
		expect(await outsiderReads(asker.client, d)).not.toContain('77.123');

		const asked = await asker.client.post(`/datasets/${d.id}/about`, { purpose: PURPOSE });
		expect(asked.status).toBe(200);
		const notice = await waitForMail(CURATOR, `Access requested to "${d.title}"`);
		expect(notice.text).toContain(PURPOSE);
		expect(notice.text).toContain(`/datasets/${d.id}`);
		// A second request while the first is open: 403, nothing added.
		const again = await asker.client.post(`/datasets/${d.id}/about`, { purpose: PURPOSE });
		expect(again.status).toBe(403);
		expect(await again.text()).toContain('You asked for access to this dataset already');

		const [request] = await db
			.select()
			.from(accessRequest)
			.where(eq(accessRequest.datasetId, d.id));
		// The curator sees the queue on the dataset page.
		expect(await (await curator.get(`/datasets/${d.id}`)).text()).toContain(PURPOSE);
		// … and on the organisation page; a contributor, who may not answer, sees no queue.
		const orgPage = await (await curator.get('/organisations/korvald-survey')).text();
		expect(orgPage.slice(orgPage.indexOf('pending-access-requests'))).toContain(d.id);
		expect(await (await contributor.get('/organisations/korvald-survey')).text()).not.toContain(
			'pending-access-requests'
		);
		const lastDay = day(0);
		const approved = await curator.post(`/datasets/${d.id}?/approve`, {
			requestId: request.id,
			expiresOn: lastDay
		});
		expect(approved.status).toBe(200);
		const granted = await waitForMail(asker.email, `Access granted to "${d.title}"`);
		expect(granted.text).toContain(`until ${lastDay}`);
		expect(await outsiderReads(asker.client, d)).toContain('77.123');
		expect(await auditOf(d.id)).toEqual(expect.arrayContaining(['request', 'grant']));

		// The grant expires without anyone acting: the rule at the next day no longer matches.
		const viewer = { userId: asker.id, emailVerified: false, roles: {}, isPlatformAdmin: false };
		const seenAt = async (at: Date) =>
			(
				await db
					.select({ id: dataset.id })
					.from(dataset)
					.where(and(eq(dataset.id, d.id), visibleDatasets(viewer, at)))
			).length;
		expect(await seenAt(new Date(`${lastDay}T23:59:00Z`))).toBe(1);
		expect(await seenAt(new Date(`${day(1)}T00:00:01Z`))).toBe(0);

		// Answering it again: 403 with a sentence, nothing changed.
		const twice = await curator.post(`/datasets/${d.id}?/decline`, {
			requestId: request.id,
			reason: 'Too late.'
		});
		expect(twice.status).toBe(403);
		expect(await twice.text()).toContain('This request was approved already. Nothing was changed.');
	});

	it('an expired grant does not work; a grant ending today does', async () => {
		const d = await datasetWith({ visibility: 'restricted' }, 66.789, 'EXP');
		const expired = await newOutsider('expired');
		const current = await newOutsider('current');
		await db.insert(accessGrant).values([
			{ datasetId: d.id, userId: expired.id, expiresOn: day(-1) },
			{ datasetId: d.id, userId: current.id, expiresOn: day(0) }
		]);
		expect(await outsiderReads(expired.client, d)).not.toContain('66.789');
		expect(await outsiderReads(current.client, d)).toContain('66.789');
	});

	it('decline needs a reason and tells the requester; the reason shows on the summary', async () => {
		const d = await datasetWith({ visibility: 'embargoed', embargoUntil: day(30) }, 55.5719, 'DEC');
		const asker = await newOutsider('declined');
		expect((await asker.client.post(`/datasets/${d.id}/about`, { purpose: PURPOSE })).status).toBe(
			200
		);
		const [request] = await db
			.select()
			.from(accessRequest)
			.where(eq(accessRequest.datasetId, d.id));
		const bare = await curator.post(`/datasets/${d.id}?/decline`, {
			requestId: request.id,
			reason: ' '
		});
		expect(bare.status).toBe(400);
		expect(await bare.text()).toContain('Give a reason');
		const reason = 'The data are under review by a partner until the release.';
		expect(
			(await curator.post(`/datasets/${d.id}?/decline`, { requestId: request.id, reason })).status
		).toBe(200);
		expect(
			(await waitForMail(asker.email, `Access request to "${d.title}" declined`)).text
		).toContain(reason);
		expect(await (await asker.client.get(`/datasets/${d.id}/about`)).text()).toContain(reason);
		expect(await auditOf(d.id)).toEqual(expect.arrayContaining(['request', 'decline']));
		expect(await outsiderReads(asker.client, d)).not.toContain('55.5719');
	});

	it('grants directly to an address or an organisation; refuses an unknown address; revokes', async () => {
		const d = await datasetWith({ visibility: 'restricted' }, 44.321, 'GRANT');
		const person = await newOutsider('direct');
		const unknown = `nobody-${run}@example.test`;
		const refused = await curator.post(`/datasets/${d.id}?/grant`, { email: unknown });
		expect(refused.status).toBe(400);
		expect(await refused.text()).toContain(`No Thermalith account uses ${unknown}`);
		expect(await db.select().from(accessGrant).where(eq(accessGrant.datasetId, d.id))).toEqual([]);

		expect((await curator.post(`/datasets/${d.id}?/grant`, { email: person.email })).status).toBe(
			200
		);
		await waitForMail(person.email, `Access granted to "${d.title}"`);
		expect(await outsiderReads(person.client, d)).toContain('44.321');

		const lindmark = await signIn(LINDMARK_OWNER, DEMO_PASSWORD);
		expect(await outsiderReads(lindmark, d)).not.toContain('44.321');
		const toOrg = await curator.post(`/datasets/${d.id}?/grant`, {
			organisationId: 'org-lindmark-thermics'
		});
		expect(toOrg.status).toBe(200);
		expect(await outsiderReads(lindmark, d)).toContain('44.321');

		const [personal] = await db
			.select()
			.from(accessGrant)
			.where(and(eq(accessGrant.datasetId, d.id), eq(accessGrant.userId, person.id)));
		// Wrong role: a contributor may not revoke (403 with a sentence, nothing changed).
		const byContributor = await contributor.post(`/datasets/${d.id}?/revoke`, {
			grantId: personal.id
		});
		expect(byContributor.status).toBe(403);
		expect(await byContributor.text()).toContain(
			'Only curators and owners of its organisation may revoke access.'
		);
		expect(await outsiderReads(person.client, d)).toContain('44.321');

		expect((await curator.post(`/datasets/${d.id}?/revoke`, { grantId: personal.id })).status).toBe(
			200
		);
		await waitForMail(person.email, `Access to "${d.title}" revoked`);
		expect(await outsiderReads(person.client, d)).not.toContain('44.321');
		const twice = await curator.post(`/datasets/${d.id}?/revoke`, { grantId: personal.id });
		expect(twice.status).toBe(403);
		expect(await twice.text()).toContain('This grant was revoked already.');
		const actions = await auditOf(d.id);
		expect(actions.filter((a) => a === 'grant')).toHaveLength(2);
		expect(actions.filter((a) => a === 'revoke')).toHaveLength(1);
	});

	it('refuses sharing by the wrong role or in the wrong state, changing nothing', async () => {
		const draft = await datasetWith({ status: 'draft', visibility: 'restricted' }, 40, 'DRAFT');
		const priv = await datasetWith({ visibility: 'private' }, 40, 'PRIV');
		const restricted = await datasetWith({ visibility: 'restricted' }, 40, 'ROLE');
		const person = await newOutsider('wrong');
		for (const d of [draft, priv]) {
			const res = await curator.post(`/datasets/${d.id}?/grant`, { email: person.email });
			expect(res.status).toBe(403);
			expect(await res.text()).toContain(
				'Access is granted only to published restricted or embargoed datasets. Nothing was changed.'
			);
		}
		const byContributor = await contributor.post(`/datasets/${restricted.id}?/grant`, {
			email: person.email
		});
		expect(byContributor.status).toBe(403);
		expect(await byContributor.text()).toContain(
			'Only curators and owners of its organisation may grant access.'
		);
		// A member asking for access to their own organisation's dataset.
		const own = await contributor.post(`/datasets/${restricted.id}/about`, { purpose: PURPOSE });
		expect(own.status).toBe(403);
		expect(await own.text()).toContain('You can see this dataset already');
		// Outsiders cannot ask for a private dataset: it is not even there for them.
		expect(
			(await person.client.post(`/datasets/${priv.id}/about`, { purpose: PURPOSE })).status
		).toBe(404);
		for (const d of [draft, priv, restricted]) {
			expect(await db.select().from(accessGrant).where(eq(accessGrant.datasetId, d.id))).toEqual(
				[]
			);
			expect(
				await db.select().from(accessRequest).where(eq(accessRequest.datasetId, d.id))
			).toEqual([]);
			expect(await auditOf(d.id)).toEqual([]);
		}
	});
});
