/**
 * 10,000-row CSV import: parse (semicolons, decimal commas) + map + validate with UTM → WGS 84
 * transforms + insert in one transaction into PostgreSQL/PostGIS. Target under 10 s.
 * The rows go into an organisation of their own, deleted again at the end.
 * Needs DATABASE_URL (scripts/bench.js starts a private cluster for it).
 */
import { randomUUID } from 'node:crypto';
import { count, eq } from 'drizzle-orm';
import { buildPreview, parseCsv, suggestMapping } from '$lib/imports';
import { createDb } from '$lib/server/db/client';
import { dataset, organisation, site } from '$lib/server/db/schema';
import { insertSites } from '$lib/server/imports/run-import';
import { figure, size } from './report';

const ROWS = size(10_000, 20);
const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set; run through `npm run bench`');

function inventedCsv(): string {
	const lines = [
		'Borehole;Easting;Northing;HF (mW/m2);HF sigma (mW/m2);TC (W/mK);TC n;Gradient (°C/km);Method;Year'
	];
	for (let i = 0; i < ROWS; i++) {
		const e = 300_000 + (i % 100) * 2_000;
		const n = 6_450_000 + Math.floor(i / 100) * 2_000;
		const q = 55 + (i % 37);
		lines.push(
			`B-${i};${e},5;${n},5;${q},0;${(q * 0.08).toFixed(1).replace('.', ',')};2,8;12;${(q / 2.8).toFixed(1).replace('.', ',')};Bullard;2001`
		);
	}
	return lines.join('\n');
}

const { db, client } = createDb(url, { max: 4 });
try {
	const orgId = `bench-${randomUUID()}`;
	await db.insert(organisation).values({ id: orgId, name: 'Bench Org', slug: orgId });
	const [ds] = await db
		.insert(dataset)
		.values({ organisationId: orgId, title: 'bench', licence: 'CC0-1.0' })
		.returning({ id: dataset.id });
	const text = inventedCsv();

	const t0 = performance.now();
	const table = parseCsv(text);
	const t1 = performance.now();
	const preview = buildPreview(table, { mapping: suggestMapping(table.headers), epsg: 25832 });
	const t2 = performance.now();
	if (preview.errorCount > 0)
		throw new Error(`bench file has errors: ${preview.issues[0].message}`);
	const rows = preview.rows.map((r) => ({ ...r.site!, datasetId: ds.id }));
	await insertSites(db, ds.id, rows, async () => {});
	const t3 = performance.now();
	const [{ n }] = await db.select({ n: count() }).from(site).where(eq(site.datasetId, ds.id));
	if (n !== ROWS) throw new Error(`expected ${ROWS} rows, found ${n}`);
	await db.delete(organisation).where(eq(organisation.id, orgId));

	const phase = (id: string, label: string, ms: number, target?: number) =>
		figure({ id, label, value: ms, unit: 'ms', target, better: 'lower', note: 'one run' });
	phase(
		'import.total',
		'10,000-row CSV import (parse, UTM → WGS 84, validate, insert in one transaction)',
		t3 - t0,
		10_000
	);
	phase('import.parse', '10,000-row CSV import: parse', t1 - t0);
	phase('import.validate', '10,000-row CSV import: map, transform and validate', t2 - t1);
	phase('import.insert', '10,000-row CSV import: insert in one transaction', t3 - t2);
} finally {
	await client.end();
}
