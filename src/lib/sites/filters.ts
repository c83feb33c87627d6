import { z } from 'zod';
import { SITE_FLAGS } from './flags';
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
 *   organisation=org-a,org-b              publishing organisations (ids)
 *   dataset=<uuid>,<uuid>                 datasets (ids)
 *   yearFrom=1970&yearTo=1990             year measured, inclusive
 *   hasLog=1                              only sites with at least one temperature log
 *   flag=heat-flow-implausible,…          sites carrying any of these import warning flags
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

/** The years a measurement year filter accepts. */
export const MIN_YEAR = 1800;
export const MAX_YEAR = 2100;

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

/** Ids of our own tables: organisation ids are text, dataset ids uuids; anything else is dropped. */
const ID = /^[A-Za-z0-9_-]{1,64}$/;
const idList = (pattern: RegExp) =>
	z
		.array(z.string())
		.catch([])
		.transform((raw) => [
			...new Set(
				raw
					.flatMap((v) => v.split(','))
					.map((v) => v.trim())
					.filter((v) => pattern.test(v))
			)
		]);
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A year, or null for an empty or unusable value. */
const optionalYear = z
	.preprocess(
		(v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : null),
		z.number().int().min(MIN_YEAR).max(MAX_YEAR).nullable()
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
	organisation: idList(ID),
	dataset: idList(UUID),
	yearFrom: optionalYear,
	yearTo: optionalYear,
	hasLog: z
		.string()
		.transform((v) => v === '1' || v === 'true' || v === 'on')
		.catch(false),
	/** Import warning flags (flags.ts): a site matches when it carries any of them. */
	flag: oneOfList(SITE_FLAGS),
	page: z.coerce.number().int().min(1).max(MAX_PAGE).catch(1)
});

export type SiteFilters = z.output<typeof siteFilterSchema>;

export const NO_FILTERS: SiteFilters = siteFilterSchema.parse({});

const LIST_KEYS = ['quality', 'method', 'organisation', 'dataset', 'flag'] as const;

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
	if (f.organisation.length) p.set('organisation', f.organisation.join(','));
	if (f.dataset.length) p.set('dataset', f.dataset.join(','));
	if (f.yearFrom !== null) p.set('yearFrom', String(f.yearFrom));
	if (f.yearTo !== null) p.set('yearTo', String(f.yearTo));
	if (f.hasLog) p.set('hasLog', '1');
	if (f.flag.length) p.set('flag', f.flag.join(','));
	if (f.page > 1) p.set('page', String(f.page));
	return p;
}

/** Whether any filter narrows the sites (the page number does not). */
export function isFiltered(f: SiteFilters): boolean {
	return filtersToParams({ ...f, page: 1 }).size > 0;
}

/**
 * What is wrong with the filters of a query, in words for the filter panel; empty when nothing is.
 * The lenient parse above keeps an old link opening; the map API refuses a query with problems
 * (400 with these messages) and the panel shows them, so nothing impossible is silently accepted.
 */
export function siteFilterProblems(params: URLSearchParams): string[] {
	const problems: string[] = [];
	const f = parseSiteFilters(params);
	const lists: [string, readonly string[], string][] = [
		['quality', QUALITY_CLASSES, 'quality class'],
		['method', HEAT_FLOW_METHODS, 'method'],
		['flag', SITE_FLAGS, 'flag']
	];
	for (const [key, allowed, what] of lists) {
		for (const v of params.getAll(key).flatMap((x) => x.split(','))) {
			const t = v.trim();
			if (t && !(allowed as readonly string[]).includes(t))
				problems.push(`unknown ${what} "${t.slice(0, 40)}"`);
		}
	}
	const idChecks: [string, RegExp][] = [
		['organisation', ID],
		['dataset', UUID]
	];
	for (const [key, pattern] of idChecks) {
		for (const v of params.getAll(key).flatMap((x) => x.split(','))) {
			const t = v.trim();
			if (t && !pattern.test(t)) problems.push(`${key} "${t.slice(0, 40)}" is not an id`);
		}
	}
	const numbers: [keyof SiteFilters, string][] = [
		['minHeatFlow', 'minimum heat flow'],
		['maxHeatFlow', 'maximum heat flow'],
		['yearFrom', 'first year'],
		['yearTo', 'last year']
	];
	for (const [key, what] of numbers) {
		const raw = params.get(key)?.trim();
		if (raw && f[key] === null) {
			problems.push(
				key.startsWith('year')
					? `the ${what} must be a whole year from ${MIN_YEAR} to ${MAX_YEAR}`
					: `the ${what} must be a number`
			);
		}
	}
	if (f.minHeatFlow !== null && f.maxHeatFlow !== null && f.minHeatFlow > f.maxHeatFlow) {
		problems.push('the minimum heat flow is above the maximum');
	}
	if (f.yearFrom !== null && f.yearTo !== null && f.yearFrom > f.yearTo) {
		problems.push('the first year is after the last year');
	}
	const hasLog = params.get('hasLog');
	if (hasLog !== null && !['', '0', '1', 'true', 'false', 'on'].includes(hasLog)) {
		problems.push('hasLog must be 1 or 0');
	}
	return problems;
}
