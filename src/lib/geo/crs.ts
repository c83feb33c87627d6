// Coordinate transforms to WGS 84 (EPSG:4326) with proj4, for the CRSs in crs-list.ts.
// Axis convention everywhere in Thermalith: x = easting or longitude, y = northing or latitude,
// whatever the EPSG axis order says (that is how spreadsheets and GIS exports label them).

import proj4 from 'proj4';
import { CRS_LIST, type CrsEntry } from './crs-list';

const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';
const byCode = new Map<number, CrsEntry>(CRS_LIST.map((c) => [c.epsg, c]));
const converters = new Map<number, proj4.Converter>();

/** The shipped entry for an EPSG code, or undefined. */
export function getCrs(epsg: number): CrsEntry | undefined {
	return byCode.get(epsg);
}

/** Parses "25832", "EPSG:25832" or "epsg 25832" to a code; null when not a code. */
export function parseEpsg(text: string): number | null {
	const m = /^\s*(?:epsg\s*[:\s]\s*)?(\d{4,5})\s*$/i.exec(text);
	return m ? Number(m[1]) : null;
}

/**
 * Searches the shipped CRS list for the picker: by code ("258", "EPSG:25832") or by words that
 * must all occur in the name or area ("utm 32n etrs"), best first (exact code, then code prefix).
 */
export function searchCrs(query: string, limit = 20): CrsEntry[] {
	const q = query.trim().toLowerCase();
	if (q === '') return CRS_LIST.slice(0, limit);
	const code = q.replace(/^epsg\s*:?\s*/, '');
	if (/^\d+$/.test(code)) {
		const exact = CRS_LIST.filter((c) => String(c.epsg) === code);
		const prefix = CRS_LIST.filter(
			(c) => String(c.epsg).startsWith(code) && String(c.epsg) !== code
		);
		return [...exact, ...prefix].slice(0, limit);
	}
	const words = q.split(/[\s,/]+/).filter(Boolean);
	return CRS_LIST.filter((c) => {
		const hay = `${c.name} ${c.area} epsg:${c.epsg}`.toLowerCase();
		// "32n" matches "zone 32N"; a bare word must appear as a substring.
		return words.every((w) => hay.includes(w));
	}).slice(0, limit);
}

export type Wgs84Result = { ok: true; lon: number; lat: number } | { ok: false; error: string };

function converter(epsg: number): proj4.Converter | null {
	const cached = converters.get(epsg);
	if (cached) return cached;
	const entry = byCode.get(epsg);
	if (!entry) return null;
	const conv = proj4(entry.proj4, WGS84);
	converters.set(epsg, conv);
	return conv;
}

/**
 * Transforms x (easting m or longitude °) and y (northing m or latitude °) in EPSG `epsg` to WGS 84
 * longitude/latitude in degrees; an error (never a throw) for unknown codes or failed transforms.
 */
export function toWgs84(x: number, y: number, epsg: number): Wgs84Result {
	if (!Number.isFinite(x) || !Number.isFinite(y))
		return { ok: false, error: `coordinates must be finite numbers; got x = ${x}, y = ${y}` };
	const entry = byCode.get(epsg);
	const conv = converter(epsg);
	if (!entry || !conv)
		return {
			ok: false,
			error: `EPSG:${epsg} is not in Thermalith's coordinate system list`
		};
	if (entry.kind === 'geographic' && (Math.abs(x) > 180 || Math.abs(y) > 90))
		return {
			ok: false,
			error: `longitude ${x} / latitude ${y} is outside ±180° / ±90° for EPSG:${epsg}`
		};
	if (epsg === 4326) return { ok: true, lon: x, lat: y };
	let lon: number, lat: number;
	try {
		[lon, lat] = conv.forward([x, y]);
	} catch (e) {
		return { ok: false, error: `EPSG:${epsg} transform failed: ${(e as Error).message}` };
	}
	if (!Number.isFinite(lon) || !Number.isFinite(lat))
		return { ok: false, error: `x = ${x}, y = ${y} cannot be transformed from EPSG:${epsg}` };
	if (entry.kind === 'projected' && Math.abs(lat) <= 90 && Math.abs(lon) <= 180) {
		// proj4 inverts some projections (e.g. transverse Mercator) to a wrong but finite place far
		// outside their domain; the round trip exposes that (1 m, common practice, no source).
		const [bx, by] = conv.inverse([lon, lat]);
		if (!(Math.abs(bx - x) < 1 && Math.abs(by - y) < 1))
			return {
				ok: false,
				error: `x = ${x}, y = ${y} is outside the area EPSG:${epsg} can represent`
			};
	}
	return { ok: true, lon, lat };
}

/** Degrees of longitude a site may lie from a UTM zone's central meridian before a warning. */
export const UTM_ZONE_SLACK_DEG = 9;

/**
 * For UTM-based CRSs, how far (°) a longitude lies outside the zone plus slack (3° half width +
 * 6° slack, common practice, no source); 0 when inside or not UTM. A wrong zone shows up here.
 */
export function degreesOutsideZone(lon: number, epsg: number): number {
	const zone = /\+proj=utm \+zone=(\d+)/.exec(byCode.get(epsg)?.proj4 ?? '');
	if (!zone) return 0;
	const cm = -183 + 6 * Number(zone[1]);
	const d = Math.abs(((((lon - cm) % 360) + 540) % 360) - 180);
	return Math.max(0, d - UTM_ZONE_SLACK_DEG);
}
