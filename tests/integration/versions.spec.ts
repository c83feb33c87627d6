import { and, desc, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import {
	auditEvent,
	conductivitySample,
	dataset,
	siteComputation,
	site,
	temperatureLog,
	user
} from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * Versions (src/lib/server/repositories/versions.ts): a published dataset is corrected through a
 * new draft version, by each kind of viewer allowed or refused; the diff against the previous
 * version; publishing supersedes the old one, which stays readable; deleting is refused once
 * published.
 */
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const ORG = 'org-korvald-survey';
const run = Date.now().toString(36);
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
/** A box far from the demo data and the other specs' sites. */
const LON = 140 + (Date.now() % 1000) / 1000;

beforeAll(async () => {
	clients.anonymous = new Client();
	for (const [k, email] of Object.entries(EMAIL))
		clients[k as Kind] = await signIn(email, DEMO_PASSWORD);
});
afterAll(async () => {
	await sql.end();
});

/** A published public dataset with sites A, B, C; site A has a log, a sample and a computation. */
async function publishedDataset(label: string) {
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: ORG,
			title: `Versions ${label} ${run}`,
			licence: 'CC-BY-4.0',
			status: 'published',
			visibility: 'public',
			publishedAt: new Date('2025-06-01T00:00:00Z')
		})
		.returning();
	const sites = await db
		.insert(site)
		.values(
			['A', 'B', 'C'].map((c, i) => ({
				datasetId: d.id,
				code: `${c}-${run}`,
				name: `Site ${c}`,
				location: { lon: LON + i * 0.01, lat: -45 },
				heatFlowMWm2: 60 + i,
				corrections: ['topographic']
			}))
		)
		.returning({ id: site.id, code: site.code });
	const a = sites.find((s) => s.code.startsWith('A-'))!;
	const [log] = await db
		.insert(temperatureLog)
		.values({ siteId: a.id, name: 'log A', depthM: [10, 20, 30], temperatureC: [8, 8.5, 9] })
		.returning({ id: temperatureLog.id });
	await db
		.insert(conductivitySample)
		.values({ siteId: a.id, topM: 10, bottomM: 30, conductivityWmK: 2.5, sigmaWmK: 0.1 });
	await db.insert(siteComputation).values({
		siteId: a.id,
		logId: log.id,
		method: 'interval',
		fromM: 10,
		toM: 30,
		heatFlowMWm2: 125,
		sigmaMWm2: 5,
		gradientKPerKm: 50,
		sigmaGradientKPerKm: 1,
		meanConductivityWmK: 2.5,
		samples: 1,
		engineVersion: 'test'
	});
	return d;
}

const datasetRow = async (id: string) =>
	(await db.select().from(dataset).where(eq(dataset.id, id)))[0];
const successorOf = async (id: string) =>
	(await db.select().from(dataset).where(eq(dataset.previousVersionId, id)))[0];
/** The page's HTML without Svelte's hydration markers, so text can be matched. */
const page = async (k: Kind, id: string) =>
	(await (await clients[k].get(`/datasets/${id}`)).text()).replace(/<!--[^>]*-->/g, '');
const testid = (html: string, id: string) =>
	html.match(new RegExp(`data-testid="${id}"[^>]*>([\\s\\S]*?)</`))?.[1].trim() ?? null;

describe('correct a published dataset (?/correct)', () => {
	const expected: Record<Kind, number> = {
		anonymous: 401,
		outsider: 403,
		platformAdmin: 403,
		orgViewer: 403,
		contributor: 303,
		curator: 303,
		owner: 303
	};

	it.each(kinds)('as %s', async (k) => {
		const d = await publishedDataset(`correct by ${k}`);
		const res = await clients[k].post(`/datasets/${d.id}?/correct`, {});
		expect(res.status).toBe(expected[k]);
		const next = await successorOf(d.id);
		if (expected[k] !== 303) {
			expect(next).toBeUndefined();
			if (res.status === 403) expect(await res.text()).toContain('Only the latest published');
			return;
		}
		expect(res.headers.get('location')).toBe(`/datasets/${next.id}?correcting=new`);
		expect(next).toMatchObject({
			status: 'draft',
			version: 2,
			title: d.title,
			licence: 'CC-BY-4.0',
			visibility: 'public',
			supersededById: null,
			publishedAt: null
		});
		// The published version is untouched.
		expect(await datasetRow(d.id)).toMatchObject({ status: 'published', supersededById: null });
		// Sites, logs, samples and computations copied; the computation points at the copied log.
		const copied = await db.select().from(site).where(eq(site.datasetId, next.id));
		expect(copied.map((s) => s.code).sort()).toEqual(['A', 'B', 'C'].map((c) => `${c}-${run}`));
		expect(copied.find((s) => s.code === `B-${run}`)).toMatchObject({
			name: 'Site B',
			heatFlowMWm2: 61,
			corrections: ['topographic']
		});
		const newA = copied.find((s) => s.code === `A-${run}`)!;
		const [log] = await db.select().from(temperatureLog).where(eq(temperatureLog.siteId, newA.id));
		expect(log).toMatchObject({ name: 'log A', depthM: [10, 20, 30] });
		const [sample] = await db
			.select()
			.from(conductivitySample)
			.where(eq(conductivitySample.siteId, newA.id));
		expect(sample.conductivityWmK).toBe(2.5);
		const [comp] = await db
			.select()
			.from(siteComputation)
			.where(eq(siteComputation.siteId, newA.id));
		expect(comp.logId).toBe(log.id);
		const [audit] = await db
			.select()
			.from(auditEvent)
			.where(and(eq(auditEvent.datasetId, next.id), eq(auditEvent.action, 'version')));
		expect(audit).toMatchObject({
			actorEmail: EMAIL[k as keyof typeof EMAIL],
			organisationId: ORG,
			details: { previousVersionId: d.id, version: 2, sites: 3 }
		});
		// Asking again opens the same draft, never a second one.
		const again = await clients[k].post(`/datasets/${d.id}?/correct`, {});
		expect(again.headers.get('location')).toBe(`/datasets/${next.id}?correcting=open`);
	});

	it('is not offered to those who may not, and published datasets offer no import or edit', async () => {
		const d = await publishedDataset('offered');
		expect(await page('curator', d.id)).toContain('Correct this dataset');
		for (const k of ['anonymous', 'orgViewer', 'outsider'] as Kind[]) {
			const html = await page(k, d.id);
			expect(html).toContain(d.title);
			expect(html).not.toContain('Correct this dataset');
		}
		const html = await page('curator', d.id);
		expect(html).not.toContain(`/datasets/${d.id}/import"`);
		expect(html).not.toContain('action="?/update"');
		expect((await clients.curator.get(`/datasets/${d.id}/import`)).status).toBe(403);
		expect((await clients.curator.post(`/datasets/${d.id}?/update`, {})).status).toBe(403);
	});

	it('two people correcting at once share one draft', async () => {
		const d = await publishedDataset('race');
		const [a, b] = await Promise.all([
			clients.curator.post(`/datasets/${d.id}?/correct`, {}),
			clients.owner.post(`/datasets/${d.id}?/correct`, {})
		]);
		const drafts = await db.select().from(dataset).where(eq(dataset.previousVersionId, d.id));
		expect(drafts).toHaveLength(1);
		expect([a.headers.get('location'), b.headers.get('location')].sort()).toEqual([
			`/datasets/${drafts[0].id}?correcting=new`,
			`/datasets/${drafts[0].id}?correcting=open`
		]);
	});
});

describe('diff, publish and supersede', () => {
	let v1: Awaited<ReturnType<typeof publishedDataset>>;
	let v2id = '';

	beforeAll(async () => {
		v1 = await publishedDataset('diff');
		await clients.contributor.post(`/datasets/${v1.id}?/correct`, {});
		v2id = (await successorOf(v1.id)).id;
		// The correction: B's heat flow and position change, C goes, D comes.
		await db
			.update(site)
			.set({ heatFlowMWm2: 66.5, location: { lon: LON + 0.015, lat: -45 } })
			.where(and(eq(site.datasetId, v2id), eq(site.code, `B-${run}`)));
		await db.delete(site).where(and(eq(site.datasetId, v2id), eq(site.code, `C-${run}`)));
		await db.insert(site).values({
			datasetId: v2id,
			code: `D-${run}`,
			location: { lon: LON + 0.03, lat: -45 },
			heatFlowMWm2: 70
		});
	});

	it('shows members the sites added, removed and changed field by field', async () => {
		for (const k of ['curator', 'orgViewer', 'contributor'] as Kind[]) {
			const html = await page(k, v2id);
			expect(testid(html, 'diff-summary')).toMatch(
				/1 added · 1 removed · 1 changed ·\s*1 unchanged/
			);
			expect(testid(html, 'diff-added')).toBe(`D-${run}`);
			expect(testid(html, 'diff-removed')).toBe(`C-${run}`);
			const table = html.slice(html.indexOf('data-testid="diff-changed"'));
			expect(table).toContain('Heat flow');
			expect(table).toMatch(/>61<[\s\S]*>66\.5</);
			expect(table).toContain('Location (longitude, latitude)');
			expect(table).not.toContain('Site name');
			expect(html).toContain('Previous version');
		}
		// Outsiders cannot see the draft at all.
		for (const k of ['anonymous', 'outsider', 'platformAdmin'] as Kind[])
			expect((await clients[k].get(`/datasets/${v2id}`)).status).toBe(404);
	});

	it('publishing supersedes the previous version, which stays readable and leaves the map', async () => {
		expect((await clients.contributor.post(`/datasets/${v2id}?/submit`, {})).status).toBe(200);
		// Two curators publish at once: one wins, the other is told; superseded once.
		const [a, b] = await Promise.all([
			clients.curator.post(`/datasets/${v2id}?/publish`, {}),
			clients.owner.post(`/datasets/${v2id}?/publish`, {})
		]);
		expect([a.status, b.status].sort()).toEqual([200, 403]);
		const loser = a.status === 403 ? a : b;
		expect(await loser.text()).toMatch(/published/);
		const [published] = await db
			.select()
			.from(auditEvent)
			.where(and(eq(auditEvent.datasetId, v2id), eq(auditEvent.action, 'publish')));
		expect(published.details).toMatchObject({ supersedes: v1.id });
		expect(await datasetRow(v1.id)).toMatchObject({ status: 'published', supersededById: v2id });
		const v2 = await datasetRow(v2id);
		expect(v2.status).toBe('published');
		expect(v2.publishedAt).not.toBeNull();

		const old = await page('anonymous', v1.id);
		expect(testid(old, 'superseded-by')).toContain('Superseded by');
		expect(testid(old, 'dataset-status')).toBe('Superseded');
		expect(old).toContain(`href="/datasets/${v2id}"`);
		// Its own citation: version 1, its own year.
		expect(testid(old, 'citation')).toMatch(/\(2025\)\. Versions diff .*, version 1 \[data set\]/);
		const fresh = await page('anonymous', v2id);
		expect(testid(fresh, 'previous-version')).toContain('version 1');
		expect(testid(fresh, 'citation')).toContain('version 2');

		// The map shows the latest version only.
		const bbox = `${LON - 0.01},-45.1,${LON + 0.05},-44.9`;
		const map = await (await clients.anonymous.get(`/api/v1/sites.geojson?bbox=${bbox}`)).json();
		const oldSites = await db.select({ id: site.id }).from(site).where(eq(site.datasetId, v1.id));
		const newSites = await db.select({ id: site.id }).from(site).where(eq(site.datasetId, v2id));
		const onMap = map.features.map((f: { id: string }) => f.id);
		for (const s of oldSites) expect(onMap).not.toContain(s.id);
		for (const s of newSites) expect(onMap).toContain(s.id);

		// Only the latest version is corrected.
		const again = await clients.curator.post(`/datasets/${v1.id}?/correct`, {});
		expect(again.status).toBe(403);
		expect(await successorOf(v2id)).toBeUndefined();
	});
});

/** A day `days` from today (UTC), as YYYY-MM-DD. */
const day = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

describe('embargoing a published dataset by correcting it', () => {
	it('the new version is held back once published; the published one stays as open as it was', async () => {
		const v1 = await publishedDataset('embargo');
		await clients.contributor.post(`/datasets/${v1.id}?/correct`, {});
		const v2id = (await successorOf(v1.id)).id;
		const form = (embargoUntil: string) => ({
			title: v1.title,
			licence: 'CC-BY-4.0',
			abstract: '',
			keywords: '',
			authors: '',
			citation: '',
			doi: '',
			visibility: 'embargoed',
			embargoUntil
		});
		// A release date in the past is refused on the correction too, and nothing changes.
		const past = await clients.contributor.post(`/datasets/${v2id}?/update`, form(day(-2)));
		expect(past.status).toBe(400);
		expect(await past.text()).toContain('The release date of a new embargo cannot be in the past.');
		expect(await datasetRow(v2id)).toMatchObject({ visibility: 'public', embargoUntil: null });
		// Nobody outside the organisation may change the draft (the one 404 for hidden ones).
		expect((await clients.outsider.post(`/datasets/${v2id}?/update`, form(day(5)))).status).toBe(
			404
		);

		const release = day(5);
		expect(
			(await clients.contributor.post(`/datasets/${v2id}?/update`, form(release))).status
		).toBe(200);
		expect(testid(await page('curator', v2id), 'visibility-change')).toMatch(
			new RegExp(`embargoed until ${release}\\. Version 1 stays public`)
		);
		expect((await clients.contributor.post(`/datasets/${v2id}?/submit`, {})).status).toBe(200);
		expect((await clients.curator.post(`/datasets/${v2id}?/publish`, {})).status).toBe(200);
		expect(await datasetRow(v2id)).toMatchObject({
			status: 'published',
			visibility: 'embargoed',
			embargoUntil: release
		});

		// Anyone: version 2 is its summary only; version 1 keeps its values, off the map.
		const v2res = await clients.anonymous.get(`/datasets/${v2id}`);
		expect(v2res.status).toBe(303);
		expect(v2res.headers.get('location')).toBe(`/datasets/${v2id}/about`);
		expect((await clients.anonymous.get(`/datasets/${v2id}/download/sites.csv`)).status).toBe(404);
		const old = await page('anonymous', v1.id);
		expect(old).toContain(`A-${run}`);
		expect(testid(old, 'dataset-status')).toBe('Superseded');
		// Members see version 2 whole.
		expect(await page('orgViewer', v2id)).toContain(`A-${run}`);
	});
});

describe('deleting (?/delete)', () => {
	it('refuses published datasets for everyone; retiring is the way', async () => {
		const d = await publishedDataset('delete published');
		for (const k of ['curator', 'owner'] as Kind[]) {
			const res = await clients[k].post(`/datasets/${d.id}?/delete`, {});
			expect(res.status).toBe(403);
			expect(await res.text()).toContain('Retire it instead');
		}
		expect(await datasetRow(d.id)).toBeDefined();
	});

	it('lets curators and owners delete an unwanted correction; others are refused', async () => {
		const d = await publishedDataset('delete draft');
		await clients.curator.post(`/datasets/${d.id}?/correct`, {});
		const draft = await successorOf(d.id);
		const expected: Record<Kind, number> = {
			anonymous: 401,
			outsider: 404,
			platformAdmin: 404,
			orgViewer: 403,
			contributor: 403,
			curator: 303,
			owner: 303
		};
		for (const k of kinds.filter((x) => expected[x] !== 303)) {
			const res = await clients[k].post(`/datasets/${draft.id}?/delete`, {});
			expect(res.status, k).toBe(expected[k]);
		}
		expect(await datasetRow(draft.id)).toBeDefined();
		const res = await clients.owner.post(`/datasets/${draft.id}?/delete`, {});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/datasets/${d.id}`);
		expect(await datasetRow(draft.id)).toBeUndefined();
		expect(await db.select().from(site).where(eq(site.datasetId, draft.id))).toEqual([]);
		expect(await datasetRow(d.id)).toMatchObject({ status: 'published', supersededById: null });
		const [owner] = await db.select({ id: user.id }).from(user).where(eq(user.email, EMAIL.owner));
		const [row] = await db
			.select()
			.from(auditEvent)
			.where(and(eq(auditEvent.datasetId, draft.id), eq(auditEvent.action, 'delete')))
			.orderBy(desc(auditEvent.at));
		expect(row).toMatchObject({ actorId: owner.id, organisationId: ORG });
		// The dataset can be corrected again afterwards.
		expect((await clients.curator.post(`/datasets/${d.id}?/correct`, {})).status).toBe(303);
		const again = await db
			.select()
			.from(dataset)
			.where(inArray(dataset.previousVersionId, [d.id]));
		expect(again).toHaveLength(1);
	});
});
