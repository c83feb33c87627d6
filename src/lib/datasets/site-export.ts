/**
 * A dataset's sites as CSV and GeoJSON downloads, each carrying the citation, licence (SPDX) and
 * version: a `#` header block in CSV, a `metadata` member in GeoJSON (RFC 7946 §6.1 allows
 * foreign members). Columns are the upload template's (site-columns.ts).
 */
import { writeCsv, type CsvCell } from '../csv/write';
import { citationComments, type CitationFields } from './citation';
import { SITE_EXPORT_COLUMNS } from './site-columns';

/** A site row with `lon`/`lat` in degrees (WGS 84) and the other keys of the site table. */
export type ExportSite = Record<string, unknown> & { lon: number; lat: number };

/** A site value as a CSV cell (lists joined with commas); shared with the region download. */
export function sitesCsvCell(v: unknown): CsvCell {
	if (Array.isArray(v)) return v.join(', ');
	if (v === null || v === undefined) return null;
	return typeof v === 'number' || typeof v === 'boolean' ? v : String(v);
}

export function sitesCsv(sites: readonly ExportSite[], citation: CitationFields): string {
	return writeCsv(
		SITE_EXPORT_COLUMNS.map((c) => c.header),
		sites.map((s) => SITE_EXPORT_COLUMNS.map((c) => sitesCsvCell(s[c.key]))),
		citationComments(citation)
	);
}

export function sitesGeoJson(sites: readonly ExportSite[], citation: CitationFields) {
	const props = SITE_EXPORT_COLUMNS.filter((c) => c.key !== 'lon' && c.key !== 'lat');
	return {
		type: 'FeatureCollection' as const,
		metadata: {
			citation: citation.citation,
			title: citation.title,
			authors: citation.authors,
			organisation: citation.organisation,
			year: citation.year,
			version: citation.version,
			licence: citation.licence,
			url: citation.url,
			doi: citation.doi,
			citationNote: citation.note
		},
		features: sites.map((s) => ({
			type: 'Feature' as const,
			geometry: { type: 'Point' as const, coordinates: [s.lon, s.lat] },
			properties: Object.fromEntries(props.map((c) => [c.header, s[c.key] ?? null]))
		}))
	};
}

/** File name of a download: title in plain letters, version, extension. */
export function downloadFileName(title: string, version: number, ext: 'csv' | 'geojson'): string {
	const slug =
		title
			.normalize('NFKD')
			.replace(/[^\w\s-]/g, '')
			.trim()
			.replace(/[\s_-]+/g, '-')
			.toLowerCase()
			.slice(0, 60) || 'dataset';
	return `${slug}-v${version}.${ext}`;
}
