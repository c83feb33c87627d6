import { HEAT_FLOW_METHODS, type HeatFlowMethod } from '$lib/sites/methods';
import { QUALITY_CLASSES, type QualityClass } from '$lib/sites/quality';

/** Map filters, kept in the page URL and passed on to /api/v1/sites.geojson unchanged. */
export const METHODS = HEAT_FLOW_METHODS;
export type MethodFilter = HeatFlowMethod;

export interface SiteFilters {
	quality: QualityClass[];
	method: MethodFilter[];
	minHeatFlowMWm2: number | null;
	maxHeatFlowMWm2: number | null;
}

export const NO_FILTERS: SiteFilters = {
	quality: [],
	method: [],
	minHeatFlowMWm2: null,
	maxHeatFlowMWm2: null
};

const list = <T extends string>(value: string | null, allowed: readonly T[]): T[] =>
	(value ?? '')
		.split(',')
		.map((v) => v.trim())
		.filter((v): v is T => (allowed as readonly string[]).includes(v));

const number = (value: string | null): number | null => {
	if (value === null || value.trim() === '') return null;
	const n = Number(value);
	return Number.isFinite(n) ? n : null;
};

/** Read filters from query parameters; unknown values are ignored rather than failing the map. */
export function parseSiteFilters(params: URLSearchParams): SiteFilters {
	return {
		// Comma lists (links, the map) and repeated parameters (a plain HTML form) both work.
		quality: list(params.getAll('quality').join(','), QUALITY_CLASSES),
		method: list(params.getAll('method').join(','), METHODS),
		minHeatFlowMWm2: number(params.get('minHeatFlow')),
		maxHeatFlowMWm2: number(params.get('maxHeatFlow'))
	};
}

/** The filters as query parameters (empty filters are left out). */
export function filtersToParams(f: SiteFilters): URLSearchParams {
	const p = new URLSearchParams();
	if (f.quality.length) p.set('quality', f.quality.join(','));
	if (f.method.length) p.set('method', f.method.join(','));
	if (f.minHeatFlowMWm2 !== null) p.set('minHeatFlow', String(f.minHeatFlowMWm2));
	if (f.maxHeatFlowMWm2 !== null) p.set('maxHeatFlow', String(f.maxHeatFlowMWm2));
	return p;
}
