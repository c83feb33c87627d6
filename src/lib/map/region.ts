import type { QualityClass } from '$lib/sites/quality';

/** Heat-flow histogram bin width (mW/m²) and where the last, open bin starts. */
export const HISTOGRAM_BIN_MWM2 = 10;
export const HISTOGRAM_MAX_MWM2 = 200;

/** The region statistics (/api/v1/map/region) of the visible sites inside a drawn rectangle. */
export interface RegionStatistics {
	count: number;
	/** Sites with a heat-flow value: the statistics below are of these. */
	withValue: number;
	meanMWm2: number | null;
	medianMWm2: number | null;
	/** Sample standard deviation (n − 1); null with fewer than two values. */
	stdDevMWm2: number | null;
	p10MWm2: number | null;
	p90MWm2: number | null;
	minMWm2: number | null;
	maxMWm2: number | null;
	/** Bins [from, from + HISTOGRAM_BIN_MWM2); the last one holds everything from HISTOGRAM_MAX_MWM2. */
	histogram: { fromMWm2: number; count: number }[];
	quality: { qualityClass: QualityClass | null; count: number }[];
}
