import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ANONYMOUS, type Viewer } from '../../src/lib/server/access';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, organisation, site } from '../../src/lib/server/db/schema';
import { listDatasetSites, visibleSitesInBox } from '../../src/lib/server/repositories/sites';
import { parseSiteFilters } from '../../src/lib/sites/filters';
import { parseSiteListQuery } from '../../src/lib/sites/list-query';
import { testEnv } from './env';

const { db, client } = createDb(testEnv.databaseUrl(), { max: 2 });
const orgId = `org-it-sites-${Date.now()}`;
const datasetIds: Record<string, string> = {};

beforeAll(async () => {
	await db.insert(organisation).values({ id: orgId, name: 'Integration Test Org', slug: orgId });
	const rows = await db
		.insert(dataset)
		.values([
			{
				organisationId: orgId,
				title: 'public',
				licence: 'CC0-1.0',
				status: 'published',
				visibility: 'public'
			},
			{
				organisationId: orgId,
				title: 'embargoed',
				licence: 'CC0-1.0',
				status: 'published',
				visibility: 'embargoed',
				embargoUntil: '2999-01-01'
			},
			{
				organisationId: orgId,
				title: 'released',
				licence: 'CC0-1.0',
				status: 'published',
				visibility: 'embargoed',
				embargoUntil: '2001-01-01'
			},
			{
				organisationId: orgId,
				title: 'private',
				licence: 'CC0-1.0',
				status: 'published',
				visibility: 'private'
			},
			{
				organisationId: orgId,
				title: 'draft',
				licence: 'CC0-1.0',
				status: 'draft',
				visibility: 'public'
			}
		])
		.returning({ id: dataset.id, title: dataset.title });
	for (const r of rows) datasetIds[r.title] = r.id;
	// All in a small box in the South Atlantic, far from the demo scenario.
	await db.insert(site).values(
		Object.entries(datasetIds).map(([title, id], i) => ({
			datasetId: id,
			code: `IT-${title}`,
			location: { lon: -20.5 + i * 0.01, lat: -40.25 },
			heatFlowMWm2: 60 + i
		}))
	);
});

afterAll(async () => {
	await db.delete(organisation).where(eq(organisation.id, orgId));
	await client.end();
});

const box = { west: -21, south: -41, east: -20, north: -40 };
const codes = async (viewer: Viewer) =>
	(await visibleSitesInBox(db, viewer, box)).map((s) => s.code).sort();

describe('site locations in PostGIS', () => {
	it('store SRID 4326 and read back the same longitude and latitude', async () => {
		const [row] = await db
			.select({ srid: sql<number>`ST_SRID(${site.location})`, location: site.location })
			.from(site)
			.where(eq(site.code, 'IT-public'));
		expect(row.srid).toBe(4326);
		expect(row.location).toEqual({ lon: -20.5, lat: -40.25 });
	});

	it('are found by a bounding-box query that can use the GiST index', async () => {
		expect(await codes({ ...ANONYMOUS, userId: 'u1', roles: { [orgId]: 'viewer' } })).toHaveLength(
			5
		);
		// The table is tiny, so the planner would rightly choose a scan; forbid that to prove the
		// index answers the envelope query.
		const plan = await client.begin(async (tx) => {
			await tx`SET LOCAL enable_seqscan = off`;
			return tx`EXPLAIN SELECT id FROM site WHERE location && ST_MakeEnvelope(-21, -41, -20, -40, 4326)`;
		});
		expect(plan.map((r) => r['QUERY PLAN']).join('\n')).toContain('site_location_gist');
	});
});

describe('which sites a viewer may see', () => {
	it('shows anonymous visitors only published public or released-embargo datasets', async () => {
		expect(await codes(ANONYMOUS)).toEqual(['IT-public', 'IT-released']);
	});
	it('shows members everything of their own organisation', async () => {
		expect(await codes({ ...ANONYMOUS, userId: 'u1', roles: { [orgId]: 'viewer' } })).toEqual([
			'IT-draft',
			'IT-embargoed',
			'IT-private',
			'IT-public',
			'IT-released'
		]);
	});
	it('shows platform administrators no more than the public (src/lib/server/access/README.md)', async () => {
		expect(await codes({ ...ANONYMOUS, userId: 'a1', isPlatformAdmin: true })).toEqual([
			'IT-public',
			'IT-released'
		]);
	});
	it('does not let a member of another organisation see private or embargoed data', async () => {
		expect(await codes({ ...ANONYMOUS, userId: 'u2', roles: { 'someone-else': 'owner' } })).toEqual(
			['IT-public', 'IT-released']
		);
	});
});

// Thermalith's own filter conventions (src/lib/sites/filters.ts); no external source.
describe('the shared site filters in SQL', () => {
	const member: Viewer = { ...ANONYMOUS, userId: 'u1', roles: { [orgId]: 'viewer' } };
	it('narrow the map by heat-flow range (inclusive), code or name, and quality', async () => {
		const f = parseSiteFilters(new URLSearchParams('minHeatFlow=61&maxHeatFlow=63&q=ED'));
		const found = await visibleSitesInBox(db, member, box, f);
		expect(found.map((s) => s.code).sort()).toEqual(['IT-embargoed', 'IT-released']);
		const indicative = parseSiteFilters(new URLSearchParams('quality=indicative'));
		expect(await visibleSitesInBox(db, member, box, indicative)).toEqual([]);
	});
	it('narrow a dataset table the same way; search text is never a LIKE pattern', async () => {
		const rows = async (query: string) =>
			(
				await listDatasetSites(
					db,
					member,
					datasetIds.public,
					parseSiteListQuery(new URLSearchParams(query))
				)
			).rows.map((r) => r.code);
		expect(await rows('maxHeatFlow=60')).toEqual(['IT-public']);
		expect(await rows('minHeatFlow=61')).toEqual([]);
		expect(await rows('q=it-PUB')).toEqual(['IT-public']);
		expect(await rows('q=IT_p%25')).toEqual([]);
	});
});
