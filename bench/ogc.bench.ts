/**
 * OGC API – Features items throughput, in process: the repository query (visibility, keyset page,
 * numberMatched), the GeoJSON document and its serialisation, as /ogc/collections/{id}/items runs
 * them, without HTTP. 200,000 invented public sites; one client pages through all of them with
 * the next links (limit 1,000), then asks a 1,000-site page inside a small box. The rows go into
 * an organisation of their own, deleted again at the end.
 * Needs DATABASE_URL (scripts/bench.js starts a private cluster for it).
 */
import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { ANONYMOUS } from '$lib/server/access';
import { createDb } from '$lib/server/db/client';
import { dataset, organisation } from '$lib/server/db/schema';
import { items } from '$lib/server/ogc/documents';
import { parseItemsQuery, type CollectionRef } from '$lib/server/ogc/params';
import { itemsPage } from '$lib/server/ogc/repository';
import { percentilesInPlace } from '$lib/thermal/percentile';
import { figure, size } from './report';

const SITES = size(200_000, 300);
const LIMIT = size(1_000, 50);
const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set; run through `npm run bench`');

const { db, client } = createDb(url, { max: 4 });
const orgId = `bench-ogc-${randomUUID()}`;
try {
	await db.insert(organisation).values({ id: orgId, name: 'Bench OGC Org', slug: orgId });
	const [ds] = await db
		.insert(dataset)
		.values({
			organisationId: orgId,
			title: 'bench ogc',
			licence: 'CC0-1.0',
			status: 'published',
			visibility: 'public'
		})
		.returning({ id: dataset.id });
	// Sites on a regular grid over 20° × 10° of an invented region; values vary with the index.
	await db.execute(sql`
		INSERT INTO site (dataset_id, code, location, heat_flow_mw_m2, year_measured)
		SELECT ${ds.id}, 'OB-' || g,
			ST_SetSRID(ST_MakePoint(-40 + (g % 1000) * 0.02, -60 + (g / 1000) * 0.05), 4326),
			40 + (g % 80), 1970 + (g % 50)
		FROM generate_series(0, ${SITES - 1}) AS g`);
	await db.execute(sql`ANALYZE site`);
	const ref: CollectionRef = { kind: 'dataset', datasetId: ds.id };
	const base = 'http://bench.example/ogc';

	const page = async (query: string) => {
		const params = new URLSearchParams(query);
		const parsed = parseItemsQuery(params);
		if (!parsed.ok) throw new Error(parsed.message);
		const result = await itemsPage(db, ANONYMOUS, ref, parsed.value);
		const body = JSON.stringify(items(base, ref, result, params, parsed.value.limit).json);
		return { result, bytes: body.length };
	};

	const pageMs: number[] = [];
	let seen = 0;
	let after: string | null = null;
	const t0 = performance.now();
	do {
		const started = performance.now();
		const { result } = await page(`limit=${LIMIT}${after ? `&after=${after}` : ''}`);
		pageMs.push(performance.now() - started);
		seen += result.features.length;
		after = result.nextAfter;
	} while (after);
	const total = performance.now() - t0;
	if (seen !== SITES) throw new Error(`paged ${seen} sites, expected ${SITES}`);

	const boxMs: number[] = [];
	for (let i = 0; i < size(20, 2); i++) {
		const started = performance.now();
		await page(`limit=${LIMIT}&bbox=-30,-55,-25,-50`);
		boxMs.push(performance.now() - started);
	}
	await db.delete(organisation).where(eq(organisation.id, orgId));

	const [p50, p99] = percentilesInPlace(Float64Array.from(pageMs), [0.5, 0.99]);
	const [boxP50] = percentilesInPlace(Float64Array.from(boxMs), [0.5]);
	const note = `${SITES} sites, ${pageMs.length} pages of ${LIMIT}, one client, in process (no HTTP)`;
	figure({
		id: 'ogc.items-throughput',
		label: `OGC items: features per second paging a ${SITES.toLocaleString('en')}-site collection`,
		value: (seen / total) * 1000,
		unit: 'items/s',
		better: 'higher',
		note
	});
	figure({
		id: 'ogc.items-page-p50',
		label: `OGC items: page of ${LIMIT}, median`,
		value: p50,
		unit: 'ms',
		better: 'lower',
		note
	});
	figure({
		id: 'ogc.items-page-p99',
		label: `OGC items: page of ${LIMIT}, p99`,
		value: p99,
		unit: 'ms',
		better: 'lower',
		note
	});
	figure({
		id: 'ogc.items-bbox-page-p50',
		label: `OGC items: page of ${LIMIT} inside a 5° box, median`,
		value: boxP50,
		unit: 'ms',
		better: 'lower',
		note: `${boxMs.length} runs`
	});
} finally {
	await db
		.delete(organisation)
		.where(eq(organisation.id, orgId))
		.catch(() => {});
	await client.end();
}
