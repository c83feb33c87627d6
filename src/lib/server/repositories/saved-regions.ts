import { error } from '@sveltejs/kit';
import { and, asc, count, eq, inArray, sql } from 'drizzle-orm';
import type { Position, Region } from '$lib/map/region-shape';
import { MAX_SAVED_REGIONS, type SavedRegion } from '$lib/map/saved-region';
import {
	mayShareWith,
	notFound,
	ownRegions,
	requireUuid,
	visibleRegions,
	type Viewer
} from '../access';
import type { Db } from '../db/client';
import { organisation, savedRegion } from '../db/schema';
import { recordAudit } from './audit';
import { assertValidRegion } from './map';

/**
 * Saved map regions of a viewer: their own and those shared with their organisations
 * (access/regions.ts). Hidden and unknown ids get the same 404; a member may pick a region shared
 * with their organisation but only its owner may rename, re-share or delete it (403). Saving and
 * deleting are audited like API keys.
 */

const columns = {
	id: savedRegion.id,
	name: savedRegion.name,
	ownerId: savedRegion.ownerId,
	geometry: sql<string>`ST_AsGeoJSON(${savedRegion.outline})`,
	bbox: sql<string>`concat_ws(',', ST_XMin(${savedRegion.outline}), ST_YMin(${savedRegion.outline}), ST_XMax(${savedRegion.outline}), ST_YMax(${savedRegion.outline}))`,
	organisationId: savedRegion.organisationId,
	organisationName: organisation.name,
	createdAt: savedRegion.createdAt,
	updatedAt: savedRegion.updatedAt
};
type Row = {
	id: string;
	name: string;
	ownerId: string;
	geometry: string;
	bbox: string;
	organisationId: string | null;
	organisationName: string | null;
	createdAt: Date;
	updatedAt: Date;
};

function present(row: Row, viewer: Viewer): SavedRegion {
	return {
		id: row.id,
		name: row.name,
		geometry: JSON.parse(row.geometry),
		bbox: row.bbox.split(',').map(Number) as SavedRegion['bbox'],
		mine: row.ownerId === viewer.userId,
		organisation:
			row.organisationId && row.organisationName
				? { id: row.organisationId, name: row.organisationName }
				: null,
		createdAt: row.createdAt.toISOString(),
		updatedAt: row.updatedAt.toISOString()
	};
}

const selectRegions = (db: Db) =>
	db
		.select(columns)
		.from(savedRegion)
		.leftJoin(organisation, eq(savedRegion.organisationId, organisation.id));

function signedIn(viewer: Viewer): string {
	if (!viewer.userId) error(401, 'Sign in to keep regions.');
	return viewer.userId;
}

/** The viewer's regions and those shared with their organisations, by name. */
export async function listSavedRegions(db: Db, viewer: Viewer): Promise<SavedRegion[]> {
	signedIn(viewer);
	const rows = await selectRegions(db)
		.where(visibleRegions(viewer))
		.orderBy(asc(sql`lower(${savedRegion.name})`), asc(savedRegion.id));
	return rows.map((r) => present(r, viewer));
}

/** The organisations the viewer may share a region with (those they belong to), by name. */
export async function regionSharingOptions(
	db: Db,
	viewer: Viewer
): Promise<{ id: string; name: string }[]> {
	const ids = Object.keys(viewer.roles);
	if (!viewer.userId || !ids.length) return [];
	return db
		.select({ id: organisation.id, name: organisation.name })
		.from(organisation)
		.where(inArray(organisation.id, ids))
		.orderBy(asc(organisation.name));
}

/** One region the viewer may see, or the 404 of hidden and unknown ids. */
export async function getSavedRegion(db: Db, viewer: Viewer, id: string): Promise<SavedRegion> {
	signedIn(viewer);
	requireUuid(id);
	const [row] = await selectRegions(db).where(and(eq(savedRegion.id, id), visibleRegions(viewer)));
	if (!row) notFound();
	return present(row, viewer);
}

/** A saved region as the region of the statistics and downloads (`region=<id>`). */
export async function savedRegionShape(db: Db, viewer: Viewer, id: string): Promise<Region> {
	const found = await getSavedRegion(db, viewer, id);
	return { kind: 'polygon', ring: found.geometry.coordinates[0] as Position[] };
}

const outlineOf = (ring: readonly Position[]) =>
	sql`ST_SetSRID(ST_GeomFromGeoJSON(${JSON.stringify({ type: 'Polygon', coordinates: [ring] })}), 4326)`;

function isUniqueViolation(e: unknown): boolean {
	const err = e as { code?: string; cause?: { code?: string } };
	return err?.code === '23505' || err?.cause?.code === '23505';
}

const duplicate = (name: string) =>
	`You already have a region named “${name}”; choose another name.`;

function checkSharing(viewer: Viewer, organisationId: string | null | undefined) {
	if (organisationId && !mayShareWith(viewer, organisationId))
		error(403, 'You can share a region only with an organisation you belong to.');
}

/** Save a region of the viewer's (a valid polygon, a name of theirs not yet used). */
export async function createSavedRegion(
	db: Db,
	viewer: Viewer,
	input: { name: string; geometry: Position[]; organisationId?: string | null }
): Promise<SavedRegion> {
	const ownerId = signedIn(viewer);
	checkSharing(viewer, input.organisationId);
	// PostGIS's reason for a crossing outline, as the statistics give it (a 400).
	await assertValidRegion(db, { kind: 'polygon', ring: input.geometry });
	let id: string;
	try {
		id = await db.transaction(async (tx) => {
			// Counted under a lock on the owner's rows, so two saves at once cannot pass the limit.
			await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtext(${`saved_region:${ownerId}`}))`);
			const [{ n }] = await tx
				.select({ n: count() })
				.from(savedRegion)
				.where(eq(savedRegion.ownerId, ownerId));
			if (n >= MAX_SAVED_REGIONS)
				error(
					409,
					`You keep ${MAX_SAVED_REGIONS} regions already, the most there may be; delete one first.`
				);
			const [row] = await tx
				.insert(savedRegion)
				.values({
					ownerId,
					name: input.name,
					organisationId: input.organisationId ?? null,
					outline: outlineOf(input.geometry) as unknown as string
				})
				.returning({ id: savedRegion.id });
			await recordAudit(tx, viewer, {
				action: 'region.save',
				organisationId: input.organisationId ?? null,
				datasetId: null,
				details: { regionId: row.id, name: input.name, corners: input.geometry.length - 1 }
			});
			return row.id;
		});
	} catch (e) {
		if (isUniqueViolation(e)) error(409, duplicate(input.name));
		throw e;
	}
	return getSavedRegion(db, viewer, id);
}

/** The region for a change: 404 unless visible, 403 unless the viewer's own. */
async function ownRegion(db: Db, viewer: Viewer, id: string) {
	const found = await getSavedRegion(db, viewer, id);
	if (!found.mine) error(403, 'Only the person who saved this region may change or delete it.');
	return found;
}

/** Rename a region of the viewer's, or share it with one of their organisations (null: stop). */
export async function changeSavedRegion(
	db: Db,
	viewer: Viewer,
	id: string,
	change: { name?: string; organisationId?: string | null }
): Promise<SavedRegion> {
	await ownRegion(db, viewer, id);
	checkSharing(viewer, change.organisationId);
	try {
		await db
			.update(savedRegion)
			.set({
				...(change.name !== undefined ? { name: change.name } : {}),
				...(change.organisationId !== undefined ? { organisationId: change.organisationId } : {}),
				updatedAt: new Date()
			})
			.where(and(eq(savedRegion.id, id), ownRegions(viewer)));
	} catch (e) {
		if (isUniqueViolation(e)) error(409, duplicate(change.name ?? ''));
		throw e;
	}
	return getSavedRegion(db, viewer, id);
}

/** Delete a region of the viewer's (audited with its name). */
export async function deleteSavedRegion(db: Db, viewer: Viewer, id: string): Promise<void> {
	await ownRegion(db, viewer, id);
	await db.transaction(async (tx) => {
		const rows = await tx
			.delete(savedRegion)
			.where(and(eq(savedRegion.id, id), ownRegions(viewer)))
			.returning({ name: savedRegion.name, organisationId: savedRegion.organisationId });
		if (!rows.length) notFound();
		await recordAudit(tx, viewer, {
			action: 'region.delete',
			organisationId: rows[0].organisationId,
			datasetId: null,
			details: { regionId: id, name: rows[0].name }
		});
	});
}
