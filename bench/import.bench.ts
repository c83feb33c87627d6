/**
 * 100,000-row CSV import, the server's whole path from the uploaded bytes to committed sites:
 * parse once (semicolons, decimal commas) and keep the table with a draft batch; preview (map,
 * UTM → WGS 84, validate, near-duplicates in the file and against visible sites, codes in the
 * dataset) and keep the sites to write; commit (INSERT … SELECT FROM unnest in one transaction).
 * Target under 15 s on the 2-core reference machine. Peak memory is this process's maximum
 * resident set size: it does the server's work (without HTTP and the object store, which the
 * integration tests cover). The rows go into an organisation of their own, deleted at the end.
 * Needs DATABASE_URL (scripts/bench.js starts a private cluster for it).
 */
import { randomUUID } from 'node:crypto';
import { count, eq } from 'drizzle-orm';
import { suggestMapping } from '$lib/imports';
import { ANONYMOUS } from '$lib/server/access';
import { createDb } from '$lib/server/db/client';
import { dataset, importBatch, organisation, site } from '$lib/server/db/schema';
import { draftFromBytes, previewBatchAs } from '$lib/server/imports/draft';
import { runImportBatch } from '$lib/server/imports/run-import';
import { figure, size } from './report';

const ROWS = size(100_000, 20);
const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set; run through `npm run bench`');

function inventedCsv(): string {
	const lines = [
		'Borehole;Easting;Northing;HF (mW/m2);HF sigma (mW/m2);TC (W/mK);TC n;Gradient (°C/km);Method;Year'
	];
	const side = Math.ceil(Math.sqrt(ROWS));
	for (let i = 0; i < ROWS; i++) {
		// 2 km apart: no near-duplicates, so the figure is the plain path.
		const e = 300_000 + (i % side) * 2_000;
		const n = 6_000_000 + Math.floor(i / side) * 2_000;
		const q = 55 + (i % 37);
		lines.push(
			`B-${i};${e},5;${n},5;${q},0;${(q * 0.08).toFixed(1).replace('.', ',')};2,8;12;${(q / 2.8).toFixed(1).replace('.', ',')};Bullard;2001`
		);
	}
	return lines.join('\n');
}

const rows = ROWS.toLocaleString('en');
const { db, client } = createDb(url, { max: 4 });
try {
	const orgId = `bench-${randomUUID()}`;
	await db.insert(organisation).values({ id: orgId, name: 'Bench Org', slug: orgId });
	const [ds] = await db
		.insert(dataset)
		.values({ organisationId: orgId, title: 'bench', licence: 'CC0-1.0' })
		.returning({ id: dataset.id });
	const bytes = new TextEncoder().encode(inventedCsv());
	const sha256 = randomUUID();

	const t0 = performance.now();
	const uploaded = await draftFromBytes(
		db,
		{
			datasetId: ds.id,
			attachmentId: null,
			fileName: 'bench.csv',
			sha256,
			createdBy: null
		},
		bytes
	);
	const t1 = performance.now();
	const batch = {
		id: uploaded.batchId,
		datasetId: ds.id,
		fileName: 'bench.csv',
		fileSha256: sha256,
		status: 'draft' as const,
		revision: 0,
		preview: null,
		createdBy: null,
		hasSites: false
	};
	const preview = await previewBatchAs(
		db,
		ANONYMOUS,
		batch,
		{
			mapping: suggestMapping(uploaded.headers),
			epsg: 25832,
			volcanicArea: false,
			nearDistanceM: 100
		},
		{ corrections: [], excluded: [] }
	);
	if (!preview.canImport) throw new Error(`bench file has errors: ${preview.issues[0]?.message}`);
	const t2 = performance.now();
	await db.update(importBatch).set({ status: 'queued' }).where(eq(importBatch.id, batch.id));
	const outcome = await runImportBatch(db, batch.id);
	const t3 = performance.now();
	if (outcome !== 'done') throw new Error(`import ended ${outcome}`);
	const [{ n }] = await db.select({ n: count() }).from(site).where(eq(site.datasetId, ds.id));
	if (n !== ROWS) throw new Error(`expected ${ROWS} rows, found ${n}`);
	await db.delete(organisation).where(eq(organisation.id, orgId));

	const phase = (id: string, label: string, ms: number, target?: number) =>
		figure({ id, label, value: ms, unit: 'ms', target, better: 'lower', note: 'one run' });
	phase(
		'import.total',
		`${rows}-row CSV import, uploaded bytes to committed sites (parse, preview, unnest insert)`,
		t3 - t0,
		15_000
	);
	phase('import.parse', `${rows}-row CSV import: parse and keep the table`, t1 - t0);
	phase(
		'import.validate',
		`${rows}-row CSV import: preview (UTM → WGS 84, checks, nearby sites)`,
		t2 - t1
	);
	phase('import.insert', `${rows}-row CSV import: insert in one transaction`, t3 - t2);
	figure({
		id: 'import.peak-memory',
		label: `${rows}-row CSV import: peak resident memory of the process doing the server's work`,
		value: Math.round(process.resourceUsage().maxRSS / 1024),
		unit: 'MB',
		better: 'lower',
		note: 'maximum RSS over the whole run'
	});
} finally {
	await client.end();
}
