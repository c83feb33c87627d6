// @ts-check
/** Helpers of `npm run bench:load` (scripts/bench-load.js): data, one autocannon run, RSS. */
import fs from 'node:fs';
import autocannon from 'autocannon';
import postgres from 'postgres';

/** Where the invented load sites go: around the demo scenario's region (lon/lat, WGS 84). */
const REGION = /** @type {const} */ ([4, 56, 14, 64]);

/**
 * Add `count` invented public sites to the first published public demo dataset (random places
 * in REGION, random heat flow 30-150 mW/m²). Returns one site id for the site page and the region.
 * @param {string} databaseUrl @param {number} count
 */
export async function addLoadSites(databaseUrl, count) {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	try {
		const [dataset] = await sql`
			SELECT id FROM dataset WHERE status = 'published' AND visibility = 'public'
			ORDER BY created_at LIMIT 1`;
		if (!dataset) throw new Error('no published public dataset in the demo data');
		const [w, s, e, n] = REGION;
		await sql`
			INSERT INTO site (dataset_id, code, name, location, heat_flow_mw_m2, heat_flow_sigma_mw_m2, method)
			SELECT ${dataset.id}, 'LOAD-' || g, 'Load site ' || g,
				ST_SetSRID(ST_MakePoint(${w} + random() * ${e - w}, ${s} + random() * ${n - s}), 4326),
				round((30 + random() * 120)::numeric, 1), round((3 + random() * 10)::numeric, 1),
				(enum_range(NULL::heat_flow_method))[1 + floor(random() * array_length(enum_range(NULL::heat_flow_method), 1))::int]
			FROM generate_series(1, ${count}) g
			ON CONFLICT DO NOTHING`;
		await sql`ANALYZE site`;
		const [site] =
			await sql`SELECT id FROM site WHERE dataset_id = ${dataset.id} ORDER BY code LIMIT 1`;
		return { siteId: /** @type {string} */ (site.id), region: REGION };
	} finally {
		await sql.end();
	}
}

/**
 * One autocannon run; counts every error, timeout and non-2xx answer as a failure.
 * @param {{ url: string, connections: number, duration: number, requests?: { method: 'GET', path: string }[] }} options
 */
export async function runLoad({ url, connections, duration, requests }) {
	const result = await autocannon({ url, connections, duration, requests, timeout: 30 });
	return {
		requests: result.requests.total,
		rps: result.requests.average,
		p50: result.latency.p50,
		p99: result.latency.p99,
		maxMs: result.latency.max,
		errors: result.errors,
		timeouts: result.timeouts,
		non2xx: result.non2xx,
		failures: result.errors + result.timeouts + result.non2xx
	};
}

/** Resident memory of a process in MB (Linux /proc), or null when it cannot be read. @param {number} pid */
export function rssOf(pid) {
	try {
		const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
		const kb = Number(/VmRSS:\s+(\d+)/.exec(status)?.[1]);
		return Number.isFinite(kb) ? Math.round(kb / 102.4) / 10 : null;
	} catch {
		return null;
	}
}

/** @param {number[]} values */
const median = (values) => {
	const sorted = [...values].sort((a, b) => a - b);
	return sorted.length ? sorted[Math.floor(sorted.length / 2)] : 0;
};

/**
 * Flat or not: after a warm-up (the first sixth, while caches and the JIT fill), the median of the
 * last third may exceed the median of the first third by at most 10 %. Common practice, no source.
 * @param {{ t: number, rssMB: number }[]} samples
 */
export function summariseRss(samples) {
	const values = samples.map((s) => s.rssMB);
	const warm = values.slice(Math.floor(values.length / 6));
	const third = Math.max(1, Math.floor(warm.length / 3));
	const earlyMedianMB = median(warm.slice(0, third));
	const lateMedianMB = median(warm.slice(-third));
	return {
		firstMB: values[0] ?? 0,
		lastMB: values.at(-1) ?? 0,
		maxMB: Math.max(...values, 0),
		earlyMedianMB,
		lateMedianMB,
		flat: lateMedianMB <= earlyMedianMB * 1.1
	};
}

/**
 * The box a 1280 × 800 px map view shows around a centre at a zoom (256-px Web Mercator tiles),
 * as `west,south,east,north` for the map's data route.
 * @param {number} lon @param {number} lat @param {number} zoom
 */
export function viewBox(lon, lat, zoom) {
	const degPerPx = 360 / (256 * 2 ** zoom);
	const halfW = Math.min(180, 640 * degPerPx);
	const halfH = Math.min(85, 400 * degPerPx * Math.cos((lat * Math.PI) / 180));
	const r = (/** @type {number} */ v) => Math.round(v * 1e5) / 1e5;
	return [
		r(Math.max(-180, lon - halfW)),
		r(Math.max(-85, lat - halfH)),
		r(Math.min(180, lon + halfW)),
		r(Math.min(85, lat + halfH))
	].join(',');
}

/**
 * Targets in the database of an app that is already running (`--url`): a public dataset of the
 * large scenario (`npm run seed:large`) when it is there, else the demo's first public one; its
 * centre, extent and one of its sites.
 * @param {string} databaseUrl @param {string} largeOrgId
 */
export async function runningAppTargets(databaseUrl, largeOrgId) {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	try {
		const [row] = await sql`
			SELECT d.id, d.title, (d.organisation_id = ${largeOrgId}) AS large,
				ST_X(ST_Centroid(ST_Extent(s.location))) AS lon, ST_Y(ST_Centroid(ST_Extent(s.location))) AS lat,
				count(*)::int AS sites, min(s.id::text) AS site_id
			FROM dataset d JOIN site s ON s.dataset_id = d.id
			WHERE d.status = 'published' AND d.visibility = 'public'
			GROUP BY d.id
			ORDER BY (d.organisation_id = ${largeOrgId}) DESC, count(*) DESC
			LIMIT 1`;
		if (!row) throw new Error('no published public dataset with sites in that database');
		const [{ total }] = await sql`SELECT count(*)::int AS total FROM site`;
		return {
			datasetTitle: /** @type {string} */ (row.title),
			large: /** @type {boolean} */ (row.large),
			lon: Number(row.lon),
			lat: Number(row.lat),
			datasetSites: /** @type {number} */ (row.sites),
			totalSites: /** @type {number} */ (total),
			siteId: /** @type {string} */ (row.site_id)
		};
	} finally {
		await sql.end();
	}
}
