import { error } from '@sveltejs/kit';
import { parseBBox, type BBox } from '$lib/geo/bbox';
import { parseSiteFilters, siteFilterProblems, type SiteFilters } from '$lib/sites/filters';

/**
 * The map API's query: bbox and the shared site filters, strictly. A malformed value is a 400
 * with the message the filter panel shows too, never a silently different answer.
 */
export function mapQuery(
	params: URLSearchParams,
	needsBox = true
): { box: BBox; filters: SiteFilters } {
	if (needsBox && !params.get('bbox'))
		error(400, 'bbox is required (west,south,east,north in degrees)');
	const box = parseBBox(params.get('bbox'));
	if (!box.ok) error(400, box.error);
	return { box: box.value, filters: strictSiteFilters(params) };
}

/** The shared site filters, strictly: a 400 naming every problem (map and region queries). */
export function strictSiteFilters(params: URLSearchParams): SiteFilters {
	const problems = siteFilterProblems(params);
	if (problems.length) error(400, `bad filters: ${problems.join('; ')}`);
	return parseSiteFilters(params);
}
