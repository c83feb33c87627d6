/**
 * Parse and normalise the sites-table query (?sort=&dir=&q=&quality=&method=&page=) so pages and
 * the API accept the same parameters; unknown values fall back to defaults instead of failing.
 */
import { HEAT_FLOW_METHODS } from './methods';
import { QUALITY_CLASSES } from './quality';

export const SITE_SORT_COLUMNS = [
	'code',
	'name',
	'heatFlowMWm2',
	'qualityClass',
	'method',
	'yearMeasured'
] as const;
export type SiteSortColumn = (typeof SITE_SORT_COLUMNS)[number];

export interface SiteListQuery {
	sort: SiteSortColumn;
	dir: 'asc' | 'desc';
	q: string;
	quality: string | null;
	method: string | null;
	page: number;
	pageSize: number;
}

/**
 * Far beyond any dataset, small enough that (page - 1) * pageSize stays an exact integer that
 * PostgreSQL takes as OFFSET (`page=1e300` is an integer to JavaScript, not to bigint).
 */
export const MAX_PAGE = 1_000_000;

// PostgreSQL text cannot hold NUL, and no search needs control characters.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL = /[\u0000-\u001f\u007f]/g;

const oneOf = <T extends string>(value: string | null, allowed: readonly T[]): T | null =>
	(allowed as readonly string[]).includes(value ?? '') ? (value as T) : null;

export function parseSiteListQuery(params: URLSearchParams, pageSize = 50): SiteListQuery {
	const page = Number(params.get('page'));
	return {
		sort: oneOf(params.get('sort'), SITE_SORT_COLUMNS) ?? 'code',
		dir: params.get('dir') === 'desc' ? 'desc' : 'asc',
		q: (params.get('q') ?? '').replace(CONTROL, '').trim().slice(0, 100),
		quality: oneOf(params.get('quality'), QUALITY_CLASSES),
		method: oneOf(params.get('method'), HEAT_FLOW_METHODS),
		page: Number.isSafeInteger(page) && page > 0 && page <= MAX_PAGE ? page : 1,
		pageSize
	};
}

/** The same query with some parameters changed, as a search string for links. */
export function withQuery(query: SiteListQuery, change: Partial<SiteListQuery>): string {
	const next = { ...query, ...change };
	const p = new URLSearchParams();
	if (next.sort !== 'code') p.set('sort', next.sort);
	if (next.dir !== 'asc') p.set('dir', next.dir);
	if (next.q) p.set('q', next.q);
	if (next.quality) p.set('quality', next.quality);
	if (next.method) p.set('method', next.method);
	if (next.page > 1) p.set('page', String(next.page));
	const s = p.toString();
	return s ? `?${s}` : '?';
}
