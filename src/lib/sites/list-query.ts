/**
 * The sites-table query: the shared site filters (./filters.ts) plus the table's own sort order,
 * ?sort=&dir=. Unknown values fall back to defaults instead of failing the page.
 */
import { z } from 'zod';
import { filtersToParams, parseSiteFilters, type SiteFilters } from './filters';

export const SITE_SORT_COLUMNS = [
	'code',
	'name',
	'heatFlowMWm2',
	'qualityClass',
	'method',
	'yearMeasured'
] as const;
export type SiteSortColumn = (typeof SITE_SORT_COLUMNS)[number];

const sortSchema = z.object({
	sort: z.enum(SITE_SORT_COLUMNS).catch('code'),
	dir: z.enum(['asc', 'desc']).catch('asc')
});

export type SiteListQuery = SiteFilters & z.output<typeof sortSchema> & { pageSize: number };

export function parseSiteListQuery(params: URLSearchParams, pageSize = 50): SiteListQuery {
	const order = sortSchema.parse({
		sort: params.get('sort') ?? undefined,
		dir: params.get('dir') ?? undefined
	});
	return { ...parseSiteFilters(params), ...order, pageSize };
}

/** The same query with some parameters changed, as a search string for links. */
export function withQuery(query: SiteListQuery, change: Partial<SiteListQuery>): string {
	const next = { ...query, ...change };
	const p = new URLSearchParams();
	if (next.sort !== 'code') p.set('sort', next.sort);
	if (next.dir !== 'asc') p.set('dir', next.dir);
	for (const [key, value] of filtersToParams(next)) p.set(key, value);
	const s = p.toString();
	return s ? `?${s}` : '?';
}
