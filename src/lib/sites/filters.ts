import { z } from 'zod';
import { HEAT_FLOW_METHODS } from './methods';
import { QUALITY_CLASSES } from './quality';

/**
 * The one definition of the site filters, shared by browser and server: the map, the dataset
 * site table and /api/v1/sites.geojson all read their query with parseSiteFilters.
 *
 *   quality=well-constrained,constrained  a comma list, or repeated (a plain HTML form sends that)
 *   method=bullard,marine_probe           the same
 *   minHeatFlow=40&maxHeatFlow=120        heat-flow range in mW/m², inclusive
 *   q=KGS                                 site code or name contains (case-insensitive)
 *   page=2                                1-based page of a table (the map and API ignore it)
 *
 * A bad or unknown value is dropped instead of failing the page, so an old or hand-edited link
 * still opens; nothing of it reaches the database unchecked.
 */

/**
 * Far beyond any dataset, small enough that (page - 1) * pageSize stays an exact integer that
 * PostgreSQL takes as OFFSET (`page=1e300` is an integer to JavaScript, not to bigint).
 */
export const MAX_PAGE = 1_000_000;

/** Longest text search kept; no site code or name needs more. */
export const MAX_SEARCH_LENGTH = 100;

// PostgreSQL text cannot hold NUL, and no search needs control characters.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL = /[\u0000-\u001f\u007f]/g;

/** Known values of a comma list or repeated parameter, each once, in the order given. */
const oneOfList = <T extends string>(allowed: readonly T[]) =>
	z
		.array(z.string())
		.catch([])
		.transform((raw) => {
			const values = raw.flatMap((v) => v.split(',')).map((v) => v.trim());
			return [...new Set(values)].filter((v): v is T => (allowed as readonly string[]).includes(v));
		});

/** A finite number, or null for an empty or non-numeric value. */
const optionalNumber = z
	.preprocess(
		(v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : null),
		z.number().nullable()
	)
	.catch(null);

export const siteFilterSchema = z.object({
	quality: oneOfList(QUALITY_CLASSES),
	method: oneOfList(HEAT_FLOW_METHODS),
	minHeatFlow: optionalNumber,
	maxHeatFlow: optionalNumber,
	q: z
		.string()
		.transform((s) => s.replace(CONTROL, '').trim().slice(0, MAX_SEARCH_LENGTH))
		.catch(''),
	page: z.coerce.number().int().min(1).max(MAX_PAGE).catch(1)
});

export type SiteFilters = z.output<typeof siteFilterSchema>;

export const NO_FILTERS: SiteFilters = siteFilterSchema.parse({});

const LIST_KEYS = ['quality', 'method'] as const;

/** Read the filters from query parameters (a URL's or a submitted GET form's). */
export function parseSiteFilters(params: URLSearchParams): SiteFilters {
	const raw: Record<string, unknown> = {};
	for (const key of Object.keys(siteFilterSchema.shape)) {
		const values = params.getAll(key);
		if (values.length === 0) continue;
		raw[key] = (LIST_KEYS as readonly string[]).includes(key) ? values : values[0];
	}
	return siteFilterSchema.parse(raw);
}

/** The filters as query parameters, leaving out the ones that filter nothing. */
export function filtersToParams(f: SiteFilters): URLSearchParams {
	const p = new URLSearchParams();
	if (f.quality.length) p.set('quality', f.quality.join(','));
	if (f.method.length) p.set('method', f.method.join(','));
	if (f.minHeatFlow !== null) p.set('minHeatFlow', String(f.minHeatFlow));
	if (f.maxHeatFlow !== null) p.set('maxHeatFlow', String(f.maxHeatFlow));
	if (f.q) p.set('q', f.q);
	if (f.page > 1) p.set('page', String(f.page));
	return p;
}

/** Whether any filter narrows the sites (the page number does not). */
export function isFiltered(f: SiteFilters): boolean {
	return filtersToParams({ ...f, page: 1 }).size > 0;
}
