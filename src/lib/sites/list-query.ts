/**
 * Parse and normalise the sites-table query (?sort=&dir=&q=&quality=&method=&page=) so pages and
 * the API accept the same parameters; unknown values fall back to defaults instead of failing.
 */
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

export function parseSiteListQuery(params: URLSearchParams, pageSize = 50): SiteListQuery {
	const sort = params.get('sort');
	const page = Number(params.get('page'));
	return {
		sort: (SITE_SORT_COLUMNS as readonly string[]).includes(sort ?? '')
			? (sort as SiteSortColumn)
			: 'code',
		dir: params.get('dir') === 'desc' ? 'desc' : 'asc',
		q: (params.get('q') ?? '').trim().slice(0, 100),
		quality: params.get('quality') || null,
		method: params.get('method') || null,
		page: Number.isInteger(page) && page > 0 ? page : 1,
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
