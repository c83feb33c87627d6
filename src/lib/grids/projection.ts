import proj4 from 'proj4';

/**
 * The projected CRS a grid is computed in: the WGS 84 / UTM zone of the region's centre
 * (EPSG 326zz north, 327zz south), so distances, cell sizes and variogram ranges are metres.
 * UTM's scale error grows with distance from the zone's central meridian (about 0.4 % at 6°
 * and 1.5 % at 12° of longitude at the equator; Snyder 1987, "Map projections: a working
 * manual", USGS PP 1395, §8): regions wider than MAX_REGION_WIDTH_DEG are refused rather than
 * gridded with metres that are not metres; UTM is not defined beyond 84° N and 80° S.
 */
export const MAX_REGION_WIDTH_DEG = 24;
export const UTM_NORTH_LIMIT_DEG = 84;
export const UTM_SOUTH_LIMIT_DEG = -80;

export interface ComputationCrs {
	epsg: number;
	name: string;
	proj4: string;
}

/** The UTM zone (1–60) of a longitude in degrees. */
export function utmZone(lonDeg: number): number {
	return Math.min(60, Math.max(1, Math.floor((lonDeg + 180) / 6) + 1));
}

/** The computation CRS of a region, or a sentence saying why the region cannot be gridded. */
export function chooseCrs(
	bbox: readonly [number, number, number, number]
): { ok: true; crs: ComputationCrs } | { ok: false; error: string } {
	const [w, s, e, n] = bbox;
	if (e - w > MAX_REGION_WIDTH_DEG)
		return {
			ok: false,
			error: `the region is ${(e - w).toFixed(1)}° wide; grids are computed in one UTM zone and regions wider than ${MAX_REGION_WIDTH_DEG}° of longitude would distort distances, so split it`
		};
	if (n > UTM_NORTH_LIMIT_DEG || s < UTM_SOUTH_LIMIT_DEG)
		return {
			ok: false,
			error: `the region reaches beyond ${UTM_NORTH_LIMIT_DEG}° N or ${-UTM_SOUTH_LIMIT_DEG}° S, where UTM is not defined; polar regions are not gridded yet`
		};
	const zone = utmZone((w + e) / 2);
	const south = (s + n) / 2 < 0;
	return {
		ok: true,
		crs: {
			epsg: (south ? 32700 : 32600) + zone,
			name: `WGS 84 / UTM zone ${zone}${south ? 'S' : 'N'}`,
			proj4: `+proj=utm +zone=${zone}${south ? ' +south' : ''} +datum=WGS84 +units=m +no_defs`
		}
	};
}

const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';

/** lon/lat ⇄ projected metres in a computation CRS. */
export function projector(crs: ComputationCrs) {
	const conv = proj4(WGS84, crs.proj4);
	return {
		forward: (lon: number, lat: number): [number, number] =>
			conv.forward([lon, lat]) as [number, number],
		inverse: (x: number, y: number): [number, number] => conv.inverse([x, y]) as [number, number]
	};
}
