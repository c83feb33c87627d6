// The coordinate reference systems the upload picker offers, with proj4 definitions.
// Definitions are the PROJ strings `projinfo EPSG:xxxx -o PROJ` prints (PROJ 9.1.1, EPSG registry);
// zone families are generated. Datum shifts are 7-parameter Helmert (or null, for ETRS89, GDA2020,
// NAD83, NZGD2000, SWEREF99 at the ±1–3 m level of WGS 84 realisations): no grid files are shipped.

/** One offered CRS: EPSG code, human name, where it is used, and its proj4 definition. */
export interface CrsEntry {
	epsg: number;
	name: string;
	area: string;
	kind: 'geographic' | 'projected';
	proj4: string;
	/** True when the EPSG axis order is northing, easting (software usually still takes x = east). */
	northingFirst?: boolean;
}

const GRS80_NULL = '+ellps=GRS80 +towgs84=0,0,0,0,0,0,0';

function utmZones(
	firstEpsg: number,
	firstZone: number,
	lastZone: number,
	south: boolean,
	datum: string,
	datumName: string,
	area: (zone: number) => string
): CrsEntry[] {
	const out: CrsEntry[] = [];
	for (let zone = firstZone; zone <= lastZone; zone++) {
		out.push({
			epsg: firstEpsg + zone - firstZone,
			name: `${datumName} / UTM zone ${zone}${south ? 'S' : 'N'}`,
			area: area(zone),
			kind: 'projected',
			proj4: `+proj=utm +zone=${zone}${south ? ' +south' : ''} ${datum} +units=m +no_defs`
		});
	}
	return out;
}

/** Central meridian of a UTM zone (degrees east). */
function centralMeridian(zone: number): number {
	return -183 + 6 * zone;
}

function band(zone: number, hemisphere: string): string {
	const cm = centralMeridian(zone);
	return `${cm - 3}° to ${cm + 3}° ${cm < 0 ? '(west)' : '(east)'}, ${hemisphere} hemisphere`;
}

const LISTED: CrsEntry[] = [
	{
		epsg: 4326,
		name: 'WGS 84 (longitude, latitude)',
		area: 'World; GPS',
		kind: 'geographic',
		proj4: '+proj=longlat +datum=WGS84 +no_defs'
	},
	{
		epsg: 4258,
		name: 'ETRS89 (longitude, latitude)',
		area: 'Europe',
		kind: 'geographic',
		proj4: `+proj=longlat ${GRS80_NULL} +no_defs`
	},
	{
		epsg: 4269,
		name: 'NAD83 (longitude, latitude)',
		area: 'North America',
		kind: 'geographic',
		proj4: '+proj=longlat +datum=NAD83 +no_defs'
	},
	{
		epsg: 7844,
		name: 'GDA2020 (longitude, latitude)',
		area: 'Australia',
		kind: 'geographic',
		proj4: `+proj=longlat ${GRS80_NULL} +no_defs`
	},
	{
		epsg: 4167,
		name: 'NZGD2000 (longitude, latitude)',
		area: 'New Zealand',
		kind: 'geographic',
		proj4: `+proj=longlat ${GRS80_NULL} +no_defs`
	},
	{
		epsg: 3857,
		name: 'WGS 84 / Pseudo-Mercator (Web Mercator)',
		area: 'World; web maps',
		kind: 'projected',
		proj4:
			'+proj=merc +a=6378137 +b=6378137 +lat_ts=0 +lon_0=0 +x_0=0 +y_0=0 +k=1 +units=m +nadgrids=@null +wktext +no_defs'
	},
	{
		epsg: 2154,
		name: 'RGF93 v1 / Lambert-93',
		area: 'France',
		kind: 'projected',
		proj4: `+proj=lcc +lat_0=46.5 +lon_0=3 +lat_1=49 +lat_2=44 +x_0=700000 +y_0=6600000 ${GRS80_NULL} +units=m +no_defs`
	},
	{
		epsg: 2193,
		name: 'NZGD2000 / New Zealand Transverse Mercator 2000 (NZTM)',
		area: 'New Zealand',
		kind: 'projected',
		northingFirst: true,
		proj4: `+proj=tmerc +lat_0=0 +lon_0=173 +k=0.9996 +x_0=1600000 +y_0=10000000 ${GRS80_NULL} +units=m +no_defs`
	},
	{
		epsg: 3006,
		name: 'SWEREF99 TM',
		area: 'Sweden',
		kind: 'projected',
		northingFirst: true,
		proj4: `+proj=utm +zone=33 ${GRS80_NULL} +units=m +no_defs`
	},
	{
		epsg: 3035,
		name: 'ETRS89-extended / LAEA Europe',
		area: 'Europe; statistical mapping',
		kind: 'projected',
		northingFirst: true,
		proj4: `+proj=laea +lat_0=52 +lon_0=10 +x_0=4321000 +y_0=3210000 ${GRS80_NULL} +units=m +no_defs`
	},
	{
		epsg: 5070,
		name: 'NAD83 / Conus Albers',
		area: 'United States (contiguous)',
		kind: 'projected',
		proj4:
			'+proj=aea +lat_0=23 +lon_0=-96 +lat_1=29.5 +lat_2=45.5 +x_0=0 +y_0=0 +datum=NAD83 +units=m +no_defs'
	},
	{
		epsg: 27700,
		name: 'OSGB36 / British National Grid',
		area: 'United Kingdom (Great Britain)',
		kind: 'projected',
		// Helmert of EPSG:1314 "OSGB36 to WGS 84 (6)", about 2 m; the OSTN15 grid is not shipped.
		proj4:
			'+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489 +units=m +no_defs'
	},
	...utmZones(25828, 28, 38, false, GRS80_NULL, 'ETRS89', (z) => `Europe, ${band(z, 'northern')}`),
	...utmZones(
		26910,
		10,
		19,
		false,
		'+datum=NAD83',
		'NAD83',
		(z) => `North America, ${band(z, 'northern')}`
	),
	...utmZones(
		32601,
		1,
		60,
		false,
		'+datum=WGS84',
		'WGS 84',
		(z) => `World, ${band(z, 'northern')}`
	),
	...utmZones(32701, 1, 60, true, '+datum=WGS84', 'WGS 84', (z) => `World, ${band(z, 'southern')}`),
	...utmZones(
		7846,
		46,
		59,
		true,
		GRS80_NULL,
		'GDA2020',
		(z) => `Australia, ${band(z, 'southern')}`
	).map((c) => ({ ...c, name: c.name.replace('/ UTM zone', '/ MGA zone') }))
];

/** The shipped list, sorted by EPSG code. */
export const CRS_LIST: readonly CrsEntry[] = LISTED.sort((a, b) => a.epsg - b.epsg);
