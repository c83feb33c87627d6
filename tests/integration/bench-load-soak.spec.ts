/**
 * The soak's verdict in `npm run bench:load` (scripts/lib/bench-load.js): the app's memory is
 * "flat" unless the late samples sit clearly above the early ones once warmed up. No timing is
 * checked here; the soak itself runs in the benchmark.
 */
import { describe, expect, it } from 'vitest';
import { summariseRss } from '../../scripts/lib/bench-load.js';

const series = (values: number[]) => values.map((rssMB, i) => ({ t: i * 2, rssMB }));

describe('summariseRss', () => {
	it('calls memory that settles after the warm-up flat, and reports start, end and peak', () => {
		// Warm-up climb, then noise around 260 MB.
		const values = [180, 220, 250, ...Array.from({ length: 60 }, (_, i) => 255 + (i % 5) * 2)];
		const r = summariseRss(series(values));
		expect(r.flat).toBe(true);
		expect(r.firstMB).toBe(180);
		expect(r.lastMB).toBe(values.at(-1));
		expect(r.maxMB).toBe(263);
	});

	it('calls steady growth (a leak) not flat', () => {
		const values = Array.from({ length: 150 }, (_, i) => 250 + i);
		const r = summariseRss(series(values));
		expect(r.lateMedianMB).toBeGreaterThan(r.earlyMedianMB * 1.1);
		expect(r.flat).toBe(false);
	});

	it('reports zeros and no growth without samples', () => {
		expect(summariseRss([])).toMatchObject({ firstMB: 0, lastMB: 0, maxMB: 0, flat: true });
	});
});
