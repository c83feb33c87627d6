import { and, between, eq, inArray, notInArray, sql, type SQL } from 'drizzle-orm';
import { cellBounds, cellSizeM, toMercator, type MapCell } from '$lib/map/grid';
import { isFiltered, type SiteFilters } from '$lib/sites/filters';
import { visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, mapCell, mapCellStale } from '../db/schema';
import type { BoundingBox } from './sites';

/**
 * The map's pre-built cells (migration 0015): per dataset and zoom 0-9, count, values, sum, min
 * and max of its sites' heat flow. A view sums them over the datasets the viewer may see
 * (visibleOnMaps on the dataset, checked at query time), so visibility stays exact: the cells of
 * a hidden dataset are never read. Datasets whose sites changed since their cells were built are
 * marked stale by triggers and answered from their sites (`liveParts`) until rebuilt.
 */

/** The finest zoom with pre-built cells (coarser zooms are built from it). */
export const PREBUILT_MAX_ZOOM = 9;

/** Sums of one cell, from which cells of several sources add up exactly. */
export interface CellParts {
	ix: number;
	iy: number;
	count: number;
	withValue: number;
	sumMWm2: number | null;
	minMWm2: number | null;
	maxMWm2: number | null;
}

/** Whether pre-built cells answer a view: only dataset and organisation filters narrow it. */
export function prebuiltCanAnswer(zoom: number, filters: SiteFilters): boolean {
	return zoom <= PREBUILT_MAX_ZOOM && !isFiltered({ ...filters, dataset: [], organisation: [] });
}

/** The cells covering a box, and the box of those whole cells (for the stale datasets' sites). */
export function cellRange(box: BoundingBox, zoom: number) {
	const size = cellSizeM(zoom);
	const [x0, y0] = toMercator(box.west, box.south);
	const [x1, y1] = toMercator(box.east, box.north);
	const ix = [Math.floor(x0 / size), Math.floor(x1 / size)] as const;
	const iy = [Math.floor(y0 / size), Math.floor(y1 / size)] as const;
	const [[w, s]] = cellBounds(ix[0], iy[0], zoom);
	const [, [e, n]] = cellBounds(ix[1], iy[1], zoom);
	const whole: BoundingBox = {
		west: Math.max(-180, w),
		south: Math.max(-90, s),
		east: Math.min(180, e),
		north: Math.min(90, n)
	};
	return { ix, iy, whole };
}

/** Stale datasets, read once per view so the two halves of the answer split them the same way. */
export async function staleDatasetIds(db: Db): Promise<string[]> {
	return (await db.select({ id: mapCellStale.datasetId }).from(mapCellStale)).map((r) => r.id);
}

/** Pre-built cells of the visible, non-stale datasets in a cell range. */
export async function prebuiltParts(
	db: Db,
	viewer: Viewer,
	range: ReturnType<typeof cellRange>,
	zoom: number,
	filters: SiteFilters,
	stale: string[]
): Promise<CellParts[]> {
	const conditions: (SQL | undefined)[] = [
		eq(mapCell.zoom, zoom),
		between(mapCell.ix, range.ix[0], range.ix[1]),
		between(mapCell.iy, range.iy[0], range.iy[1]),
		visibleOnMaps(viewer),
		stale.length ? notInArray(mapCell.datasetId, stale) : undefined,
		filters.dataset.length ? inArray(dataset.id, filters.dataset) : undefined,
		filters.organisation.length ? inArray(dataset.organisationId, filters.organisation) : undefined
	];
	return db
		.select({
			ix: mapCell.ix,
			iy: mapCell.iy,
			count: sql<number>`sum(${mapCell.count})::int`,
			withValue: sql<number>`sum(${mapCell.withValue})::int`,
			sumMWm2: sql<number | null>`sum(${mapCell.sumMWm2})`,
			minMWm2: sql<number | null>`min(${mapCell.minMWm2})`,
			maxMWm2: sql<number | null>`max(${mapCell.maxMWm2})`
		})
		.from(mapCell)
		.innerJoin(dataset, eq(mapCell.datasetId, dataset.id))
		.where(and(...conditions))
		.groupBy(mapCell.ix, mapCell.iy);
}

/** Cells of several sources added up, as the map API sends them. */
export function combineParts(...sources: CellParts[][]): MapCell[] {
	const byCell = new Map<string, CellParts>();
	for (const parts of sources) {
		for (const p of parts) {
			const key = `${p.ix},${p.iy}`;
			const had = byCell.get(key);
			if (!had) {
				byCell.set(key, { ...p });
				continue;
			}
			had.count += p.count;
			had.withValue += p.withValue;
			had.sumMWm2 = p.sumMWm2 === null ? had.sumMWm2 : (had.sumMWm2 ?? 0) + p.sumMWm2;
			had.minMWm2 = p.minMWm2 === null ? had.minMWm2 : Math.min(had.minMWm2 ?? Infinity, p.minMWm2);
			had.maxMWm2 =
				p.maxMWm2 === null ? had.maxMWm2 : Math.max(had.maxMWm2 ?? -Infinity, p.maxMWm2);
		}
	}
	return [...byCell.values()]
		.filter((c) => c.count > 0)
		.sort((a, b) => a.ix - b.ix || a.iy - b.iy)
		.map((c) => ({
			ix: c.ix,
			iy: c.iy,
			count: c.count,
			meanMWm2:
				c.withValue > 0 && c.sumMWm2 !== null
					? Math.round((c.sumMWm2 / c.withValue) * 10) / 10
					: null,
			minMWm2: c.minMWm2,
			maxMWm2: c.maxMWm2
		}));
}

let refreshing = false;

/**
 * Rebuild the cells of stale datasets, one transaction each, in the background of a map request
 * (never awaited by it: stale datasets are answered from their sites meanwhile). An advisory lock
 * keeps it to one rebuild at a time across processes.
 */
export function refreshStaleCellsSoon(db: Db, stale: string[]): void {
	if (refreshing || stale.length === 0) return;
	refreshing = true;
	refreshStaleCells(db, stale)
		.catch((err: Error) => console.error(`map cells: rebuild failed: ${err.message}`))
		.finally(() => {
			refreshing = false;
		});
}

/**
 * A dataset deleted since it was found stale is skipped quietly and its marker dropped: its
 * cells went with it. The dataset row is locked (KEY SHARE) before the rebuild, so a delete
 * either ends before it (no row: skip) or waits for it; the rebuild's cells can then never
 * point at a dataset deleted meanwhile (a foreign-key failure, or a deadlock with the delete).
 */
export async function refreshStaleCells(db: Db, stale: string[]): Promise<void> {
	for (const id of stale) {
		await db.transaction(async (tx) => {
			const [lock] = await tx.execute<{ ok: boolean }>(
				sql`SELECT pg_try_advisory_xact_lock(hashtext('map_cell_refresh')) AS ok`
			);
			if (!lock.ok) return;
			const kept = await tx.execute(
				sql`SELECT 1 FROM ${dataset} WHERE ${dataset.id} = ${id}::uuid FOR KEY SHARE`
			);
			if (kept.length === 0) await tx.delete(mapCellStale).where(eq(mapCellStale.datasetId, id));
			else await tx.execute(sql`SELECT map_cell_refresh(${id}::uuid)`);
		});
	}
}
