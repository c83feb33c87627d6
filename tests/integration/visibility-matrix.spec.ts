import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOT_FOUND_MESSAGE } from '../../src/lib/server/access/not-found';
import { createDb } from '../../src/lib/server/db/client';
import {
	accessGrant,
	attachment,
	dataset,
	importBatch,
	member,
	organisation,
	site,
	user,
	type NewDataset
} from '../../src/lib/server/db/schema';
import { createS3Client } from '../../src/lib/server/storage-client';
import { KeyClient, keyFor } from './api-key-client';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * The visibility matrix: every visibility state × every viewer kind × every entry point under
 * src/routes, through HTTP as a browser would ask. The expectations are written out as tables
 * here, not derived from the access layer, so a change to the rule must change this file too.
 * The route list is read from the file system: a new route without a row fails the first test.
 */

const ORG = 'org-korvald-survey';
const run = Date.now().toString(36);

/** Visibility states that exist today; `everyone` = visible to people outside the organisation. */
const CASES = {
	'published public': { status: 'published', visibility: 'public', everyone: true, map: true },
	'published, embargo passed': {
		status: 'published',
		visibility: 'embargoed',
		embargoUntil: '2001-01-01',
		everyone: true,
		map: true
	},
	'published, under embargo': {
		status: 'published',
		visibility: 'embargoed',
		embargoUntil: '2999-01-01',
		everyone: false,
		map: true
	},
	'published restricted': {
		status: 'published',
		visibility: 'restricted',
		everyone: false,
		map: true
	},
	'published private': { status: 'published', visibility: 'private', everyone: false, map: true },
	'draft (public once published)': {
		status: 'draft',
		visibility: 'public',
		everyone: false,
		map: true
	},
	'in review': { status: 'in_review', visibility: 'public', everyone: false, map: true },
	'returned for changes': { status: 'returned', visibility: 'public', everyone: false, map: true },
	// Retired stays readable and citable but leaves the maps.
	'retired public': { status: 'retired', visibility: 'public', everyone: true, map: false }
} as const;
type CaseName = keyof typeof CASES;
const caseNames = Object.keys(CASES) as CaseName[];

/**
 * Viewer kinds and the demo account of each; members are those of the datasets' organisation.
 * Grantees are new accounts (signed up here) holding a grant on every case: in force for
 * `grantee`, with its last day yesterday for `expiredGrantee`.
 */
const KINDS = {
	anonymous: null,
	outsider: 'owner@lindmark-thermics.example',
	grantee: `grantee-${run}@example.test`,
	expiredGrantee: `expired-grantee-${run}@example.test`,
	orgViewer: 'viewer@korvald-survey.example',
	contributor: 'contributor@korvald-survey.example',
	curator: 'curator@korvald-survey.example',
	owner: 'owner@korvald-survey.example',
	platformAdmin: 'admin@thermalith.example'
} as const;
type Kind = keyof typeof KINDS;
const kinds = Object.keys(KINDS) as Kind[];
const MEMBERS: Kind[] = ['orgViewer', 'contributor', 'curator', 'owner'];

/** Who may add data (and edit metadata) in each lifecycle state: src/lib/server/access/README.md, "Lifecycle". */
const CHANGERS: Record<string, Kind[]> = {
	draft: ['contributor', 'curator', 'owner'],
	returned: ['contributor', 'curator', 'owner'],
	in_review: ['curator', 'owner'],
	published: [],
	retired: []
};

/** Lifecycle transitions allowed per starting state (lifecycle.spec.ts runs the allowed ones). */
const REVIEWERS: Kind[] = ['curator', 'owner'];
const TRANSITIONS: Record<string, Record<string, Kind[]>> = {
	submit: { draft: CHANGERS.draft, returned: CHANGERS.returned },
	return: { in_review: REVIEWERS },
	publish: { in_review: REVIEWERS },
	retire: { published: REVIEWERS }
};

/**
 * Catalogue entries: published (or retired) restricted and embargoed datasets show their summary
 * to anyone at /datasets/[id]/about; grants work on them only, and only while in force.
 */
const isEntry = (c: CaseName) =>
	['published', 'retired'].includes(CASES[c].status) &&
	['restricted', 'embargoed'].includes(CASES[c].visibility);
const sees = (k: Kind, c: CaseName) =>
	CASES[c].everyone || MEMBERS.includes(k) || (k === 'grantee' && isEntry(c));

/** Who reads this organisation's audit log: its curators and owners, and platform administrators. */
const AUDIT_READERS: Kind[] = ['curator', 'owner', 'platformAdmin'];
const changes = (k: Kind, c: CaseName) => CHANGERS[CASES[c].status].includes(k);

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const s3 = createS3Client(testEnv.s3());
/** The bytes of every case's checked file (the app serves them itself) and of its thumbnail. */
const FILE_BYTES = Buffer.from('matrix-fil');
const THUMB_BYTES = Buffer.from('RIFF-matrix-thumb');
const clients = {} as Record<Kind, Client>;
const ids = {} as Record<CaseName, { dataset: string; site: string; file: string; batch: string }>;
const title = (c: CaseName) => `Matrix ${c} ${run}`;
const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
const BOX = { west: 100, south: -60, east: 101, north: -59 };

const GRANTEE_PASSWORD = 'matrix-grantee-password-1';
const GRANTEES: Kind[] = ['grantee', 'expiredGrantee'];
const granteeIds = {} as Record<Kind, string>;

beforeAll(async () => {
	for (const k of GRANTEES) {
		const res = await new Client().post('/sign-up', {
			name: `Matrix ${k}`,
			email: KINDS[k]!,
			password: GRANTEE_PASSWORD,
			confirm: GRANTEE_PASSWORD
		});
		expect(res.status).toBe(303);
		const [u] = await db.select({ id: user.id }).from(user).where(eq(user.email, KINDS[k]!));
		granteeIds[k] = u.id;
	}
	for (const k of kinds) {
		const email = KINDS[k];
		const password = GRANTEES.includes(k) ? GRANTEE_PASSWORD : DEMO_PASSWORD;
		clients[k] = email ? await signIn(email, password) : new Client();
	}
	const [ownerRow] = await db.select({ id: user.id }).from(user).where(eq(user.email, KINDS.owner));
	for (const [i, c] of caseNames.entries()) {
		const { everyone: _e, map: _m, ...state } = CASES[c];
		const [d] = await db
			.insert(dataset)
			.values({
				organisationId: ORG,
				title: title(c),
				licence: 'CC-BY-4.0',
				...state
			} as NewDataset)
			.returning({ id: dataset.id });
		const [s] = await db
			.insert(site)
			.values({
				datasetId: d.id,
				code: `MX-${i}-${run}`,
				location: { lon: 100.13 + i * 0.05, lat: -59.47 },
				heatFlowMWm2: 70
			})
			.returning({ id: site.id });
		// A checked file uploaded by the owner, stored in the object store with its thumbnail.
		const objectKey = `matrix/${run}/${i}/file.png`;
		const thumbnailKey = `${objectKey}.thumb.webp`;
		for (const [Key, Body] of [
			[objectKey, FILE_BYTES],
			[thumbnailKey, THUMB_BYTES]
		] as const)
			await s3.send(new PutObjectCommand({ Bucket: testEnv.s3().bucket, Key, Body }));
		const [f] = await db
			.insert(attachment)
			.values({
				datasetId: d.id,
				objectKey,
				thumbnailKey,
				fileName: `matrix-${i}-${run}.png`,
				contentType: 'image/png',
				sizeBytes: FILE_BYTES.length,
				sha256: createHash('sha256').update(FILE_BYTES).digest('hex'),
				status: 'ready',
				uploadedBy: ownerRow.id
			})
			.returning({ id: attachment.id });
		const [b] = await db
			.insert(importBatch)
			.values({
				datasetId: d.id,
				fileName: `matrix-import-${i}-${run}.csv`,
				fileSha256: 'x'.repeat(64),
				totalRows: 1,
				doneRows: 1,
				status: 'done'
			})
			.returning({ id: importBatch.id });
		ids[c] = { dataset: d.id, site: s.id, file: f.id, batch: b.id };
		// A grant on every case, so the rule must ignore it where it does not apply.
		await db.insert(accessGrant).values([
			{ datasetId: d.id, userId: granteeIds.grantee },
			{ datasetId: d.id, userId: granteeIds.expiredGrantee, expiresOn: yesterday }
		]);
	}
});

afterAll(async () => {
	await sql.end();
});

/**
 * Grids: each case's dataset gets three more sites in a region of its own, so a grid of that
 * region is made of that case's sites only (three is the fewest a grid takes).
 */
const gridBox = (c: CaseName) => {
	const lon = 110 + caseNames.indexOf(c);
	return [lon, -59.9, lon + 0.9, -59.1];
};
beforeAll(async () => {
	for (const c of caseNames) {
		const [w] = gridBox(c);
		await db.insert(site).values(
			[0, 1, 2].map((q) => ({
				datasetId: ids[c].dataset,
				code: `MXG-${caseNames.indexOf(c)}-${q}-${run}`,
				location: { lon: w + 0.15 + q * 0.3, lat: -59.7 + q * 0.2 },
				heatFlowMWm2: 60 + 7 * q
			}))
		);
	}
});

/** A grid request for a case's region (cells of 10 km, IDW: quick). */
const gridRequest = (k: Kind, c: CaseName) =>
	clients[k].json('/api/v1/grids', { method: 'idw', bbox: gridBox(c), cellSizeM: 10_000 });
/** The owner's grid of each case's region (the owner sees every state), once finished. */
const ownerGrids = new Map<CaseName, Promise<string | null>>();
const ownerGrid = (c: CaseName) => {
	if (!ownerGrids.has(c))
		ownerGrids.set(
			c,
			(async () => {
				const res = await gridRequest('owner', c);
				if (res.status !== 202) return null;
				const { id } = await res.json();
				for (;;) {
					const body = await (await clients.owner.get(`/api/v1/grids/${id}`)).json();
					if (body.status === 'done' || body.status === 'failed') return id as string;
					await new Promise((r) => setTimeout(r, 200));
				}
			})()
		);
	return ownerGrids.get(c)!;
};

/** Anonymous callers of a write endpoint: 401 (API and actions) or a sign-in redirect (pages). */
const ANONYMOUS_WRITE = [401, 303];

/** Expected status of a write through the access layer: hidden 404, not allowed 403, else `ok`. */
function writeStatus(k: Kind, c: CaseName, allowed: boolean, ok: number): number[] {
	if (k === 'anonymous') return ANONYMOUS_WRITE;
	if (!sees(k, c)) return [404];
	return allowed ? [ok] : [403];
}

async function expectHidden(res: Response) {
	expect(res.status).toBe(404);
	const body = await res.text();
	expect(body).toContain(NOT_FOUND_MESSAGE.replace(/:.*/, ''));
	for (const c of caseNames) expect(body).not.toContain(title(c));
}

type Check = { name: string; run: (k: Kind, c: CaseName) => Promise<void> };
type Row = { checks: Check[] } | { none: string };

const statusOf = async (id: string) =>
	(await db.select({ s: dataset.status }).from(dataset).where(eq(dataset.id, id)))[0].s;
const get = (k: Kind, p: string) => clients[k].get(p);
/** A read key of each signed-in kind's account, made on first use (anonymous has none). */
const keys = new Map<Kind, Promise<KeyClient>>();
const keyClient = (k: Kind) => {
	if (!keys.has(k))
		keys.set(
			k,
			keyFor(db, KINDS[k]!).then((made) => new KeyClient(made.key))
		);
	return keys.get(k)!;
};
/**
 * The same GET as the viewer's browser session and as a script with their API key: a key must
 * see exactly what its owner sees. Both answers are returned for the row to check alike.
 */
async function sessionAndKey(k: Kind, p: string): Promise<Response[]> {
	const viaSession = await clients[k].json(p, undefined, 'GET', { accept: 'application/json' });
	if (k === 'anonymous') return [viaSession];
	return [viaSession, await (await keyClient(k)).fetch(p)];
}
const text = async (k: Kind, p: string) => (await get(k, p)).text();
/**
 * Pages that list every case at once are fetched once per viewer kind and read for each case:
 * nothing the rows do changes them, and the app is shared with the end-to-end tests.
 */
const listed = new Map<string, Promise<string>>();
const textOnce = (k: Kind, p: string) => {
	const key = `${k} ${p}`;
	if (!listed.has(key)) listed.set(key, text(k, p));
	return listed.get(key)!;
};

/** Every route under src/routes, keyed by its route id. */
const ROUTES: Record<string, Row> = {
	'/': { none: 'layout only: the signed-in user, no data' },
	'/(public)': {
		checks: [
			{
				name: 'home-page counts (sites, datasets, organisations)',
				run: async (k, c) => {
					// Counts do not depend on the case: check them once per viewer kind.
					if (c !== caseNames[0]) return expect(c).not.toBe(caseNames[0]);
					const html = await text(k, '/');
					const count = (id: string) =>
						Number(html.match(new RegExp(`data-testid="${id}"[^>]*>\\s*(\\d+)`))![1]);
					expect({
						sites: count('count-sites'),
						datasets: count('count-datasets'),
						organisations: count('count-organisations')
					}).toEqual(await expectedCounts(k).then(({ perOrganisation: _, ...counts }) => counts));
				}
			}
		]
	},
	'/(public)/help': { none: 'static help text' },
	'/(public)/help/publish': { none: 'static help text' },
	'/(public)/help/import': { none: 'static help text' },
	'/(public)/help/fix-rows': { none: 'static help text' },
	'/(public)/help/roles': { none: 'static help text built from permissions.ts, no data' },
	'/(public)/help/visibility': { none: 'static help text' },
	'/(public)/help/citing': { none: 'static help text' },
	'/(public)/help/models': { none: 'static help text' },
	'/(public)/api': { none: 'API reference generated from the OpenAPI document: no data' },
	'/(auth)': { none: 'layout only' },
	'/(auth)/sign-in': { none: 'accounts: tests/integration/account-abuse.spec.ts' },
	'/(auth)/sign-up': { none: 'accounts: tests/e2e/accounts.e2e.ts' },
	'/(auth)/sign-out': { none: 'accounts: tests/e2e/accounts.e2e.ts' },
	'/(auth)/verify-email': { none: 'accounts: tests/e2e/accounts.e2e.ts' },
	'/(auth)/forgot-password': { none: 'accounts: tests/e2e/accounts.e2e.ts' },
	'/(auth)/reset-password': { none: 'accounts: tests/e2e/accounts.e2e.ts' },
	'/(app)/account': { none: "the viewer's own account and memberships only" },
	'/(app)/admin': { none: 'accounts and organisations, no datasets: permissions-matrix.spec.ts' },
	'/(app)/map': {
		checks: [
			{
				name: "dataset filter list (datasets on the viewer's maps)",
				run: async (k, c) => {
					const html = await textOnce(k, '/map');
					expect(html.includes(title(c))).toBe(sees(k, c) && CASES[c].map);
				}
			}
		]
	},
	'/(app)/organisations': {
		checks: [
			{
				name: 'organisation cards count only datasets the viewer may open',
				run: async (k, c) => {
					if (c !== caseNames[0]) return expect(c).not.toBe(caseNames[0]);
					const html = await textOnce(k, '/organisations');
					const { perOrganisation } = await expectedCounts(k);
					const orgs = await db.select({ id: organisation.id }).from(organisation);
					for (const { id } of orgs) {
						const n = perOrganisation[id] ?? 0;
						expect(html, `organisation ${id}`).toContain(
							`data-organisation="${id}" data-datasets="${n}"`
						);
					}
				}
			}
		]
	},
	'/(app)/organisations/new': { none: 'form to create an organisation' },
	'/(app)/organisations/[slug]/settings': {
		none: 'members and invitations, no datasets: permissions-matrix.spec.ts'
	},
	'/(app)/invitations/[id]': { none: 'invitations: access-rules.spec.ts' },
	'/(app)/datasets/new': { none: 'form; creating is checked in access-rules.spec.ts' },
	'/(app)/datasets': {
		checks: [
			{
				name: 'dataset list (catalogue entries listed to everyone, without their sites)',
				run: async (k, c) => {
					const body = await textOnce(k, '/datasets/__data.json');
					expect(body.includes(ids[c].dataset)).toBe(sees(k, c) || isEntry(c));
					expect(body.includes(`MX-${caseNames.indexOf(c)}-${run}`)).toBe(false);
				}
			}
		]
	},
	'/(app)/organisations/[slug]': {
		checks: [
			{
				name: "organisation page's datasets (and its catalogue entries)",
				run: async (k, c) => {
					const body = await textOnce(k, '/organisations/korvald-survey/__data.json');
					expect(body.includes(ids[c].dataset)).toBe(sees(k, c) || isEntry(c));
					expect(body.includes(`MX-${caseNames.indexOf(c)}-${run}`)).toBe(false);
				}
			}
		]
	},
	'/(app)/datasets/[id=uuid]': {
		checks: [
			{
				name: 'dataset page (a catalogue entry sends to its summary)',
				run: async (k, c) => {
					const res = await get(k, `/datasets/${ids[c].dataset}`);
					if (!sees(k, c) && isEntry(c)) {
						expect(res.status).toBe(303);
						return expect(res.headers.get('location')).toBe(`/datasets/${ids[c].dataset}/about`);
					}
					if (!sees(k, c)) return expectHidden(res);
					expect(res.status).toBe(200);
					expect(await res.text()).toContain(title(c));
				}
			},
			{
				name: 'dataset __data.json: sites, files and import history',
				run: async (k, c) => {
					const body = await text(k, `/datasets/${ids[c].dataset}/__data.json`);
					expect(body.includes(title(c))).toBe(sees(k, c));
					expect(body.includes(`MX-${caseNames.indexOf(c)}-${run}`)).toBe(sees(k, c));
					expect(body.includes(ids[c].file)).toBe(sees(k, c));
					// Import history is the organisation's business, even on public datasets.
					expect(body.includes(ids[c].batch)).toBe(sees(k, c) && MEMBERS.includes(k));
				}
			},
			{
				name: 'lifecycle actions (?/submit, ?/return, ?/publish, ?/retire) that must be refused',
				run: async (k, c) => {
					for (const [name, from] of Object.entries(TRANSITIONS)) {
						if (from[CASES[c].status]?.includes(k)) continue;
						const res = await clients[k].post(`/datasets/${ids[c].dataset}?/${name}`, {
							comment: 'matrix'
						});
						expect(writeStatus(k, c, false, 200), name).toContain(res.status);
					}
					expect(await statusOf(ids[c].dataset)).toBe(CASES[c].status);
				}
			},
			{
				name: 'sharing actions (?/approve, ?/decline, ?/grant, ?/revoke) that must be refused',
				run: async (k, c) => {
					const curates = ['curator', 'owner'].includes(k);
					// Curators on a catalogue entry would succeed: sharing.spec.ts runs those.
					if (curates && isEntry(c)) return expect(curates).toBe(true);
					const unknown = crypto.randomUUID();
					const forms: Record<string, Record<string, string>> = {
						approve: { requestId: unknown },
						decline: { requestId: unknown, reason: 'matrix' },
						grant: { email: KINDS.outsider },
						revoke: { grantId: unknown }
					};
					for (const [name, fields] of Object.entries(forms)) {
						const res = await clients[k].post(`/datasets/${ids[c].dataset}?/${name}`, fields);
						expect(writeStatus(k, c, false, 200), name).toContain(res.status);
					}
					const grants = await db
						.select()
						.from(accessGrant)
						.where(eq(accessGrant.datasetId, ids[c].dataset));
					expect(grants).toHaveLength(2);
				}
			},
			{
				name: 'correct (?/correct) and delete (?/delete) where refused',
				run: async (k, c) => {
					// Allowed ones would open versions or delete the fixture: versions.spec.ts runs them.
					const published = CASES[c].status === 'published';
					const corrects = published && CHANGERS.draft.includes(k);
					const deletes = !published && CASES[c].status !== 'retired' && REVIEWERS.includes(k);
					if (!corrects) {
						const res = await clients[k].post(`/datasets/${ids[c].dataset}?/correct`, {});
						expect(writeStatus(k, c, false, 303)).toContain(res.status);
					}
					if (!deletes) {
						const res = await clients[k].post(`/datasets/${ids[c].dataset}?/delete`, {});
						expect(writeStatus(k, c, false, 303)).toContain(res.status);
					}
					const [row] = await db.select().from(dataset).where(eq(dataset.id, ids[c].dataset));
					expect(row.status).toBe(CASES[c].status);
					expect(
						await db.select().from(dataset).where(eq(dataset.previousVersionId, ids[c].dataset))
					).toEqual([]);
				}
			},
			{
				name: 'edit metadata (?/update, empty form)',
				run: async (k, c) => {
					const res = await clients[k].post(`/datasets/${ids[c].dataset}?/update`, {});
					expect(writeStatus(k, c, changes(k, c), 400)).toContain(res.status);
				}
			}
		]
	},
	'/(app)/datasets/[id=uuid]/about': {
		checks: [
			{
				name: 'catalogue entry: summary only, never values, names, codes or files',
				run: async (k, c) => {
					const res = await get(k, `/datasets/${ids[c].dataset}/about`);
					if (sees(k, c)) {
						expect(res.status).toBe(303);
						return expect(res.headers.get('location')).toBe(`/datasets/${ids[c].dataset}`);
					}
					if (!isEntry(c)) return expectHidden(res);
					expect(res.status).toBe(200);
					const body = await res.text();
					expect(body).toContain(title(c));
					expect(body).not.toContain(`MX-${caseNames.indexOf(c)}-${run}`);
					expect(body).not.toContain(ids[c].file);
					expect(body).not.toContain(`matrix-${caseNames.indexOf(c)}-${run}.png`);
					// Under embargo the site count and the 0.1° cell (centre -59.45) are public, never
					// the position itself (-59.47).
					const embargoed = CASES[c].visibility === 'embargoed';
					expect(body).not.toContain('-59.47');
					expect(body.includes('-59.45')).toBe(embargoed);
					expect(body.includes('data-testid="site-count"')).toBe(embargoed);
				}
			},
			{
				name: 'ask for access (default action)',
				run: async (k, c) => {
					const res = await clients[k].post(`/datasets/${ids[c].dataset}/about`, {
						purpose: 'A regional heat-flow compilation for the matrix test.'
					});
					if (k === 'anonymous') return expect(res.status).toBe(401);
					if (sees(k, c)) return expect(res.status).toBe(403);
					if (!isEntry(c)) return expectHidden(res);
					expect(res.status).toBe(200);
				}
			}
		]
	},
	'/(app)/datasets/[id=uuid]/download/sites.csv': {
		checks: [
			{
				name: 'download the sites as CSV (citation header)',
				run: async (k, c) => {
					const res = await get(k, `/datasets/${ids[c].dataset}/download/sites.csv`);
					if (!sees(k, c)) return expectHidden(res);
					expect(res.status).toBe(200);
					const body = await res.text();
					expect(body).toMatch(/^# Cite as: /);
					expect(body).toContain(`MX-${caseNames.indexOf(c)}-${run}`);
				}
			}
		]
	},
	'/(app)/datasets/[id=uuid]/download/sites.geojson': {
		checks: [
			{
				name: 'download the sites as GeoJSON (citation metadata)',
				run: async (k, c) => {
					const res = await get(k, `/datasets/${ids[c].dataset}/download/sites.geojson`);
					if (!sees(k, c)) return expectHidden(res);
					expect(res.status).toBe(200);
					const body = await res.json();
					expect(body.metadata.citation).toContain(title(c));
					// Every site of the dataset (other rows add sites to the case datasets), once.
					const sites = await db
						.select({ id: site.id })
						.from(site)
						.where(eq(site.datasetId, ids[c].dataset));
					expect(body.features).toHaveLength(sites.length);
					expect(JSON.stringify(body)).toContain(`MX-${caseNames.indexOf(c)}-${run}`);
				}
			}
		]
	},
	'/(app)/audit': {
		checks: [
			{
				name: "audit page (a member's download of the dataset, filtered by dataset)",
				run: async (k, c) => {
					await clients.owner.get(`/datasets/${ids[c].dataset}/download/sites.csv`);
					const res = await get(k, `/audit?dataset=${ids[c].dataset}`);
					if (k === 'anonymous') return expect(res.status).toBe(303);
					const reads = AUDIT_READERS.includes(k);
					if (k === 'outsider') {
						// Owner of another organisation: reads that one's log, not this one's.
						expect(res.status).toBe(200);
						return expect(await res.text()).not.toContain(title(c));
					}
					expect(res.status).toBe(reads ? 200 : 403);
					expect((await res.text()).includes(title(c))).toBe(reads);
				}
			}
		]
	},
	'/(app)/audit/export.csv': {
		checks: [
			{
				name: 'audit export (CSV)',
				run: async (k, c) => {
					await clients.owner.get(`/datasets/${ids[c].dataset}/download/sites.csv`);
					const res = await get(k, `/audit/export.csv?dataset=${ids[c].dataset}`);
					if (k === 'anonymous') return expect(res.status).toBe(401);
					const reads = AUDIT_READERS.includes(k) || k === 'outsider';
					expect(res.status).toBe(reads ? 200 : 403);
					expect((await res.text()).includes(ids[c].dataset)).toBe(AUDIT_READERS.includes(k));
				}
			}
		]
	},
	'/(app)/datasets/[id=uuid]/import': {
		checks: [
			{
				name: 'import wizard page',
				run: async (k, c) => {
					const res = await get(k, `/datasets/${ids[c].dataset}/import`);
					const expected = k === 'anonymous' ? [303] : writeStatus(k, c, changes(k, c), 200);
					expect(expected).toContain(res.status);
				}
			}
		]
	},
	'/(app)/sites/[id=uuid]': {
		checks: [
			{
				name: 'site page',
				run: async (k, c) => {
					const res = await get(k, `/sites/${ids[c].site}`);
					if (!sees(k, c)) return expectHidden(res);
					expect(res.status).toBe(200);
				}
			},
			{
				name: 'site actions (data, computations, revisions) without input',
				run: async (k, c) => {
					for (const action of [
						'log',
						'conductivity',
						'compute',
						'correct',
						'choose',
						'bht',
						'palaeoclimate',
						'heatProduction'
					]) {
						const res = await clients[k].post(`/sites/${ids[c].site}?/${action}`, {});
						expect(writeStatus(k, c, changes(k, c), 400)).toContain(res.status);
					}
				}
			}
		]
	},
	'/api/health': { none: 'service status, no data' },
	'/api/v1/sites.geojson': {
		checks: [
			{
				name: 'map query (GeoJSON)',
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					const body = JSON.parse(await textOnce(k, `/api/v1/sites.geojson?bbox=${bbox}`));
					const found = body.features.map((f: { id: string }) => f.id);
					expect(found.includes(ids[c].site)).toBe(sees(k, c) && CASES[c].map);
				}
			}
		]
	},
	'/api/v1/map': {
		checks: [
			{
				name: 'map data (cells at zoom 3, single sites at zoom 12)',
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					const code = `MX-${caseNames.indexOf(c)}-${run}`;
					const shown = sees(k, c) && CASES[c].map;
					const cells = JSON.parse(await text(k, `/api/v1/map?bbox=${bbox}&zoom=3&q=${code}`));
					expect(cells.kind).toBe('cells');
					expect(cells.count).toBe(shown ? 1 : 0);
					expect(cells.cells.length).toBe(shown ? 1 : 0);
					// Without site filters the cells come pre-built per dataset (or from the sites while
					// the dataset is marked stale): the same rule.
					const byDataset = JSON.parse(
						await text(k, `/api/v1/map?bbox=${bbox}&zoom=3&dataset=${ids[c].dataset}`)
					);
					expect(byDataset.count > 0).toBe(shown);
					const body = JSON.parse(await textOnce(k, `/api/v1/map?bbox=${bbox}&zoom=12&q=${run}`));
					const found = body.sites.map((s: { id: string }) => s.id);
					expect(found.includes(ids[c].site)).toBe(shown);
				}
			}
		]
	},
	'/api/v1/map/count': {
		checks: [
			{
				name: 'matching-site count',
				run: async (k, c) => {
					const code = `MX-${caseNames.indexOf(c)}-${run}`;
					const body = JSON.parse(await text(k, `/api/v1/map/count?q=${code}`));
					expect(body.count).toBe(sees(k, c) && CASES[c].map ? 1 : 0);
				}
			}
		]
	},
	'/api/v1/map/search': {
		checks: [
			{
				name: 'site search by code prefix',
				run: async (k, c) => {
					const body = JSON.parse(
						await textOnce(k, `/api/v1/map/search?q=MX-${caseNames.indexOf(c)}-${run}`)
					);
					const found = body.sites.map((s: { id: string }) => s.id);
					expect(found.includes(ids[c].site)).toBe(sees(k, c) && CASES[c].map);
				}
			}
		]
	},
	'/api/v1/map/region': {
		checks: [
			{
				name: 'region statistics',
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					const code = `MX-${caseNames.indexOf(c)}-${run}`;
					const body = JSON.parse(await text(k, `/api/v1/map/region?bbox=${bbox}&q=${code}`));
					expect(body.count).toBe(sees(k, c) && CASES[c].map ? 1 : 0);
				}
			},
			{
				name: 'region statistics of a polygon (POST body and GET link)',
				run: async (k, c) => {
					const { west: w, south: s, east: e, north: n } = BOX;
					const code = `MX-${caseNames.indexOf(c)}-${run}`;
					const shown = sees(k, c) && CASES[c].map ? 1 : 0;
					const ring = [
						[w, s],
						[e, s],
						[e, n],
						[w, n],
						[w, s]
					];
					const posted = await clients[k].json(`/api/v1/map/region?q=${code}`, {
						type: 'Polygon',
						coordinates: [ring]
					});
					expect(posted.status).toBe(200);
					expect((await posted.json()).count).toBe(shown);
					const param = encodeURIComponent(ring.map((p) => p.join(' ')).join(','));
					const got = JSON.parse(await text(k, `/api/v1/map/region?polygon=${param}&q=${code}`));
					expect(got.count).toBe(shown);
				}
			}
		]
	},
	'/api/v1/map/region/sites.csv': {
		checks: [
			{
				name: 'region download (CSV) with citations',
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					const code = `MX-${caseNames.indexOf(c)}-${run}`;
					const body = await text(k, `/api/v1/map/region/sites.csv?bbox=${bbox}&q=${code}`);
					const shown = sees(k, c) && CASES[c].map;
					// The `#` header repeats the query (and so the code): read the rows.
					const rows = body.split('\n').filter((l) => l && !l.startsWith('#'));
					expect(rows.slice(1).some((r) => r.startsWith(`${code},`))).toBe(shown);
					expect(body.includes(`# Dataset 1 of 1: ${ids[c].dataset}`)).toBe(shown);
				}
			}
		]
	},
	'/api/v1/map/region/sites.geojson': {
		checks: [
			{
				name: 'region download (GeoJSON) with citations',
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					const code = `MX-${caseNames.indexOf(c)}-${run}`;
					const body = JSON.parse(
						await text(k, `/api/v1/map/region/sites.geojson?bbox=${bbox}&q=${code}`)
					);
					const shown = sees(k, c) && CASES[c].map;
					expect(body.features.length).toBe(shown ? 1 : 0);
					expect(body.metadata.datasets.map((d: { id: string }) => d.id)).toEqual(
						shown ? [ids[c].dataset] : []
					);
				}
			}
		]
	},
	'/ogc': { none: 'OGC API landing page: links only' },
	'/ogc/api': { none: 'OGC API description: static text' },
	'/ogc/conformance': { none: 'OGC API conformance classes: static list' },
	'/ogc/collections': {
		checks: [
			{
				name: 'OGC collections (one per published dataset)',
				run: async (k, c) => {
					const body = await text(k, '/ogc/collections?f=json');
					const published = CASES[c].status === 'published';
					expect(body.includes(`dataset-${ids[c].dataset}`)).toBe(sees(k, c) && published);
				}
			}
		]
	},
	'/ogc/collections/[collectionId]': {
		checks: [
			{
				name: 'OGC collection of a dataset',
				run: async (k, c) => {
					const res = await get(k, `/ogc/collections/dataset-${ids[c].dataset}?f=json`);
					if (!(sees(k, c) && CASES[c].status === 'published')) return expectHidden(res);
					expect(res.status).toBe(200);
					expect(await res.text()).toContain(title(c));
				}
			}
		]
	},
	'/ogc/collections/[collectionId]/items': {
		checks: [
			{
				name: 'OGC items of all sites (GeoJSON)',
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					const res = await get(k, `/ogc/collections/sites/items?bbox=${bbox}&f=json`);
					const found = (await res.json()).features.map((f: { id: string }) => f.id);
					expect(found.includes(ids[c].site)).toBe(sees(k, c) && CASES[c].map);
				}
			},
			{
				name: "OGC items of all sites with the viewer's API key",
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					const [, viaKey] = await sessionAndKey(k, `/ogc/collections/sites/items?bbox=${bbox}`);
					if (!viaKey) return expect(k).toBe('anonymous');
					const found = (await viaKey.json()).features.map((f: { id: string }) => f.id);
					expect(found.includes(ids[c].site)).toBe(sees(k, c) && CASES[c].map);
				}
			}
		]
	},
	'/ogc/collections/[collectionId]/items/[featureId]': {
		checks: [
			{
				name: 'OGC feature by id',
				run: async (k, c) => {
					const res = await get(k, `/ogc/collections/sites/items/${ids[c].site}?f=json`);
					if (!(sees(k, c) && CASES[c].map)) return expectHidden(res);
					expect(res.status).toBe(200);
					expect((await res.json()).id).toBe(ids[c].site);
				}
			}
		]
	},
	'/api/v1/grids': {
		checks: [
			{
				name: "request a grid of a case's region (only sites the viewer sees on maps count)",
				run: async (k, c) => {
					const res = await gridRequest(k, c);
					if (!(sees(k, c) && CASES[c].map)) {
						expect(res.status).toBe(400);
						return expect((await res.json()).error.message).toMatch(/0 visible site/);
					}
					expect(res.status).toBe(202);
					const { id } = await res.json();
					const body = await (await get(k, `/api/v1/grids/${id}`)).json();
					expect(body.sitesUsed).toBe(3);
				}
			}
		]
	},
	'/api/v1/grids/[id=uuid]': {
		checks: [
			{
				name: "the owner's grid of a case's region (hidden unless every dataset used is visible)",
				run: async (k, c) => {
					const id = await ownerGrid(c);
					if (!CASES[c].map) return expect(id).toBeNull();
					const res = await get(k, `/api/v1/grids/${id}`);
					if (!sees(k, c)) return expectHidden(res);
					expect(res.status).toBe(200);
					expect((await res.json()).status).toBe('done');
				}
			}
		]
	},
	'/api/v1/grids/[id=uuid]/[file]': {
		checks: [
			{
				name: "a download of the owner's grid (GeoTIFF, CSV with citations)",
				run: async (k, c) => {
					const id = await ownerGrid(c);
					if (!CASES[c].map) return expect(id).toBeNull();
					for (const file of ['heat-flow.tif', 'grid.csv']) {
						const res = await get(k, `/api/v1/grids/${id}/${file}`);
						if (!sees(k, c)) {
							await expectHidden(res);
							continue;
						}
						expect(res.status).toBe(200);
						if (file === 'grid.csv') expect(await res.text()).toContain(title(c));
						else await res.arrayBuffer();
					}
				}
			}
		]
	},
	'/api/v1/grids/[id=uuid]/statistics': {
		checks: [
			{
				name: "region statistics of the owner's grid (POST and GET; hidden like the grid)",
				run: async (k, c) => {
					const id = await ownerGrid(c);
					if (!CASES[c].map) return expect(id).toBeNull();
					const bbox = gridBox(c);
					const posted = await clients[k].json(`/api/v1/grids/${id}/statistics`, { bbox });
					const got = await get(k, `/api/v1/grids/${id}/statistics?bbox=${bbox.join(',')}`);
					for (const res of [posted, got]) {
						if (!sees(k, c)) {
							await expectHidden(res);
							continue;
						}
						expect(res.status).toBe(200);
						expect((await res.json()).heatFlowMWm2.mean).toBeGreaterThan(0);
					}
				}
			}
		]
	},
	'/api/v1/openapi.json': { none: 'the OpenAPI document: static' },
	'/api/v1/organisations': { none: 'public directory of organisations, no datasets' },
	'/api/v1/compute/geotherm': { none: 'computes on the posted model; reads no stored data' },
	'/api/v1/compute/heat-flow': { none: 'computes on the posted log; reads no stored data' },
	'/api/v1/datasets': {
		checks: [
			{
				name: 'dataset list (session and API key)',
				run: async (k, c) => {
					for (const res of await sessionAndKey(k, '/api/v1/datasets?limit=1000')) {
						const found = (await res.json()).items.map((d: { id: string }) => d.id);
						expect(found.includes(ids[c].dataset)).toBe(sees(k, c));
					}
				}
			}
		]
	},
	'/api/v1/datasets/[id=uuid]': {
		checks: [
			{
				name: 'one dataset (session and API key)',
				run: async (k, c) => {
					for (const res of await sessionAndKey(k, `/api/v1/datasets/${ids[c].dataset}`)) {
						if (!sees(k, c)) {
							await expectHidden(res);
							continue;
						}
						expect(res.status).toBe(200);
						expect((await res.json()).title).toBe(title(c));
					}
				}
			}
		]
	},
	'/api/v1/sites': {
		checks: [
			{
				name: 'site list in a box (session and API key)',
				run: async (k, c) => {
					const bbox = `${BOX.west},${BOX.south},${BOX.east},${BOX.north}`;
					for (const res of await sessionAndKey(
						k,
						`/api/v1/sites?f=json&limit=1000&bbox=${bbox}`
					)) {
						const found = (await res.json()).items.map((s: { id: string }) => s.id);
						expect(found.includes(ids[c].site)).toBe(sees(k, c) && CASES[c].map);
					}
				}
			}
		]
	},
	'/api/v1/sites/[id=uuid]': {
		checks: [
			{
				name: 'one site (session and API key)',
				run: async (k, c) => {
					for (const res of await sessionAndKey(k, `/api/v1/sites/${ids[c].site}`)) {
						if (!sees(k, c)) {
							await expectHidden(res);
							continue;
						}
						expect(res.status).toBe(200);
						expect((await res.json()).id).toBe(ids[c].site);
					}
				}
			}
		]
	},
	'/api/v1/sites/[id=uuid]/temperature-logs': {
		checks: [
			{
				name: "a site's temperature logs (session and API key)",
				run: async (k, c) => {
					for (const res of await sessionAndKey(
						k,
						`/api/v1/sites/${ids[c].site}/temperature-logs`
					)) {
						if (!sees(k, c)) {
							await expectHidden(res);
							continue;
						}
						expect(res.status).toBe(200);
						expect((await res.json()).items).toEqual([]);
					}
				}
			}
		]
	},
	'/api/v1/attachments': {
		checks: [
			{
				name: 'announce a file upload',
				run: async (k, c) => {
					const res = await clients[k].json('/api/v1/attachments', {
						datasetId: ids[c].dataset,
						fileName: 'matrix.txt',
						sizeBytes: 10
					});
					expect(writeStatus(k, c, changes(k, c), 201)).toContain(res.status);
				}
			}
		]
	},
	'/api/v1/attachments/[id=uuid]': {
		checks: [
			{
				name: 'delete a file (uploaded by the owner)',
				run: async (k, c) => {
					// Those who would succeed are not asked here (the file must stay for the other
					// rows): attachments.spec.ts and access-rules.spec.ts cover successful deletes.
					const mayDelete = changes(k, c) && (k === 'owner' || k === 'curator');
					if (mayDelete) return expect(mayDelete).toBe(true);
					const res = await clients[k].json(
						`/api/v1/attachments/${ids[c].file}`,
						undefined,
						'DELETE'
					);
					expect(writeStatus(k, c, false, 204)).toContain(res.status);
				}
			}
		]
	},
	'/api/v1/attachments/[id=uuid]/content': {
		checks: [
			{
				name: 'send the bytes of a file (checked already, announced by the owner)',
				run: async (k, c) => {
					const res = await clients[k].put(
						`/api/v1/attachments/${ids[c].file}/content`,
						Buffer.from('matrix-new')
					);
					// Only the owner announced it; being ready, even they are refused (409).
					const expected = writeStatus(k, c, changes(k, c) && k === 'owner', 409);
					expect(expected).toContain(res.status);
					if (res.status === 404) await expectHidden(res);
					const download = await clients.owner.get(`/api/v1/attachments/${ids[c].file}/download`);
					expect(Buffer.from(await download.arrayBuffer()).equals(FILE_BYTES)).toBe(true);
				}
			}
		]
	},
	'/api/v1/attachments/[id=uuid]/download': {
		checks: [
			{
				name: 'download a file',
				run: async (k, c) => {
					const res = await get(k, `/api/v1/attachments/${ids[c].file}/download`);
					if (!sees(k, c)) return expectHidden(res);
					expect(res.status).toBe(200);
					expect(Buffer.from(await res.arrayBuffer()).equals(FILE_BYTES)).toBe(true);
				}
			}
		]
	},
	'/api/v1/attachments/[id=uuid]/thumbnail': {
		checks: [
			{
				name: 'thumbnail of a file',
				run: async (k, c) => {
					const res = await get(k, `/api/v1/attachments/${ids[c].file}/thumbnail`);
					if (!sees(k, c)) return expectHidden(res);
					expect(res.status).toBe(200);
					expect(res.headers.get('content-type')).toBe('image/webp');
					expect(Buffer.from(await res.arrayBuffer()).equals(THUMB_BYTES)).toBe(true);
				}
			}
		]
	},
	'/api/v1/datasets/[id=uuid]/imports': {
		checks: [
			{
				name: 'start an import (unreadable body)',
				run: async (k, c) => {
					const res = await clients[k].json(`/api/v1/datasets/${ids[c].dataset}/imports`, {});
					expect(writeStatus(k, c, changes(k, c), 400)).toContain(res.status);
				}
			}
		]
	},
	'/api/v1/imports/[id=uuid]/preview': {
		checks: [
			{
				// The matrix's batches were made by nobody: only an import's own creator may change it.
				name: "preview someone else's import",
				run: async (k, c) => {
					const res = await clients[k].json(`/api/v1/imports/${ids[c].batch}/preview`, {});
					if (k === 'anonymous') return expect(res.status).toBe(401);
					return expectHidden(res);
				}
			}
		]
	},
	'/api/v1/imports/[id=uuid]/commit': {
		checks: [
			{
				name: "commit someone else's import",
				run: async (k, c) => {
					const res = await clients[k].json(`/api/v1/imports/${ids[c].batch}/commit`, {
						revision: 1
					});
					if (k === 'anonymous') return expect(res.status).toBe(401);
					return expectHidden(res);
				}
			}
		]
	},
	'/api/v1/imports/[id=uuid]': {
		checks: [
			{
				name: 'import progress',
				run: async (k, c) => {
					const res = await get(k, `/api/v1/imports/${ids[c].batch}`);
					if (k === 'anonymous') return expect(res.status).toBe(401);
					if (!(sees(k, c) && MEMBERS.includes(k))) return expectHidden(res);
					expect(res.status).toBe(200);
				}
			}
		]
	},
	'/api/v1/regions': {
		checks: [
			{
				name: "saved regions: each viewer lists their own, never another's",
				run: async (k, c) => {
					if (c !== caseNames[0]) return expect(c).not.toBe(caseNames[0]);
					const signedIn = kinds.filter((j) => j !== 'anonymous');
					const made = await Promise.all(signedIn.map(savedRegionOf));
					const res = await get(k, '/api/v1/regions');
					if (k === 'anonymous') return expect(res.status).toBe(401);
					const listedIds = (await res.json()).items.map((r: { id: string }) => r.id);
					for (const [i, j] of signedIn.entries())
						expect(listedIds.includes(made[i]), `${k} lists ${j}'s`).toBe(j === k);
				}
			}
		]
	},
	'/api/v1/regions/[id=uuid]': {
		checks: [
			{
				name: "a saved region: its owner's only (the one 404 for others)",
				run: async (k, c) => {
					if (c !== caseNames[0]) return expect(c).not.toBe(caseNames[0]);
					const res = await get(k, `/api/v1/regions/${await savedRegionOf('curator')}`);
					if (k === 'anonymous') return expect(res.status).toBe(401);
					if (k !== 'curator') return expectHidden(res);
					expect(res.status).toBe(200);
				}
			},
			{
				name: "statistics of the viewer's own saved region (the map's visibility rule)",
				run: async (k, c) => {
					if (k === 'anonymous') return expect(KINDS[k]).toBeNull();
					const code = `MX-${caseNames.indexOf(c)}-${run}`;
					const id = await savedRegionOf(k);
					const body = JSON.parse(await text(k, `/api/v1/map/region?region=${id}&q=${code}`));
					expect(body.count).toBe(sees(k, c) && CASES[c].map ? 1 : 0);
				}
			}
		]
	}
};

/** One saved region per signed-in viewer kind, the matrix's box, made on first use. */
const savedRegions = new Map<Kind, Promise<string>>();
function savedRegionOf(k: Kind): Promise<string> {
	if (!savedRegions.has(k))
		savedRegions.set(
			k,
			(async () => {
				const { west: w, south: s, east: e, north: n } = BOX;
				const res = await clients[k].json('/api/v1/regions', {
					name: `Matrix ${k} ${run}`,
					geometry: {
						type: 'Polygon',
						coordinates: [
							[
								[w, s],
								[e, s],
								[e, n],
								[w, n],
								[w, s]
							]
						]
					}
				});
				expect(res.status).toBe(201);
				return (await res.json()).id as string;
			})()
		);
	return savedRegions.get(k)!;
}

/** Route ids of every page, layout and endpoint under src/routes, as SvelteKit names them. */
function routeIds(): string[] {
	const root = path.resolve('src/routes');
	const found = new Set<string>();
	const walk = (dir: string) => {
		for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
			const full = path.join(dir, entry.name);
			if (entry.isDirectory()) walk(full);
			else if (/^\+(page|layout|server)(\.server)?\.(ts|js|svelte)$/.test(entry.name)) {
				const rel = path.relative(root, dir).split(path.sep).join('/');
				found.add(rel ? `/${rel}` : '/');
			}
		}
	};
	walk(root);
	return [...found].sort();
}

/** Home-page counts a viewer should see, from the database and the tables above. */
async function expectedCounts(k: Kind) {
	const email = KINDS[k];
	const granted = (
		await db
			.select({ datasetId: accessGrant.datasetId, expiresOn: accessGrant.expiresOn })
			.from(accessGrant)
			.innerJoin(user, eq(accessGrant.userId, user.id))
			.where(eq(user.email, email ?? ''))
	)
		.filter((g) => g.expiresOn === null || g.expiresOn >= new Date().toISOString().slice(0, 10))
		.map((g) => g.datasetId);
	const myOrgs = email
		? (
				await db
					.select({ org: member.organizationId })
					.from(member)
					.innerJoin(user, eq(member.userId, user.id))
					.where(eq(user.email, email))
			).map((r) => r.org)
		: [];
	const all = await db.select().from(dataset);
	const today = new Date().toISOString().slice(0, 10);
	const visible = all.filter(
		(d) =>
			myOrgs.includes(d.organisationId) ||
			(['published', 'retired'].includes(d.status) &&
				['restricted', 'embargoed'].includes(d.visibility) &&
				granted.includes(d.id)) ||
			(['published', 'retired'].includes(d.status) &&
				(d.visibility === 'public' ||
					(d.visibility === 'embargoed' && d.embargoUntil !== null && d.embargoUntil <= today)))
	);
	const visibleIds = visible.map((d) => d.id);
	const sites = visibleIds.length
		? await db.select({ id: site.id }).from(site).where(inArray(site.datasetId, visibleIds))
		: [];
	// Organisations are a public directory: the home page counts the whole list.
	const organisations = await db.select({ id: organisation.id }).from(organisation);
	const perOrganisation: Record<string, number> = {};
	for (const d of visible)
		perOrganisation[d.organisationId] = (perOrganisation[d.organisationId] ?? 0) + 1;
	return {
		sites: sites.length,
		datasets: visible.length,
		organisations: organisations.length,
		perOrganisation
	};
}

describe('visibility matrix', () => {
	it('has a row for every route under src/routes, and no row for a route that is gone', () => {
		expect(routeIds()).toEqual(Object.keys(ROUTES).sort());
	});

	const checks = Object.entries(ROUTES).flatMap(([route, row]) =>
		'checks' in row ? row.checks.map((check) => ({ route, ...check })) : []
	);
	describe.each(checks)('$route: $name', ({ run: check }) => {
		it.each(kinds)('as %s, in every visibility state', async (k) => {
			for (const c of caseNames) {
				try {
					await check(k, c);
				} catch (err) {
					throw new Error(`${c}: ${(err as Error).message}`);
				}
			}
		});
	});
});
