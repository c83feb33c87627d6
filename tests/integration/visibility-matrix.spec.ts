import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOT_FOUND_MESSAGE } from '../../src/lib/server/access/not-found';
import { createDb } from '../../src/lib/server/db/client';
import {
	attachment,
	dataset,
	importBatch,
	member,
	site,
	user,
	type NewDataset
} from '../../src/lib/server/db/schema';
import { createS3Client } from '../../src/lib/server/storage-client';
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

/** Viewer kinds and the demo account of each; members are those of the datasets' organisation. */
const KINDS = {
	anonymous: null,
	outsider: 'owner@lindmark-thermics.example',
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

const sees = (k: Kind, c: CaseName) => CASES[c].everyone || MEMBERS.includes(k);
const changes = (k: Kind, c: CaseName) => CHANGERS[CASES[c].status].includes(k);

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const s3 = createS3Client(testEnv.s3());
/** The bytes of every case's checked file (the app serves them itself) and of its thumbnail. */
const FILE_BYTES = Buffer.from('matrix-fil');
const THUMB_BYTES = Buffer.from('RIFF-matrix-thumb');
const clients = {} as Record<Kind, Client>;
const ids = {} as Record<CaseName, { dataset: string; site: string; file: string; batch: string }>;
const title = (c: CaseName) => `Matrix ${c} ${run}`;
const BOX = { west: 100, south: -60, east: 101, north: -59 };

beforeAll(async () => {
	for (const k of kinds) {
		const email = KINDS[k];
		clients[k] = email ? await signIn(email, DEMO_PASSWORD) : new Client();
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
				location: { lon: 100.1 + i * 0.05, lat: -59.5 },
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
	}
});

afterAll(async () => {
	await sql.end();
});

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
					}).toEqual(await expectedCounts(k));
				}
			}
		]
	},
	'/(public)/help': { none: 'static help text' },
	'/(public)/api': { none: 'static API documentation' },
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
	'/(app)/organisations': { none: 'public directory of organisations, no datasets' },
	'/(app)/organisations/new': { none: 'form to create an organisation' },
	'/(app)/organisations/[slug]/settings': {
		none: 'members and invitations, no datasets: permissions-matrix.spec.ts'
	},
	'/(app)/invitations/[id]': { none: 'invitations: access-rules.spec.ts' },
	'/(app)/datasets/new': { none: 'form; creating is checked in access-rules.spec.ts' },
	'/(app)/datasets': {
		checks: [
			{
				name: 'dataset list',
				run: async (k, c) => {
					const body = await textOnce(k, '/datasets/__data.json');
					expect(body.includes(ids[c].dataset)).toBe(sees(k, c));
				}
			}
		]
	},
	'/(app)/organisations/[slug]': {
		checks: [
			{
				name: "organisation page's datasets",
				run: async (k, c) => {
					const body = await textOnce(k, '/organisations/korvald-survey/__data.json');
					expect(body.includes(ids[c].dataset)).toBe(sees(k, c));
				}
			}
		]
	},
	'/(app)/datasets/[id=uuid]': {
		checks: [
			{
				name: 'dataset page',
				run: async (k, c) => {
					const res = await get(k, `/datasets/${ids[c].dataset}`);
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
				name: 'edit metadata (?/update, empty form)',
				run: async (k, c) => {
					const res = await clients[k].post(`/datasets/${ids[c].dataset}?/update`, {});
					expect(writeStatus(k, c, changes(k, c), 400)).toContain(res.status);
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
				name: 'site actions (?/log, ?/conductivity, ?/compute without input)',
				run: async (k, c) => {
					for (const action of ['log', 'conductivity', 'compute']) {
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
	'/api/v1/datasets/[id=uuid]/imports/preview': {
		checks: [
			{
				name: 'preview an import (unreadable body)',
				run: async (k, c) => {
					const res = await clients[k].json(
						`/api/v1/datasets/${ids[c].dataset}/imports/preview`,
						{}
					);
					expect(writeStatus(k, c, changes(k, c), 400)).toContain(res.status);
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
	}
};

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
				(d.visibility === 'public' ||
					(d.visibility === 'embargoed' && d.embargoUntil !== null && d.embargoUntil <= today)))
	);
	const visibleIds = visible.map((d) => d.id);
	const sites = visibleIds.length
		? await db.select({ id: site.id }).from(site).where(inArray(site.datasetId, visibleIds))
		: [];
	return {
		sites: sites.length,
		datasets: visible.length,
		organisations: new Set(visible.map((d) => d.organisationId)).size
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
