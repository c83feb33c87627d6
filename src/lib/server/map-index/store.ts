import { and, eq, inArray, sql } from 'drizzle-orm';
import type { SiteFilters } from '$lib/sites/filters';
import { visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, mapSiteVersion } from '../db/schema';
import { buildBlock, type SiteBlock, type SiteRow } from './block';

/**
 * The map's in-memory site index, per process: one block per dataset (block.ts), tagged with the
 * dataset's version (migration 0016) read in the same snapshot as its sites. It holds data, never
 * decisions: which datasets a request may count is read per request through visibleOnMaps, with
 * their current versions, and only blocks whose version matches answer from memory. The others
 * are answered from SQL by the caller and reloaded in the background, one at a time.
 */

interface Held {
	version: number;
	block: SiteBlock;
}

const held = new Map<string, Held>();
const pending = new Set<string>();
let loading: Promise<void> | null = null;
/** Most sites held at once (THERMALITH_MAP_INDEX_MAX_SITES); 0 turns the index off. */
let maxSites = 5_000_000;

export function configureMapIndex(options: { maxSites: number }): void {
	maxSites = options.maxSites;
}

/** Whether map requests use the index at all (a cap of 0 answers everything from SQL). */
export function mapIndexEnabled(): boolean {
	return maxSites > 0;
}

/** What a request answers from memory and which datasets it must ask PostgreSQL about. */
export interface IndexPlan {
	blocks: SiteBlock[];
	sqlDatasetIds: string[];
}

/**
 * Read, in one query, the datasets the viewer may see on maps (and the dataset and organisation
 * filters keep) with their current versions; split them into loaded blocks and the rest, and
 * queue the rest for loading. Datasets without a version row have never had a site.
 */
export async function planIndex(db: Db, viewer: Viewer, filters: SiteFilters): Promise<IndexPlan> {
	const rows = await db
		.select({ id: dataset.id, version: mapSiteVersion.version })
		.from(dataset)
		.innerJoin(mapSiteVersion, eq(mapSiteVersion.datasetId, dataset.id))
		.where(
			and(
				visibleOnMaps(viewer),
				filters.dataset.length ? inArray(dataset.id, filters.dataset) : undefined,
				filters.organisation.length
					? inArray(dataset.organisationId, filters.organisation)
					: undefined
			)
		);
	const blocks: SiteBlock[] = [];
	const sqlDatasetIds: string[] = [];
	for (const r of rows) {
		const h = held.get(r.id);
		if (h && h.version === Number(r.version)) blocks.push(h.block);
		else sqlDatasetIds.push(r.id);
	}
	if (sqlDatasetIds.length && maxSites > 0) loadSoon(db, sqlDatasetIds);
	return { blocks, sqlDatasetIds };
}

/**
 * Load one dataset's block: version and sites from one REPEATABLE READ snapshot, so the version
 * names exactly the sites read. A block that would take the index over its cap is not kept.
 */
async function loadDataset(db: Db, id: string): Promise<void> {
	await db.transaction(
		async (tx) => {
			const [v] = await tx
				.select({ version: mapSiteVersion.version })
				.from(mapSiteVersion)
				.where(eq(mapSiteVersion.datasetId, id));
			if (!v) {
				held.delete(id);
				return;
			}
			// Queued twice by requests that planned while it was loading: nothing changed since.
			if (held.get(id)?.version === Number(v.version)) return;
			const rows = await tx.execute<{
				lon: number;
				lat: number;
				hf: number | null;
				q: string | null;
				m: string;
				y: number | null;
				flags: string[];
				log: boolean;
			}>(sql`SELECT ST_X(s.location) AS lon, ST_Y(s.location) AS lat, s.heat_flow_mw_m2 AS hf,
				s.quality_class::text AS q, s.method::text AS m, s.year_measured AS y, s.flags,
				EXISTS (SELECT 1 FROM temperature_log t WHERE t.site_id = s.id) AS log
				FROM site s WHERE s.dataset_id = ${id}::uuid`);
			let others = 0;
			for (const [other, h] of held) if (other !== id) others += h.block.size;
			if (others + rows.length > maxSites) {
				held.delete(id);
				return;
			}
			const siteRows: SiteRow[] = rows.map((r) => ({
				lon: r.lon,
				lat: r.lat,
				heatFlow: r.hf,
				quality: r.q,
				method: r.m,
				year: r.y,
				hasLog: r.log,
				flags: r.flags
			}));
			held.set(id, { version: Number(v.version), block: buildBlock(siteRows) });
		},
		{ isolationLevel: 'repeatable read', accessMode: 'read only' }
	);
}

/**
 * Queue datasets for loading; one loader per process works through the queue in the background
 * (never awaited by a request). Returns the loader's promise for callers that want to wait.
 */
function loadSoon(db: Db, ids: readonly string[]): Promise<void> {
	for (const id of ids) pending.add(id);
	if (!loading && pending.size) loading = drain(db);
	return loading ?? Promise.resolve();
}

/** Work through the queue; `loading` is cleared in the same turn the queue is found empty. */
async function drain(db: Db): Promise<void> {
	try {
		while (pending.size) {
			const [id] = pending;
			pending.delete(id);
			await loadDataset(db, id).catch((err: Error) =>
				console.error(`map index: loading dataset ${id} failed: ${err.message}`)
			);
		}
	} finally {
		loading = null;
	}
}

/**
 * Load every dataset whose block is missing or outdated and drop blocks of datasets that are
 * gone; resolves when done. Called at server start (not awaited there) and by tests.
 */
export async function loadAll(db: Db): Promise<void> {
	if (maxSites <= 0) return;
	const rows = await db
		.select({ id: dataset.id, version: mapSiteVersion.version })
		.from(dataset)
		.innerJoin(mapSiteVersion, eq(mapSiteVersion.datasetId, dataset.id));
	const current = new Map(rows.map((r) => [r.id, Number(r.version)]));
	for (const id of held.keys()) if (!current.has(id)) held.delete(id);
	const outdated = rows.filter((r) => held.get(r.id)?.version !== Number(r.version));
	await loadSoon(
		db,
		outdated.map((r) => r.id)
	);
	// A loader already running when this was called may have finished before our ids were queued.
	while (loading) await loading;
}

/** Sites held in memory now (for the README's memory figures and the benchmark). */
export function heldSites(): number {
	let n = 0;
	for (const h of held.values()) n += h.block.size;
	return n;
}

/** Forget every block (tests). */
export function clearMapIndex(): void {
	held.clear();
	pending.clear();
}
