import { z } from 'zod';
import { regionPolygonSchema, type Position } from './region-shape';

/**
 * Saved regions: a name and an outline (the same GeoJSON Polygon rules as a drawn region,
 * region-shape.ts), optionally shared with one of the owner's organisations. One definition for
 * the region tool (messages while typing) and /api/v1/regions.
 */

/** Most regions one person keeps: a working list, not an archive. */
export const MAX_SAVED_REGIONS = 100;
export const MAX_REGION_NAME = 80;

export const regionNameSchema = z
	.string({ error: 'Give the region a name.' })
	.trim()
	.min(1, 'Give the region a name.')
	.max(MAX_REGION_NAME, `A region name has at most ${MAX_REGION_NAME} characters.`)
	// eslint-disable-next-line no-control-regex -- the point is to refuse control characters
	.refine((s) => !/[\u0000-\u001f\u007f]/.test(s), 'A region name cannot hold control characters.');

const organisationId = z.string().min(1).max(200).nullable().optional().meta({
	description: 'Share with this organisation of yours (its members may pick it); null: only you.'
});

/** POST /api/v1/regions. */
export const newSavedRegionSchema = z.strictObject({
	name: regionNameSchema,
	geometry: regionPolygonSchema,
	organisationId
});

/** PATCH /api/v1/regions/{id}: a new name, a new sharing, or both. */
export const savedRegionChangeSchema = z
	.strictObject({ name: regionNameSchema.optional(), organisationId })
	.refine((v) => v.name !== undefined || v.organisationId !== undefined, {
		message: 'Give a new name or organisationId.'
	});

/** A saved region as the API answers it (and the region tool lists it). */
export interface SavedRegion {
	id: string;
	name: string;
	geometry: { type: 'Polygon'; coordinates: Position[][] };
	/** west, south, east, north: where to fly to. */
	bbox: [number, number, number, number];
	/** Whether the viewer made it (and so may rename, share or delete it). */
	mine: boolean;
	organisation: { id: string; name: string } | null;
	createdAt: string;
	updatedAt: string;
}
