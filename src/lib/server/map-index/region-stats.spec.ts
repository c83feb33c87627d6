import { describe, expect, it } from 'vitest';
import { NO_FILTERS } from '$lib/sites/filters';
import { buildBlock, siteTest, type SiteRow } from './block';
import { addSite, emptySample, sampleBlocks, summarise } from './region-stats';

const row = (lon: number, lat: number, heatFlow: number | null, quality: SiteRow['quality']) => ({
	lon,
	lat,
	heatFlow,
	quality,
	method: 'bullard',
	year: 2000,
	hasLog: false,
	flags: []
});

describe('summarise', () => {
	it('matches hand-computed statistics (percentile_cont type 7, stddev_samp)', () => {
		const s = emptySample();
		for (const v of [80, 50, 100, 70, 60]) addSite(s, 'constrained', v);
		addSite(s, null, null);
		addSite(s, 'well-constrained', 205);
		const stats = summarise(s);
		// Values 50, 60, 70, 80, 100, 205 (n = 6): h = 5p.
		expect(stats.count).toBe(7);
		expect(stats.withValue).toBe(6);
		expect(stats.meanMWm2).toBeCloseTo(565 / 6, 12);
		// p10: h = 0.5 → 50 + 0.5·10 = 55; median: h = 2.5 → 75; p90: h = 4.5 → 100 + 0.5·105.
		expect(stats.p10MWm2).toBe(55);
		expect(stats.medianMWm2).toBe(75);
		expect(stats.p90MWm2).toBe(152.5);
		// Squared deviations from 565/6, summed, over n − 1 = 5.
		const mean = 565 / 6;
		const ss = [50, 60, 70, 80, 100, 205].reduce((a, v) => a + (v - mean) ** 2, 0);
		expect(stats.stdDevMWm2).toBeCloseTo(Math.sqrt(ss / 5), 12);
		expect(stats.minMWm2).toBe(50);
		expect(stats.maxMWm2).toBe(205);
		// 205 falls in the open last bin (from 200).
		expect(stats.histogram).toEqual([
			{ fromMWm2: 50, count: 1 },
			{ fromMWm2: 60, count: 1 },
			{ fromMWm2: 70, count: 1 },
			{ fromMWm2: 80, count: 1 },
			{ fromMWm2: 100, count: 1 },
			{ fromMWm2: 200, count: 1 }
		]);
		expect(stats.quality).toEqual([
			{ qualityClass: 'well-constrained', count: 1 },
			{ qualityClass: 'constrained', count: 5 },
			{ qualityClass: null, count: 1 }
		]);
	});

	it('gives nulls without values and no standard deviation of one value', () => {
		const none = summarise(emptySample());
		expect(none).toMatchObject({ count: 0, meanMWm2: null, medianMWm2: null, minMWm2: null });
		const s = emptySample();
		addSite(s, null, 42);
		expect(summarise(s)).toMatchObject({ meanMWm2: 42, medianMWm2: 42, stdDevMWm2: null });
	});
});

describe('sampleBlocks', () => {
	const block = buildBlock([
		row(0, 0, 10, null), // a corner of the polygon
		row(1, 0.5, 20, null), // on its east edge
		row(0.5, 0.5, 30, 'indicative'), // inside
		row(1.5, 0.5, 40, null), // outside, inside its box when the box is wider
		row(0.2, 0.9, 50, null) // inside the box, outside the triangle
	]);
	const triangle: [number, number][] = [
		[0, 0],
		[1, 0],
		[1, 1],
		[0, 0]
	];

	it('counts points on the outline as inside, as ST_Intersects does', () => {
		const s = sampleBlocks([block], { kind: 'polygon', ring: triangle }, siteTest(NO_FILTERS));
		expect(s.values.sort((a, b) => a - b)).toEqual([10, 20, 30]);
		expect(s.count).toBe(3);
	});

	it('takes a rectangle with its edges', () => {
		const box = { west: 0, south: 0, east: 1, north: 1 };
		const s = sampleBlocks([block], { kind: 'bbox', box }, siteTest(NO_FILTERS));
		expect(s.values.sort((a, b) => a - b)).toEqual([10, 20, 30, 50]);
	});
});
