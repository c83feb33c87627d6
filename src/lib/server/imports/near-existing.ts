import { sql } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, site } from '../db/schema';

export const NEAR_EXISTING_M = 100;

/**
 * For each location, the closest site within `distanceM` (default 100 m) that the viewer may see (in any dataset),
 * found with PostGIS geography distance on the GiST index over location::geography.
 * Returns a map from "lon,lat" to a message for the preview warning.
 */
export async function nearbyExistingSites(
	db: Db,
	viewer: Viewer,
	points: { lon: number; lat: number }[],
	distanceM: number = NEAR_EXISTING_M
): Promise<Map<string, string>> {
	const found = new Map<string, string>();
	const CHUNK = 5000;
	for (let start = 0; start < points.length; start += CHUNK) {
		const part = points.slice(start, start + CHUNK);
		const lons = part.map((p) => p.lon);
		const lats = part.map((p) => p.lat);
		const rows = await db.execute<{
			lon: number;
			lat: number;
			code: string;
			title: string;
			distance_m: number;
		}>(sql`
			SELECT r.lon, r.lat, near.code, near.title, near.distance_m
			FROM unnest(${sql.param(lons)}::float8[], ${sql.param(lats)}::float8[]) AS r(lon, lat)
			CROSS JOIN LATERAL (
				SELECT ${site.code} AS code, ${dataset.title} AS title,
					ST_Distance(${site.location}::geography, ST_SetSRID(ST_MakePoint(r.lon, r.lat), 4326)::geography) AS distance_m
				FROM ${site} JOIN ${dataset} ON ${site.datasetId} = ${dataset.id}
				WHERE ST_DWithin(${site.location}::geography, ST_SetSRID(ST_MakePoint(r.lon, r.lat), 4326)::geography, ${distanceM})
					AND ${visibleDatasets(viewer)}
				ORDER BY distance_m
				LIMIT 1
			) AS near`);
		for (const r of rows) {
			found.set(
				`${r.lon},${r.lat}`,
				`${Math.round(r.distance_m)} m from existing site ${r.code} in "${r.title}"; check it is not the same borehole.`
			);
		}
	}
	return found;
}
