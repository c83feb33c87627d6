// Sites of one file that lie within a distance of each other: probably the same borehole entered
// twice (under two codes, or re-surveyed). Found with a k-d tree so 100 000 rows stay fast.

import KDBush from 'kdbush';

/** Mean Earth radius, m (IUGG mean radius R1 = 6 371 008.8 m; from memory). */
const EARTH_RADIUS_M = 6_371_008.8;

/** Default distance under which two sites are reported as possibly the same, m. */
export const DEFAULT_NEAR_DISTANCE_M = 100;

const rad = (deg: number) => (deg * Math.PI) / 180;

/** Great-circle (haversine) distance between two WGS 84 points on the mean sphere, m. */
export function distanceM(
	a: { lon: number; lat: number },
	b: { lon: number; lat: number }
): number {
	const dLat = rad(b.lat - a.lat);
	const dLon = rad(b.lon - a.lon);
	const h =
		Math.sin(dLat / 2) ** 2 + Math.cos(rad(a.lat)) * Math.cos(rad(b.lat)) * Math.sin(dLon / 2) ** 2;
	return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}

export interface NearPair {
	/** Index of the earlier point in the input. */
	first: number;
	/** Index of the later point. */
	second: number;
	distanceM: number;
}

/**
 * For each point, the closest EARLIER point within `maxM` (so each pair is reported once, on its
 * later member). Points are WGS 84 degrees; the search box widens with latitude and the result is
 * checked with the haversine distance.
 */
export function nearPairs(
	points: readonly { lon: number; lat: number }[],
	maxM: number
): NearPair[] {
	if (points.length < 2 || !(maxM > 0)) return [];
	const index = new KDBush(points.length);
	for (const p of points) index.add(p.lon, p.lat);
	index.finish();
	const dLatDeg = (maxM / EARTH_RADIUS_M) * (180 / Math.PI);
	const pairs: NearPair[] = [];
	for (let i = 0; i < points.length; i++) {
		const p = points[i];
		const cosLat = Math.cos(rad(Math.min(89.9, Math.abs(p.lat) + dLatDeg)));
		const dLonDeg = Math.min(180, dLatDeg / Math.max(cosLat, 1e-6));
		let best: NearPair | null = null;
		for (const j of index.range(
			p.lon - dLonDeg,
			p.lat - dLatDeg,
			p.lon + dLonDeg,
			p.lat + dLatDeg
		)) {
			if (j >= i) continue;
			const d = distanceM(points[j], p);
			if (d <= maxM && (!best || d < best.distanceM)) best = { first: j, second: i, distanceM: d };
		}
		if (best) pairs.push(best);
	}
	return pairs;
}
