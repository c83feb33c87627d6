import type { ApiDatasetRow, ApiSiteRow } from '../repositories/api';

/** Rows as the API documents them (src/lib/api/schemas.ts): dates as ISO text, citation grouped. */

export function presentDataset(row: ApiDatasetRow, origin: string) {
	const { citation, updatedAt, ...rest } = row;
	return {
		...rest,
		citation: { text: citation, doi: row.doi, url: `${origin}/datasets/${row.id}` },
		sites: Number(row.sites),
		updatedAt: updatedAt.toISOString()
	};
}

export function presentSite(row: ApiSiteRow) {
	return { ...row, lon: Number(row.lon), lat: Number(row.lat) };
}

/** A site as an RFC 7946 Feature: [lon, lat] in WGS 84, the rest as properties. */
export function siteFeature(row: ApiSiteRow) {
	const { lon, lat, ...properties } = presentSite(row);
	return {
		type: 'Feature' as const,
		id: row.id,
		geometry: { type: 'Point' as const, coordinates: [lon, lat] },
		properties
	};
}
