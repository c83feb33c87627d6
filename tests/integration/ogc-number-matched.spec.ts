/**
 * numberMatched of /ogc items without counting every match on every request: a selection is
 * counted only up to a cap; past it an unfiltered collection is counted from the map's stored
 * cells (plus the sites of datasets whose cells are stale), and a filtered one goes without
 * numberMatched (optional in OGC 17-069r4). The cap is lowered here so the fixture exceeds it.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ANONYMOUS } from '../../src/lib/server/access/viewer';
import { createDb } from '../../src/lib/server/db/client';
import { parseBbox, type CollectionRef, type ItemsQuery } from '../../src/lib/server/ogc/params';
import { itemsPage } from '../../src/lib/server/ogc/repository';
import { testEnv } from './env';
import { BOX, OPEN_IN_BOX, createOgcFixture, type OgcFixture } from './ogc-fixture';

const { db, client } = createDb(testEnv.databaseUrl(), { max: 2 });
let fx: OgcFixture;
beforeAll(async () => {
	fx = await createOgcFixture();
});
afterAll(async () => {
	await fx.close();
	await client.end();
});

const query = (over: Partial<ItemsQuery> = {}): ItemsQuery => ({
	limit: 7,
	bbox: null,
	datetime: null,
	cursor: null,
	...over
});
const box = () => {
	const parsed = parseBbox(BOX);
	if (!parsed.ok) throw new Error(parsed.message);
	return parsed.value;
};
/** The exact count, counted in full (a cap no collection here reaches). */
const counted = async (ref: CollectionRef) =>
	(await itemsPage(db, ANONYMOUS, ref, query(), { countCap: 100_000_000 })).numberMatched;

describe('numberMatched of OGC items', () => {
	it('is counted while the matches stay under the cap, and left out of a filtered selection past it', async () => {
		const sites: CollectionRef = { kind: 'sites' };
		expect((await itemsPage(db, ANONYMOUS, sites, query({ bbox: box() }))).numberMatched).toBe(
			OPEN_IN_BOX
		);
		const capped = await itemsPage(db, ANONYMOUS, sites, query({ bbox: box() }), { countCap: 5 });
		expect(capped.numberMatched).toBeNull();
		expect(capped.features).toHaveLength(7);
		// A first page that holds every match says how many there are, whatever the cap.
		const whole = await itemsPage(db, ANONYMOUS, sites, query({ bbox: box(), limit: 100 }), {
			countCap: 5
		});
		expect(whole.numberMatched).toBe(OPEN_IN_BOX);
	});

	it('comes from the stored map cells for a whole collection past the cap, stale datasets included', async () => {
		const sites: CollectionRef = { kind: 'sites' };
		const open: CollectionRef = { kind: 'dataset', datasetId: fx.open.dataset };
		const exactSites = await counted(sites);
		const exactOpen = await counted(open);
		expect(exactOpen).toBe(OPEN_IN_BOX + 2);
		// Marked stale (as its sites' insert did; marking is always safe): counted from its sites.
		await db.execute(
			sql`INSERT INTO map_cell_stale (dataset_id) VALUES (${fx.open.dataset}) ON CONFLICT DO NOTHING`
		);
		const cap = { countCap: 5 };
		expect((await itemsPage(db, ANONYMOUS, sites, query(), cap)).numberMatched).toBe(exactSites);
		expect((await itemsPage(db, ANONYMOUS, open, query(), cap)).numberMatched).toBe(exactOpen);
		// Rebuilt: now from its cells.
		await db.execute(sql`SELECT map_cell_refresh(${fx.open.dataset}::uuid)`);
		expect((await itemsPage(db, ANONYMOUS, sites, query(), cap)).numberMatched).toBe(exactSites);
		expect((await itemsPage(db, ANONYMOUS, open, query(), cap)).numberMatched).toBe(exactOpen);
		// A hidden dataset's sites are in no anonymous count, from cells or not.
		await db.execute(sql`SELECT map_cell_refresh(${fx.hidden.dataset}::uuid)`);
		expect((await itemsPage(db, ANONYMOUS, sites, query(), cap)).numberMatched).toBe(exactSites);
	});
});
