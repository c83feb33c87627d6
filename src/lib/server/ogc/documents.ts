import {
	CRS84_URI,
	DEFAULT_LIMIT,
	ITEMS_PARAMETERS,
	MAX_LIMIT,
	collectionId,
	type CollectionRef
} from './params';
import { GEOJSON_TYPE, HTML_TYPE, JSON_TYPE } from './http';
import type { ItemsPage, OgcCollectionRow, OgcSite } from './repository';

/*
 * The documents of OGC API – Features, Part 1: Core (OGC 17-069r4), built from repository rows:
 * landing page, conformance, collections, one collection, items and one feature. Each comes as
 * JSON (GeoJSON for features) and as a small view model the HTML page renders.
 */

export const CRS84 = CRS84_URI;
const GREGORIAN = 'http://www.opengis.net/def/uom/ISO-8601/0/Gregorian';

/** Only the conformance classes this server passes (tests/integration/ogc-conformance.spec.ts). */
export const CONFORMANCE_CLASSES = [
	'http://www.opengis.net/spec/ogcapi-features-1/1.0/conf/core',
	'http://www.opengis.net/spec/ogcapi-features-1/1.0/conf/geojson',
	'http://www.opengis.net/spec/ogcapi-features-1/1.0/conf/html'
];

export interface Link {
	href: string;
	rel: string;
	type: string;
	title?: string;
}

/** What the HTML page shows: a heading, text, facts, a table of rows, and the links. */
export interface HtmlView {
	title: string;
	description?: string;
	facts?: [string, string][];
	table?: { columns: string[]; rows: { cells: string[]; href?: string }[] };
	links: Link[];
}

export interface OgcDocument {
	json: Record<string, unknown>;
	type: string;
	html: HtmlView;
}

/** Address of a resource with query parameters (empty ones left out) and a format. */
function href(base: string, path: string, params: URLSearchParams, f?: 'json' | 'html'): string {
	const p = new URLSearchParams(params);
	p.delete('f');
	if (f === 'html') p.set('f', 'html');
	const query = p.toString();
	return `${base}${path}${query ? `?${query}` : ''}`;
}

/** self (JSON or GeoJSON) and alternate (HTML), as /req/core/fc-links asks of every answer. */
function selfLinks(base: string, path: string, params: URLSearchParams, type = JSON_TYPE): Link[] {
	return [
		{ href: href(base, path, params), rel: 'self', type, title: 'This document' },
		{ href: href(base, path, params, 'html'), rel: 'alternate', type: HTML_TYPE, title: 'As HTML' }
	];
}

const NONE = new URLSearchParams();

export function landingPage(base: string): OgcDocument {
	const links: Link[] = [
		...selfLinks(base, '', NONE),
		{ href: `${base}/api`, rel: 'service-doc', type: HTML_TYPE, title: 'How to use this API' },
		{
			href: `${base}/conformance`,
			rel: 'conformance',
			type: JSON_TYPE,
			title: 'Conformance classes this server implements'
		},
		{ href: `${base}/collections`, rel: 'data', type: JSON_TYPE, title: 'Feature collections' }
	];
	const title = 'Thermalith heat-flow sites (OGC API – Features)';
	const description =
		'Terrestrial heat-flow sites as GeoJSON features for desktop GIS and scripts. Anonymous callers see public data; a signed-in session sees what its owner sees on the map.';
	return {
		json: { title, description, links },
		type: JSON_TYPE,
		html: { title, description, links }
	};
}

export function conformance(base: string): OgcDocument {
	const links = selfLinks(base, '/conformance', NONE);
	return {
		json: { conformsTo: CONFORMANCE_CLASSES, links },
		type: JSON_TYPE,
		html: {
			title: 'Conformance',
			description: 'The conformance classes of OGC API – Features, Part 1 this server implements.',
			table: {
				columns: ['Conformance class'],
				rows: CONFORMANCE_CLASSES.map((c) => ({ cells: [c] }))
			},
			links
		}
	};
}

function spdxLink(licence: string | null): Link[] {
	if (!licence || licence === 'proprietary') return [];
	return [
		{
			href: `https://spdx.org/licenses/${encodeURIComponent(licence)}.html`,
			rel: 'license',
			type: HTML_TYPE,
			title: licence
		}
	];
}

function collectionJson(base: string, c: OgcCollectionRow, withSelf: boolean) {
	const id = collectionId(c.ref);
	const path = `/collections/${id}`;
	const links: Link[] = [
		...(withSelf
			? selfLinks(base, path, NONE)
			: [
					{ href: `${base}${path}`, rel: 'self', type: JSON_TYPE, title: c.title },
					{ href: `${base}${path}?f=html`, rel: 'alternate', type: HTML_TYPE, title: c.title }
				]),
		{
			href: `${base}${path}/items`,
			rel: 'items',
			type: GEOJSON_TYPE,
			title: 'Features as GeoJSON'
		},
		{
			href: `${base}${path}/items?f=html`,
			rel: 'items',
			type: HTML_TYPE,
			title: 'Features as HTML'
		},
		...spdxLink(c.licence)
	];
	// A site measured in year Y covers all of Y.
	const year = (y: number, end: boolean) => `${y}-${end ? '12-31T23:59:59Z' : '01-01T00:00:00Z'}`;
	return {
		id,
		title: c.title,
		description: c.description,
		links,
		extent: {
			// An empty collection has no sites to bound: the whole world includes all of none.
			spatial: { bbox: [c.extent.bbox ?? [-180, -90, 180, 90]], crs: CRS84 },
			temporal: {
				interval: [
					c.extent.years
						? [year(c.extent.years[0], false), year(c.extent.years[1], true)]
						: [null, null]
				],
				trs: GREGORIAN
			}
		},
		itemType: 'feature',
		crs: [CRS84],
		...(c.licence ? { license: c.licence } : {}),
		...(c.citation ? { citation: c.citation } : {})
	};
}

export function collections(base: string, rows: OgcCollectionRow[]): OgcDocument {
	const links = selfLinks(base, '/collections', NONE);
	return {
		json: { links, collections: rows.map((c) => collectionJson(base, c, false)) },
		type: JSON_TYPE,
		html: {
			title: 'Collections',
			description: 'Feature collections you may see: all sites, and each published dataset.',
			table: {
				columns: ['Collection', 'Id', 'Licence'],
				rows: rows.map((c) => ({
					cells: [c.title, collectionId(c.ref), c.licence ?? 'per dataset'],
					href: `${base}/collections/${collectionId(c.ref)}?f=html`
				}))
			},
			links
		}
	};
}

export function collection(base: string, c: OgcCollectionRow): OgcDocument {
	const json = collectionJson(base, c, true);
	const bbox = json.extent.spatial.bbox[0];
	return {
		json,
		type: JSON_TYPE,
		html: {
			title: c.title,
			description: c.description,
			facts: [
				['Id', json.id],
				['Extent (west, south, east, north; CRS84)', bbox.map((v) => v.toFixed(4)).join(', ')],
				['Licence', c.licence ?? 'per dataset (each feature names its own)'],
				...(c.citation ? ([['Citation', c.citation]] as [string, string][]) : [])
			],
			links: json.links
		}
	};
}

/** GeoJSON properties (RFC 7946): units in the names; the dataset's licence and citation. */
function properties(s: OgcSite) {
	const { id: _id, lon: _lon, lat: _lat, ...rest } = s;
	return rest;
}

function featureJson(base: string, ref: CollectionRef, s: OgcSite, withLinks: boolean) {
	const path = `/collections/${collectionId(ref)}/items/${s.id}`;
	return {
		type: 'Feature',
		id: s.id,
		geometry: { type: 'Point', coordinates: [s.lon, s.lat] },
		properties: properties(s),
		...(withLinks
			? {
					links: [
						...selfLinks(base, path, NONE, GEOJSON_TYPE),
						{
							href: `${base}/collections/${collectionId(ref)}`,
							rel: 'collection',
							type: JSON_TYPE,
							title: 'The collection'
						}
					]
				}
			: {})
	};
}

export function items(
	base: string,
	ref: CollectionRef,
	page: ItemsPage,
	params: URLSearchParams,
	limit: number
): OgcDocument {
	const path = `/collections/${collectionId(ref)}/items`;
	const pageParams = (cursor: 'after' | 'before', id: string) => {
		const p = new URLSearchParams(params);
		p.delete('after');
		p.delete('before');
		p.set('limit', String(limit));
		p.set(cursor, id);
		return p;
	};
	const links: Link[] = [
		...selfLinks(base, path, params, GEOJSON_TYPE),
		...(page.nextAfter
			? [
					{
						href: href(base, path, pageParams('after', page.nextAfter)),
						rel: 'next',
						type: GEOJSON_TYPE,
						title: 'Next page'
					}
				]
			: []),
		...(page.prevBefore
			? [
					{
						href: href(base, path, pageParams('before', page.prevBefore)),
						rel: 'prev',
						type: GEOJSON_TYPE,
						title: 'Previous page'
					}
				]
			: []),
		{
			href: `${base}/collections/${collectionId(ref)}`,
			rel: 'collection',
			type: JSON_TYPE,
			title: 'The collection'
		}
	];
	const htmlLinks = links.map((l) =>
		l.rel === 'next' || l.rel === 'prev' ? { ...l, href: `${l.href}&f=html`, type: HTML_TYPE } : l
	);
	return {
		json: {
			type: 'FeatureCollection',
			features: page.features.map((s) => featureJson(base, ref, s, false)),
			timeStamp: new Date().toISOString(),
			// Left out when it is not cheap to count (repository.ts, COUNT_CAP).
			...(page.numberMatched === null ? {} : { numberMatched: page.numberMatched }),
			numberReturned: page.features.length,
			links
		},
		type: GEOJSON_TYPE,
		html: {
			title: `Features of ${collectionId(ref)}`,
			description: `${page.features.length} of ${page.numberMatched ?? 'many'} matching features (limit ${limit}; default ${DEFAULT_LIMIT}, at most ${MAX_LIMIT}). Parameters: ${ITEMS_PARAMETERS.join(', ')}.`,
			table: {
				columns: ['Code', 'Name', 'Heat flow (mW/m²)', 'Longitude', 'Latitude', 'Dataset'],
				rows: page.features.map((s) => ({
					cells: [
						s.code,
						s.name ?? '',
						s.heatFlowMWm2 === null ? '' : String(s.heatFlowMWm2),
						s.lon.toFixed(5),
						s.lat.toFixed(5),
						s.datasetTitle
					],
					href: `${base}${path}/${s.id}?f=html`
				}))
			},
			links: htmlLinks
		}
	};
}

export function feature(base: string, ref: CollectionRef, s: OgcSite): OgcDocument {
	const json = featureJson(base, ref, s, true);
	const show = (v: unknown) => (v === null || v === undefined ? '' : String(v));
	return {
		json,
		type: GEOJSON_TYPE,
		html: {
			title: `${s.code}${s.name ? ` – ${s.name}` : ''}`,
			facts: [
				['Longitude, latitude (CRS84)', `${s.lon}, ${s.lat}`],
				...Object.entries(json.properties).map(([k, v]) => [k, show(v)] as [string, string])
			],
			links: json.links ?? []
		}
	};
}

/** The service description linked as `service-doc` from the landing page. */
export function apiDoc(base: string): OgcDocument {
	const title = 'Using this OGC API – Features service';
	const rows: [string, string][] = [
		[`${base}`, 'landing page: links to everything below'],
		[`${base}/conformance`, 'conformance classes: Core, GeoJSON, HTML'],
		[
			`${base}/collections`,
			'collections: "sites" (all sites you may see) and dataset-<id> per published dataset'
		],
		[`${base}/collections/{collectionId}`, 'one collection: extent (CRS84) and links'],
		[
			`${base}/collections/{collectionId}/items`,
			`features as GeoJSON; bbox=west,south,east,north (CRS84), datetime on the year measured (RFC 3339 instant or start/end with ".." open; sites without a year always match), limit (1 to ${MAX_LIMIT}, default ${DEFAULT_LIMIT}; more is treated as ${MAX_LIMIT}); follow the next and prev links to page`
		],
		[`${base}/collections/{collectionId}/items/{featureId}`, 'one feature'],
		['f=json | f=html', 'format on any resource (otherwise chosen from the Accept header)']
	];
	const links = selfLinks(base, '/api', NONE);
	return {
		json: {
			title,
			paths: Object.fromEntries(rows),
			links
		},
		type: JSON_TYPE,
		html: {
			title,
			description:
				'Give the landing page address to your GIS as an OGC API – Features (WFS 3) connection. Errors are JSON: { "error": { "code", "message", "details" } }.',
			table: { columns: ['Address', 'What it returns'], rows: rows.map((cells) => ({ cells })) },
			links
		}
	};
}
