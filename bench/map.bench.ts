/**
 * The map at scale, in process: the repository calls /api/v1/map and /api/v1/map/region make
 * (visibility, filters, cells or sites) and the JSON they send, without HTTP. Seeds the large
 * invented scenario (scripts/lib/large-seed.js: 1,000,000 petroleum-well sites, two hidden
 * datasets among them) and removes it again at the end. Views are 1280 × 800 px over the densest
 * invented area, at zooms 3, 6, 9 and 12, anonymous and as a member of the demo organisation,
 * with and without filters; then the statistics of a rectangle holding about 72,000 sites and of
 * a polygon holding about 100,000. Filtered views, counts and region statistics are measured
 * after the in-memory site index (src/lib/server/map-index) has loaded, as a running server has
 * it once its start-up load is done; the load itself is measured too.
 * Needs DATABASE_URL (scripts/bench.js starts a private cluster for it).
 */
import { ANONYMOUS, type Viewer } from '$lib/server/access';
import { createDb } from '$lib/server/db/client';
import { countMatchingSites, mapData, regionStatistics } from '$lib/server/repositories/map';
import { BYTES_PER_SITE } from '$lib/server/map-index/block';
import { heldSites, loadAll } from '$lib/server/map-index/store';
import { parseSiteFilters } from '$lib/sites/filters';
import { percentilesInPlace } from '$lib/thermal/percentile';
import { LARGE_ORG_ID, removeLarge, seedLarge } from '../scripts/lib/large-seed.js';
import { figure, size } from './report';

const SITES = size(1_000_000, 2_000);
const RUNS = size(20, 2);
const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set; run through `npm run bench`');

const { db, client } = createDb(url, { max: 4 });
const MEMBER: Viewer = { ...ANONYMOUS, userId: 'bench', roles: { [LARGE_ORG_ID]: 'viewer' } };
/** Centre of the Morrow Trough area (240,000 sites with its hidden campaign). */
const CENTRE = { lon: -101.5, lat: 36.8 };

/** The box a 1280 × 800 px view shows around CENTRE at a zoom (256-px Web Mercator tiles). */
function view(zoom: number) {
	const degPerPx = 360 / (256 * 2 ** zoom);
	const halfW = Math.min(180, 640 * degPerPx);
	// Latitude span from the Mercator scale at the centre (good enough for a benchmark view).
	const halfH = Math.min(85, 400 * degPerPx * Math.cos((CENTRE.lat * Math.PI) / 180));
	return {
		west: Math.max(-180, CENTRE.lon - halfW),
		south: Math.max(-85, CENTRE.lat - halfH),
		east: Math.min(180, CENTRE.lon + halfW),
		north: Math.min(85, CENTRE.lat + halfH)
	};
}

async function timed<T>(fn: () => Promise<T>): Promise<{ ms: number[]; last: T }> {
	const ms: number[] = [];
	let last!: T;
	for (let i = 0; i < RUNS; i++) {
		const t = performance.now();
		last = await fn();
		JSON.stringify(last);
		ms.push(performance.now() - t);
	}
	return { ms, last };
}

try {
	await removeLarge(client);
	const t0 = performance.now();
	await seedLarge(client, SITES);
	figure({
		id: 'map.seed-large',
		label: `Map: seeding ${SITES.toLocaleString('en')} invented sites (npm run seed:large)`,
		value: (performance.now() - t0) / 1000,
		unit: 's',
		target: 180,
		better: 'lower',
		note: 'one transaction, INSERT … SELECT generate_series, then ANALYZE'
	});

	const tLoad = performance.now();
	await loadAll(db);
	const held = heldSites();
	figure({
		id: 'map.index-load',
		label: 'Map: loading the in-memory site index (all datasets)',
		value: (performance.now() - tLoad) / 1000,
		unit: 's',
		better: 'lower',
		note: `${held.toLocaleString('en')} sites, ${((held * BYTES_PER_SITE) / 1e6).toFixed(0)} MB of typed arrays (${BYTES_PER_SITE} bytes per site)`
	});

	const filters = {
		none: parseSiteFilters(new URLSearchParams()),
		filtered: parseSiteFilters(
			new URLSearchParams(
				'minHeatFlow=60&quality=constrained,indicative&method=bottom_hole_temperature'
			)
		)
	};
	for (const zoom of [3, 6, 9, 12]) {
		for (const [who, viewer] of [
			['anonymous', ANONYMOUS],
			['member', MEMBER]
		] as const) {
			for (const [which, f] of Object.entries(filters)) {
				const { ms, last } = await timed(() => mapData(db, viewer, view(zoom), zoom, f));
				const [p50, p95] = percentilesInPlace(Float64Array.from(ms), [0.5, 0.95]);
				const bytes = JSON.stringify(last).length;
				const note = `${RUNS} runs; ${last.kind}, ${last.count} sites in view, ${(bytes / 1000).toFixed(0)} kB JSON`;
				const id = `map.view-z${zoom}-${who}-${which}`;
				const label = `Map view z${zoom}, ${who}, ${which === 'none' ? 'no filters' : 'filtered'}`;
				figure({
					id: `${id}-p50`,
					label: `${label}, p50`,
					value: p50,
					unit: 'ms',
					better: 'lower',
					note
				});
				figure({
					id: `${id}-p95`,
					label: `${label}, p95`,
					value: p95,
					unit: 'ms',
					target: 100,
					better: 'lower',
					note
				});
			}
		}
	}

	const count = await timed(() => countMatchingSites(db, ANONYMOUS, filters.filtered));
	figure({
		id: 'map.count-filtered-p50',
		label: 'Map: matching-site count, filtered, p50',
		value: percentilesInPlace(Float64Array.from(count.ms), [0.5])[0],
		unit: 'ms',
		better: 'lower',
		note: `${RUNS} runs; ${count.last} sites`
	});

	// A rectangle over the middle of the Morrow Trough area (about 72,000 sites).
	const region = { west: -104.5, south: 34.8, east: -98.5, north: 38.8 };
	const stats = await timed(() =>
		regionStatistics(db, ANONYMOUS, { kind: 'bbox', box: region }, filters.none)
	);
	const [rp50, rp95] = percentilesInPlace(Float64Array.from(stats.ms), [0.5, 0.95]);
	const note = `${RUNS} runs; ${stats.last.count} sites in the rectangle`;
	figure({
		id: 'map.region-p50',
		label: 'Map: region statistics, p50',
		value: rp50,
		unit: 'ms',
		better: 'lower',
		note
	});
	figure({
		id: 'map.region-p95',
		label: 'Map: region statistics, p95',
		value: rp95,
		unit: 'ms',
		target: 500,
		better: 'lower',
		note
	});

	// An octagon around the Morrow Trough centre (about 100,000 visible sites).
	const ring: [number, number][] = Array.from({ length: 9 }, (_, k) => {
		const a = ((k % 8) * Math.PI) / 4;
		return [CENTRE.lon + 4.55 * Math.cos(a), CENTRE.lat + 3.2 * Math.sin(a)];
	});
	const poly = await timed(() =>
		regionStatistics(db, ANONYMOUS, { kind: 'polygon', ring }, filters.none)
	);
	const [pp50, pp95] = percentilesInPlace(Float64Array.from(poly.ms), [0.5, 0.95]);
	const polyNote = `${RUNS} runs; ${poly.last.count} sites in the polygon (8 corners), from memory`;
	figure({
		id: 'map.region-polygon-p50',
		label: 'Map: region statistics of a polygon, p50',
		value: pp50,
		unit: 'ms',
		better: 'lower',
		note: polyNote
	});
	figure({
		id: 'map.region-polygon-p95',
		label: 'Map: region statistics of a polygon, p95',
		value: pp95,
		unit: 'ms',
		target: 500,
		better: 'lower',
		note: polyNote
	});
} finally {
	await removeLarge(client).catch(() => {});
	await client.end();
}
