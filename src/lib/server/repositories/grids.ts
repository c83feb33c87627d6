import { createHash } from 'node:crypto';
import { and, asc, count, eq, inArray, isNotNull, ne, sql } from 'drizzle-orm';
import { planGrid, type GridPlan } from '$lib/grids/plan';
import { projector } from '$lib/grids/projection';
import { MIN_GRID_SITES, type GridRequest } from '$lib/grids/request';
import { notFound, requireUuid, visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, grid, organisation, site, type Grid } from '../db/schema';
import { siteFilterConditions } from './sites';

/** A site as a grid job uses it: where (lon/lat and projected metres), what, from which dataset. */
export interface GridSample {
	siteId: string;
	datasetId: string;
	lon: number;
	lat: number;
	x: number;
	y: number;
	heatFlowMWm2: number;
	sigmaMWm2: number | null;
}

export class GridRequestError extends Error {}

/**
 * Sites with a heat flow the viewer may see on maps (visibleOnMaps, the one rule) inside the
 * region, with the map's filters, in a stable order.
 */
async function visibleGridSites(db: Db, viewer: Viewer, req: GridRequest) {
	const [w, s, e, n] = req.bbox;
	const envelope = sql`ST_MakeEnvelope(${w}, ${s}, ${e}, ${n}, 4326)`;
	return db
		.select({
			siteId: site.id,
			datasetId: site.datasetId,
			lon: sql<number>`ST_X(${site.location})`,
			lat: sql<number>`ST_Y(${site.location})`,
			heatFlowMWm2: sql<number>`${site.heatFlowMWm2}`,
			sigmaMWm2: site.heatFlowSigmaMWm2
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(
			and(
				sql`${site.location} && ${envelope}`,
				isNotNull(site.heatFlowMWm2),
				visibleOnMaps(viewer),
				...siteFilterConditions({ ...req.filters, page: 1 })
			)
		)
		.orderBy(asc(site.id));
}

/**
 * The cache key: the request and every value of every site it uses. What a viewer may see is
 * in it through the sites (two viewers who see the same sites share a grid; one who sees a
 * site less gets another key), and so is the data's version: a changed value is a new key.
 */
export function gridInputHash(req: GridRequest, plan: GridPlan, samples: GridSample[]): string {
	const h = createHash('sha256');
	h.update(JSON.stringify({ v: 1, req, plan }));
	for (const s of samples)
		h.update(`\n${s.siteId};${s.lon};${s.lat};${s.heatFlowMWm2};${s.sigmaMWm2 ?? ''}`);
	return h.digest('hex');
}

/**
 * Plan a grid for the viewer and find or create its row. Returns the row id, whether it was
 * already there (computed or in progress), and whether a job must be queued. Refuses with a
 * GridRequestError (a sentence) what cannot be gridded.
 */
export async function findOrCreateGrid(
	db: Db,
	viewer: Viewer,
	req: GridRequest
): Promise<{ id: string; cached: boolean }> {
	const planned = planGrid(req);
	if (!planned.ok) throw new GridRequestError(planned.error);
	const { plan } = planned;
	const { forward } = projector(plan.crs);
	const rows = await visibleGridSites(db, viewer, req);
	if (rows.length < MIN_GRID_SITES)
		throw new GridRequestError(
			`the region has ${rows.length} visible site(s) with a heat flow; at least ${MIN_GRID_SITES} are needed for a grid`
		);
	const samples: GridSample[] = rows.map((r) => {
		const [x, y] = forward(r.lon, r.lat);
		return { ...r, x, y };
	});
	const inputHash = gridInputHash(req, plan, samples);
	const existing = await liveGridByHash(db, inputHash);
	if (existing) return { id: existing, cached: true };
	const datasetIds = [...new Set(samples.map((s) => s.datasetId))].sort();
	const inserted = await db
		.insert(grid)
		.values({
			inputHash,
			request: req as unknown as Record<string, unknown>,
			plan: plan as unknown as Record<string, unknown>,
			samples,
			datasetIds,
			requestedBy: viewer.userId
		})
		.onConflictDoNothing()
		.returning({ id: grid.id });
	if (inserted.length) return { id: inserted[0].id, cached: false };
	// Someone else inserted the same grid a moment ago.
	const raced = await liveGridByHash(db, inputHash);
	if (!raced) throw new Error('grid row vanished after a conflicting insert');
	return { id: raced, cached: true };
}

async function liveGridByHash(db: Db, inputHash: string): Promise<string | null> {
	const [row] = await db
		.select({ id: grid.id })
		.from(grid)
		.where(and(eq(grid.inputHash, inputHash), ne(grid.status, 'failed')));
	return row?.id ?? null;
}

/** Forget a row whose job could not be queued, so the next request tries again. */
export async function deleteQueuedGrid(db: Db, id: string): Promise<void> {
	await db.delete(grid).where(and(eq(grid.id, id), eq(grid.status, 'queued')));
}

/**
 * A grid the viewer may read: every dataset that shaped it must be visible to the viewer now
 * (visibleOnMaps), so a grid computed for a member is never shown to someone who may see less,
 * and a dataset withdrawn since hides its grids too. Otherwise the shared 404.
 */
export async function gridForViewer(db: Db, viewer: Viewer, id: string): Promise<Grid> {
	requireUuid(id);
	const [row] = await db.select().from(grid).where(eq(grid.id, id));
	if (!row) notFound();
	const [{ seen }] = await db
		.select({ seen: count() })
		.from(dataset)
		.where(and(inArray(dataset.id, row.datasetIds), visibleOnMaps(viewer)));
	if (seen !== row.datasetIds.length) notFound();
	return row;
}

/** Citation and licence of each dataset that shaped a grid (for its downloads). */
export async function gridSources(db: Db, datasetIds: string[]) {
	if (datasetIds.length === 0) return [];
	return db
		.select({
			id: dataset.id,
			title: dataset.title,
			version: dataset.version,
			citation: dataset.citation,
			doi: dataset.doi,
			licence: dataset.licence,
			organisation: organisation.name
		})
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(inArray(dataset.id, datasetIds))
		.orderBy(asc(dataset.title));
}

/** The job's view of a row (no access check: the worker acts for whoever requested it). */
export async function gridForJob(db: Db, id: string): Promise<Grid | null> {
	const [row] = await db.select().from(grid).where(eq(grid.id, id));
	return row ?? null;
}

/** Start a run: the row is now this run's (its attempt number), unless the grid is already done. */
export async function markGridRunning(db: Db, id: string): Promise<number | null> {
	const [row] = await db
		.update(grid)
		.set({ status: 'running', progress: 0, error: null, attempt: sql`${grid.attempt} + 1` })
		.where(and(eq(grid.id, id), inArray(grid.status, ['queued', 'running'])))
		.returning({ attempt: grid.attempt });
	return row?.attempt ?? null;
}

const ownedBy = (id: string, attempt: number) =>
	and(eq(grid.id, id), eq(grid.attempt, attempt), eq(grid.status, 'running'));

/** Progress of a run; false when a later run owns the row (this one should stop). */
export async function setGridProgress(
	db: Db,
	id: string,
	attempt: number,
	progress: number
): Promise<boolean> {
	const rows = await db
		.update(grid)
		.set({ progress })
		.where(ownedBy(id, attempt))
		.returning({ id: grid.id });
	return rows.length > 0;
}

/** The finished grid, written in one statement: a reader sees all of it or none. */
export async function finishGrid(
	db: Db,
	id: string,
	attempt: number,
	result: Record<string, unknown>,
	value: Float32Array,
	sigma: Float32Array | null
): Promise<void> {
	await db
		.update(grid)
		.set({
			status: 'done',
			progress: 1,
			result,
			valueCells: Buffer.from(value.buffer, value.byteOffset, value.byteLength),
			sigmaCells: sigma ? Buffer.from(sigma.buffer, sigma.byteOffset, sigma.byteLength) : null,
			finishedAt: new Date()
		})
		.where(ownedBy(id, attempt));
}

export async function failGrid(
	db: Db,
	id: string,
	attempt: number,
	message: string
): Promise<void> {
	await db
		.update(grid)
		.set({ status: 'failed', error: message, finishedAt: new Date() })
		.where(ownedBy(id, attempt));
}
