import { isUuid } from '$lib/uuid';

/**
 * Query parameters of the OGC API – Features endpoints (OGC 17-069r4, clause 7.15), parsed
 * without the database so the rules are unit-tested on their own. Every refusal names the
 * parameter and what was wrong: the standard wants a 400 for an invalid value
 * (/req/core/query-param-invalid) and for a parameter it does not know
 * (/req/core/query-param-unknown).
 */

export type Parsed<T> = { ok: true; value: T } | { ok: false; parameter: string; message: string };

const fail = (parameter: string, message: string) => ({ ok: false, parameter, message }) as const;

/** limit: default and maximum of /req/core/fc-limit-definition (the values the standard shows). */
export const DEFAULT_LIMIT = 100;
export const MAX_LIMIT = 10_000;

/**
 * A WGS 84 box in degrees. `west > east` is a box across the antimeridian, which the standard
 * asks servers to accept (/req/core/fc-bbox-definition, 17-069r4 clause 7.15.3).
 */
export interface OgcBox {
	west: number;
	south: number;
	east: number;
	north: number;
}

/** A closed time interval in epoch milliseconds; null ends are open (`..` or empty). */
export interface TimeInterval {
	start: number | null;
	end: number | null;
}

/** Keyset paging: features with ids after (next page) or before (previous page) a site id. */
export type Cursor = { after: string } | { before: string } | null;

export interface ItemsQuery {
	limit: number;
	bbox: OgcBox | null;
	datetime: TimeInterval | null;
	cursor: Cursor;
}

/**
 * Parameters each kind of resource accepts; `f` (json or html) is a declared vendor parameter.
 * `crs` and `bbox-crs` (Part 2) are accepted when they name CRS84, the one CRS served, because
 * collections list it and some clients then send it; any other CRS is refused.
 */
export const ITEMS_PARAMETERS = [
	'limit',
	'bbox',
	'datetime',
	'after',
	'before',
	'f',
	'crs',
	'bbox-crs'
] as const;
export const FEATURE_PARAMETERS = ['f', 'crs'] as const;
export const RESOURCE_PARAMETERS = ['f'] as const;

export const CRS84_URI = 'http://www.opengis.net/def/crs/OGC/1.3/CRS84';

/** The first of `crs` / `bbox-crs` that names another CRS than CRS84, as a refusal. */
export function crsRefusal(params: URLSearchParams) {
	for (const name of ['crs', 'bbox-crs']) {
		const value = params.get(name);
		if (value !== null && value.replace(/^\[|\]$/g, '') !== CRS84_URI)
			return fail(name, `${name} must be ${CRS84_URI} (the only CRS served); got "${value}"`);
	}
	return null;
}

/** The first query parameter that is not in `known`, or null. */
export function unknownParameter(params: URLSearchParams, known: readonly string[]): string | null {
	for (const name of params.keys()) if (!known.includes(name)) return name;
	return null;
}

/**
 * limit: an integer of at least 1. Above the maximum it is not an error; the maximum is used
 * instead (/req/core/fc-limit-response-1 C in 17-069r4).
 */
export function parseLimit(text: string | null): Parsed<number> {
	if (text === null) return { ok: true, value: DEFAULT_LIMIT };
	if (!/^\s*\d+\s*$/.test(text))
		return fail('limit', `limit must be a whole number from 1 to ${MAX_LIMIT}; got "${text}"`);
	const n = Number(text);
	if (n < 1) return fail('limit', `limit must be at least 1; got ${n}`);
	return { ok: true, value: Math.min(n, MAX_LIMIT) };
}

/**
 * bbox: four numbers (lon/lat, CRS84) or six (CRS84h, with heights). Sites are points without a
 * height in CRS84, so the height range of a six-number box is checked but selects nothing away.
 */
export function parseBbox(text: string | null): Parsed<OgcBox | null> {
	if (text === null) return { ok: true, value: null };
	const parts = text.split(',').map((p) => p.trim());
	if (parts.length !== 4 && parts.length !== 6)
		return fail(
			'bbox',
			`bbox must be four numbers (west,south,east,north) or six with heights; got ${parts.length} value(s)`
		);
	const numbers = parts.map((p) => (p === '' ? NaN : Number(p)));
	const bad = numbers.findIndex((n) => !Number.isFinite(n));
	if (bad >= 0) return fail('bbox', `bbox value ${bad + 1} is not a number: "${parts[bad]}"`);
	const [west, south, minZ, east, north, maxZ] =
		numbers.length === 4
			? [numbers[0], numbers[1], 0, numbers[2], numbers[3], 0]
			: (numbers as [number, number, number, number, number, number]);
	for (const [name, v, limit] of [
		['west', west, 180],
		['east', east, 180],
		['south', south, 90],
		['north', north, 90]
	] as const) {
		if (Math.abs(v) > limit)
			return fail('bbox', `bbox ${name} must be between -${limit} and ${limit}; got ${v}`);
	}
	if (south > north) return fail('bbox', `bbox south (${south}) is north of north (${north})`);
	if (minZ > maxZ)
		return fail('bbox', `bbox minimum height (${minZ}) is above the maximum (${maxZ})`);
	return { ok: true, value: { west, south, east, north } };
}

// RFC 3339 section 5.6 date-time; a plain full-date is accepted too, as many clients send one.
const DATE_TIME =
	/^(\d{4})-(\d{2})-(\d{2})(?:[Tt ](\d{2}):(\d{2}):(\d{2})(?:\.\d+)?(?:[Zz]|[+-]\d{2}:\d{2}))?$/;

function instant(text: string): number | null {
	const m = DATE_TIME.exec(text);
	if (!m) return null;
	const [, y, mo, d] = m;
	// Date.parse accepts impossible dates (2021-02-30) on some engines: check the date round-trips.
	const day = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d)));
	if (day.getUTCMonth() !== Number(mo) - 1 || day.getUTCDate() !== Number(d)) return null;
	const ms = Date.parse(m[4] === undefined ? `${y}-${mo}-${d}T00:00:00Z` : text.replace(' ', 'T'));
	return Number.isFinite(ms) ? ms : null;
}

/**
 * datetime: an instant or an interval `start/end` with `..` or an empty string for an open end
 * (/req/core/fc-time-definition, /req/core/fc-time-response D–F).
 */
export function parseDatetime(text: string | null): Parsed<TimeInterval | null> {
	if (text === null) return { ok: true, value: null };
	const bad = (why: string) =>
		fail(
			'datetime',
			`datetime ${why}: give an RFC 3339 date-time or an interval start/end with ".." for an open end; got "${text}"`
		);
	const parts = text.split('/');
	if (parts.length > 2) return bad('has more than one "/"');
	if (parts.length === 1) {
		const t = instant(parts[0].trim());
		return t === null ? bad('is not a date-time') : { ok: true, value: { start: t, end: t } };
	}
	const [start, end] = parts.map((p) => {
		const v = p.trim();
		return v === '' || v === '..' ? null : instant(v);
	});
	const open = (i: number) => ['', '..'].includes(parts[i].trim());
	if ((start === null && !open(0)) || (end === null && !open(1)))
		return bad('is not a date-time interval');
	if (start === null && end === null) return bad('has two open ends');
	if (start !== null && end !== null && start > end) return bad('starts after it ends');
	return { ok: true, value: { start, end } };
}

/** after / before: a feature id (site UUID) from a next or prev link; at most one of them. */
export function parseCursor(params: URLSearchParams): Parsed<Cursor> {
	const after = params.get('after');
	const before = params.get('before');
	if (after !== null && before !== null)
		return fail('after', 'give either after or before (from a next or prev link), not both');
	const value = after ?? before;
	if (value === null) return { ok: true, value: null };
	const name = after !== null ? 'after' : 'before';
	if (!isUuid(value))
		return fail(
			name,
			`${name} must be a feature id taken from a next or prev link; got "${value}"`
		);
	return { ok: true, value: after !== null ? { after: value } : { before: value } };
}

/** Every parameter of an items request, or the first refusal. */
export function parseItemsQuery(params: URLSearchParams): Parsed<ItemsQuery> {
	const unknown = unknownParameter(params, ITEMS_PARAMETERS);
	if (unknown !== null) return unknownRefusal(unknown, ITEMS_PARAMETERS);
	for (const name of ITEMS_PARAMETERS)
		if (params.getAll(name).length > 1) return fail(name, `${name} is given more than once`);
	const limit = parseLimit(params.get('limit'));
	if (!limit.ok) return limit;
	const bbox = parseBbox(params.get('bbox'));
	if (!bbox.ok) return bbox;
	const datetime = parseDatetime(params.get('datetime'));
	if (!datetime.ok) return datetime;
	const cursor = parseCursor(params);
	if (!cursor.ok) return cursor;
	const crs = crsRefusal(params);
	if (crs) return crs;
	return {
		ok: true,
		value: { limit: limit.value, bbox: bbox.value, datetime: datetime.value, cursor: cursor.value }
	};
}

export function unknownRefusal(name: string, known: readonly string[]) {
	return fail(
		name,
		`unknown query parameter "${name}"; this resource accepts: ${known.join(', ')}`
	);
}

/** The year span a datetime interval selects: a site measured in year Y covers all of Y (UTC). */
export function yearRange(interval: TimeInterval): { from: number | null; to: number | null } {
	const year = (ms: number | null) => (ms === null ? null : new Date(ms).getUTCFullYear());
	return { from: year(interval.start), to: year(interval.end) };
}

/** Collection ids: `sites` (every visible site) or `dataset-<uuid>` (one published dataset). */
export type CollectionRef = { kind: 'sites' } | { kind: 'dataset'; datasetId: string };

export const SITES_COLLECTION = 'sites';

export function parseCollectionId(id: string): CollectionRef | null {
	if (id === SITES_COLLECTION) return { kind: 'sites' };
	const m = /^dataset-(.+)$/.exec(id);
	return m && isUuid(m[1]) ? { kind: 'dataset', datasetId: m[1].toLowerCase() } : null;
}

export function collectionId(ref: CollectionRef): string {
	return ref.kind === 'sites' ? SITES_COLLECTION : `dataset-${ref.datasetId}`;
}
