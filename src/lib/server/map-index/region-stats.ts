import pointInPolygon from 'point-in-polygon-hao';
import { HISTOGRAM_BIN_MWM2, HISTOGRAM_MAX_MWM2, type RegionStatistics } from '$lib/map/region';
import { ringBounds, type Region } from '$lib/map/region-shape';
import { QUALITY_CLASSES, type QualityClass } from '$lib/sites/quality';
import { percentilesInPlace } from '$lib/thermal/percentile';
import { NO_QUALITY, selectInBox, type SiteBlock, type SiteTest } from './block';

/**
 * The sites of a region as its statistics need them: every heat-flow value and the count per
 * quality class. Memory and SQL parts (datasets not loaded) are gathered into one and summarised
 * once, so percentiles come from all values together.
 */
export interface RegionSample {
	count: number;
	values: number[];
	/** Counts by QUALITY_CLASSES index; the last entry counts sites without a class. */
	quality: number[];
}

export const emptySample = (): RegionSample => ({
	count: 0,
	values: [],
	quality: new Array<number>(QUALITY_CLASSES.length + 1).fill(0)
});

/** Add a site's quality class and value (null: none) to a sample. */
export function addSite(s: RegionSample, quality: QualityClass | null, value: number | null): void {
	s.count++;
	const q = quality === null ? -1 : QUALITY_CLASSES.indexOf(quality);
	s.quality[q < 0 ? QUALITY_CLASSES.length : q]++;
	if (value !== null) s.values.push(value);
}

/**
 * Gather the matching sites of blocks inside a region. Polygon containment by
 * point-in-polygon-hao on the same planar lon/lat coordinates PostGIS uses for ST_Intersects;
 * a point on the outline (the package answers 0) counts as inside, as it does there.
 */
export function sampleBlocks(
	blocks: readonly SiteBlock[],
	region: Region,
	test: SiteTest,
	into: RegionSample = emptySample()
): RegionSample {
	const box = region.kind === 'bbox' ? region.box : ringBounds(region.ring);
	const polygon = region.kind === 'polygon' ? [region.ring] : null;
	const point = [0, 0];
	const last = QUALITY_CLASSES.length;
	for (const b of blocks) {
		const [selected, n] = selectInBox(b, box, test);
		for (let k = 0; k < n; k++) {
			const i = selected[k];
			if (polygon) {
				point[0] = b.lon[i];
				point[1] = b.lat[i];
				if (pointInPolygon(point, polygon) === false) continue;
			}
			into.count++;
			const q = b.quality[i];
			into.quality[q === NO_QUALITY ? last : q]++;
			const v = b.heatFlow[i];
			if (v === v) into.values.push(v);
		}
	}
	return into;
}

/**
 * The statistics of a sample, as the SQL of regionStatistics computes them: avg, stddev_samp
 * (null below two values), percentile_cont at 0.1/0.5/0.9 (linear interpolation between order
 * statistics, Hyndman & Fan 1996 definition 7, which is what PostgreSQL documents for
 * percentile_cont), min, max, histogram bins least(floor(v / bin), last) and the quality mix in
 * enum order with the sites without a class last.
 */
export function summarise(s: RegionSample): RegionStatistics {
	const n = s.values.length;
	const sorted = Float64Array.from(s.values);
	let sum = 0;
	let min = Infinity;
	let max = -Infinity;
	const bins = new Map<number, number>();
	const lastBin = HISTOGRAM_MAX_MWM2 / HISTOGRAM_BIN_MWM2;
	for (const v of sorted) {
		sum += v;
		if (v < min) min = v;
		if (v > max) max = v;
		const bin = Math.min(Math.floor(v / HISTOGRAM_BIN_MWM2), lastBin);
		bins.set(bin, (bins.get(bin) ?? 0) + 1);
	}
	const mean = n > 0 ? sum / n : null;
	let stdDev: number | null = null;
	if (mean !== null && n > 1) {
		// Two passes (sum of squared deviations from the mean): no cancellation on large sums.
		let squares = 0;
		for (const v of sorted) squares += (v - mean) * (v - mean);
		stdDev = Math.sqrt(squares / (n - 1));
	}
	const p = n > 0 ? percentilesInPlace(sorted, [0.1, 0.5, 0.9]) : null;
	const quality: RegionStatistics['quality'] = [];
	s.quality.forEach((count, i) => {
		if (count > 0) quality.push({ qualityClass: QUALITY_CLASSES[i] ?? null, count });
	});
	return {
		count: s.count,
		withValue: n,
		meanMWm2: mean,
		medianMWm2: p ? p[1] : null,
		stdDevMWm2: stdDev,
		p10MWm2: p ? p[0] : null,
		p90MWm2: p ? p[2] : null,
		minMWm2: n > 0 ? min : null,
		maxMWm2: n > 0 ? max : null,
		histogram: [...bins.entries()]
			.sort((a, b) => a[0] - b[0])
			.map(([bin, count]) => ({ fromMWm2: bin * HISTOGRAM_BIN_MWM2, count })),
		quality
	};
}
