/**
 * The visible sites of a map region as CSV and GeoJSON, each carrying the citation and licence of
 * every dataset they come from: one `#` block per dataset in CSV, one `metadata.datasets[]` member
 * per dataset in GeoJSON. The columns are the dataset download's (site-columns.ts) plus the
 * dataset id, which ties each row to its citation.
 */
import { writeCsv } from '../csv/write';
import { citationComments, type CitationFields } from './citation';
import { sitesCsvCell, type ExportSite } from './site-export';
import { SITE_EXPORT_COLUMNS } from './site-columns';

/** A dataset of the download: its citation, id and how many of the rows are its. */
export interface RegionDataset {
	id: string;
	sites: number;
	citation: CitationFields;
}

/** What the download was asked for, written into the file so it can be asked again. */
export interface RegionDescription {
	/** `bbox=…` or `polygon=…`. */
	region: string;
	/** The map's filters as query parameters (empty for none). */
	filters: string;
}

export const DATASET_ID_COLUMN = 'dataset_id';

export function regionCsv(
	sites: readonly (ExportSite & { datasetId: string })[],
	datasets: readonly RegionDataset[],
	about: RegionDescription
): string {
	const comments = [
		`Thermalith map region: ${about.region}${about.filters ? `; filters: ${about.filters}` : ''}`,
		`${sites.length} sites from ${datasets.length} dataset${datasets.length === 1 ? '' : 's'}; cite every dataset below (column ${DATASET_ID_COLUMN}).`,
		...datasets.flatMap((d, i) => [
			`Dataset ${i + 1} of ${datasets.length}: ${d.id} (${d.sites} site${d.sites === 1 ? '' : 's'})`,
			...citationComments(d.citation)
		])
	];
	return writeCsv(
		[...SITE_EXPORT_COLUMNS.map((c) => c.header), DATASET_ID_COLUMN],
		sites.map((s) => [...SITE_EXPORT_COLUMNS.map((c) => sitesCsvCell(s[c.key])), s.datasetId]),
		comments
	);
}

export function regionGeoJson(
	sites: readonly (ExportSite & { datasetId: string })[],
	datasets: readonly RegionDataset[],
	about: RegionDescription
) {
	const props = SITE_EXPORT_COLUMNS.filter((c) => c.key !== 'lon' && c.key !== 'lat');
	return {
		type: 'FeatureCollection' as const,
		// RFC 7946 §6.1 allows foreign members such as this one.
		metadata: {
			region: about.region,
			filters: about.filters,
			sites: sites.length,
			datasets: datasets.map((d) => ({
				id: d.id,
				sites: d.sites,
				citation: d.citation.citation,
				title: d.citation.title,
				authors: d.citation.authors,
				organisation: d.citation.organisation,
				year: d.citation.year,
				version: d.citation.version,
				licence: d.citation.licence,
				url: d.citation.url,
				doi: d.citation.doi,
				citationNote: d.citation.note
			}))
		},
		features: sites.map((s) => ({
			type: 'Feature' as const,
			geometry: { type: 'Point' as const, coordinates: [s.lon, s.lat] },
			properties: {
				...Object.fromEntries(props.map((c) => [c.header, s[c.key] ?? null])),
				[DATASET_ID_COLUMN]: s.datasetId
			}
		}))
	};
}
