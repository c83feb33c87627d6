import { MERCATOR_MAX_LAT, MERCATOR_RADIUS_M } from '$lib/map/grid';
import { SITE_FLAGS } from '$lib/sites/flags';
import { HEAT_FLOW_METHODS } from '$lib/sites/methods';
import { QUALITY_CLASSES } from '$lib/sites/quality';
import type { SiteFilters } from '$lib/sites/filters';

/**
 * One dataset's sites as the map filters and counts them, in typed arrays (column per attribute,
 * sorted by longitude so a view is one contiguous run of the arrays). Plain data, no database:
 * the store (store.ts) loads and replaces whole blocks, the request code only reads them.
 */
export interface SiteBlock {
	size: number;
	/** WGS 84 degrees, as stored in site.location; lon ascending. */
	lon: Float64Array;
	lat: Float64Array;
	/** Web Mercator northing (m), with the formula of the SQL cells (mercatorY below). */
	mercY: Float64Array;
	/** mW/m²; NaN where the site has no value (SQL NULL). */
	heatFlow: Float64Array;
	/** Index into QUALITY_CLASSES, NO_QUALITY for none. */
	quality: Uint8Array;
	/** Index into HEAT_FLOW_METHODS. */
	method: Uint8Array;
	/** Year measured, NO_YEAR for none. */
	year: Int16Array;
	/** 1 when the site has at least one temperature log. */
	hasLog: Uint8Array;
	/** Bit i set when the site carries SITE_FLAGS[i]. */
	flags: Uint32Array;
}

export const NO_QUALITY = 255;
export const NO_YEAR = -32768;

/** Bytes one site takes in a block (four Float64, two Uint8 codes, Int16, Uint8, Uint32). */
export const BYTES_PER_SITE = 4 * 8 + 1 + 1 + 2 + 1 + 4;

/** A site as the store reads it from PostgreSQL. */
export interface SiteRow {
	lon: number;
	lat: number;
	heatFlow: number | null;
	quality: string | null;
	method: string;
	year: number | null;
	hasLog: boolean;
	flags: readonly string[];
}

/** Metres per degree of longitude in Web Mercator, as the SQL cell index inlines it. */
export const MERCATOR_M_PER_DEGREE = (Math.PI * MERCATOR_RADIUS_M) / 180;

/**
 * Web Mercator northing written exactly as the SQL cell index of repositories/map.ts computes it
 * (radians() is x · π/180; same order of operations), so a site falls in the same cell in memory
 * as in PostgreSQL.
 */
export function mercatorY(lat: number): number {
	const clamped = Math.max(-MERCATOR_MAX_LAT, Math.min(MERCATOR_MAX_LAT, lat));
	return MERCATOR_RADIUS_M * Math.log(Math.tan(Math.PI / 4 + (clamped * (Math.PI / 180)) / 2));
}

const QUALITY_INDEX = new Map<string, number>(QUALITY_CLASSES.map((q, i) => [q, i]));
const METHOD_INDEX = new Map<string, number>(HEAT_FLOW_METHODS.map((m, i) => [m, i]));
const FLAG_BIT = new Map<string, number>(SITE_FLAGS.map((f, i) => [f, 2 ** i]));

/** The bits of a list of flags (unknown ones carry none, as SQL && would never match them). */
export function flagMask(flags: readonly string[]): number {
	let mask = 0;
	for (const f of flags) mask |= FLAG_BIT.get(f) ?? 0;
	return mask >>> 0;
}

/** A block of rows, sorted by longitude. */
export function buildBlock(rows: readonly SiteRow[]): SiteBlock {
	const size = rows.length;
	const order = Array.from({ length: size }, (_, i) => i).sort((a, b) => rows[a].lon - rows[b].lon);
	const b: SiteBlock = {
		size,
		lon: new Float64Array(size),
		lat: new Float64Array(size),
		mercY: new Float64Array(size),
		heatFlow: new Float64Array(size),
		quality: new Uint8Array(size),
		method: new Uint8Array(size),
		year: new Int16Array(size),
		hasLog: new Uint8Array(size),
		flags: new Uint32Array(size)
	};
	order.forEach((from, i) => {
		const r = rows[from];
		b.lon[i] = r.lon;
		b.lat[i] = r.lat;
		b.mercY[i] = mercatorY(r.lat);
		b.heatFlow[i] = r.heatFlow ?? NaN;
		b.quality[i] = r.quality === null ? NO_QUALITY : (QUALITY_INDEX.get(r.quality) ?? NO_QUALITY);
		b.method[i] = METHOD_INDEX.get(r.method) ?? METHOD_INDEX.get('other')!;
		b.year[i] = r.year ?? NO_YEAR;
		b.hasLog[i] = r.hasLog ? 1 : 0;
		b.flags[i] = flagMask(r.flags);
	});
	return b;
}

/** Whether the index can answer these filters: all but the text search `q` (SQL only). */
export function indexCanAnswer(filters: SiteFilters): boolean {
	return filters.q === '';
}

/**
 * A site test compiled from the shared filters, with the meaning of siteFilterConditions
 * (repositories/sites.ts): NULL never matches a condition on its column. Dataset and
 * organisation are decided per dataset by the store, not per site. Lookup tables and plain
 * numbers (no closures, no Sets) keep the per-site test cheap over a million sites.
 */
export interface SiteTest {
	/** 1 at the codes that pass; null when the filter is off. */
	quality: Uint8Array | null;
	method: Uint8Array | null;
	hfBounded: boolean;
	minHf: number;
	maxHf: number;
	yearBounded: boolean;
	yearFrom: number;
	yearTo: number;
	/** Bits of the chosen flags (a site passes with any of them); 0 when off. */
	flags: number;
	hasLog: boolean;
}

function lookup(codes: readonly number[]): Uint8Array | null {
	if (codes.length === 0) return null;
	const table = new Uint8Array(256);
	for (const c of codes) table[c] = 1;
	return table;
}

export function siteTest(f: SiteFilters): SiteTest {
	return {
		quality: lookup(f.quality.map((q) => QUALITY_INDEX.get(q)!)),
		method: lookup(f.method.map((m) => METHOD_INDEX.get(m)!)),
		hfBounded: f.minHeatFlow !== null || f.maxHeatFlow !== null,
		minHf: f.minHeatFlow ?? -Infinity,
		maxHf: f.maxHeatFlow ?? Infinity,
		yearBounded: f.yearFrom !== null || f.yearTo !== null,
		yearFrom: f.yearFrom ?? -Infinity,
		yearTo: f.yearTo ?? Infinity,
		flags: f.flag.length ? flagMask(f.flag) : 0,
		hasLog: f.hasLog
	};
}

/** Whether site i of a block passes the test. */
export function passes(b: SiteBlock, t: SiteTest, i: number): boolean {
	if (t.quality !== null && t.quality[b.quality[i]] === 0) return false;
	if (t.method !== null && t.method[b.method[i]] === 0) return false;
	if (t.hfBounded) {
		const v = b.heatFlow[i]; // NaN fails both comparisons, as NULL does in SQL
		if (!(v >= t.minHf && v <= t.maxHf)) return false;
	}
	if (t.yearBounded) {
		const y = b.year[i];
		if (y === NO_YEAR || y < t.yearFrom || y > t.yearTo) return false;
	}
	if (t.flags !== 0 && (b.flags[i] & t.flags) === 0) return false;
	if (t.hasLog && b.hasLog[i] === 0) return false;
	return true;
}

/** First index whose longitude is >= lon (binary search over the sorted column). */
export function lowerBound(lon: Float64Array, value: number): number {
	let lo = 0;
	let hi = lon.length;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		if (lon[mid] < value) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

export interface Box {
	west: number;
	south: number;
	east: number;
	north: number;
}

let scratch = new Int32Array(0);

/**
 * The indices of the block's sites inside the box (edges included, as PostGIS `&&` of a point
 * and an envelope) that pass the test, in a buffer reused by the next call (read it first), and
 * how many there are.
 */
export function selectInBox(b: SiteBlock, box: Box, t: SiteTest): [Int32Array, number] {
	if (scratch.length < b.size) scratch = new Int32Array(b.size);
	const out = scratch;
	const { lon, lat } = b;
	let n = 0;
	for (let i = lowerBound(lon, box.west); i < b.size; i++) {
		if (lon[i] > box.east) break;
		const y = lat[i];
		if (y < box.south || y > box.north || !passes(b, t, i)) continue;
		out[n++] = i;
	}
	return [out, n];
}

/** Calls `visit(i)` for every site selectInBox selects. */
export function forEachInBox(
	b: SiteBlock,
	box: Box,
	test: SiteTest,
	visit: (i: number) => void
): void {
	const [selected, n] = selectInBox(b, box, test);
	for (let k = 0; k < n; k++) visit(selected[k]);
}
