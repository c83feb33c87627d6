import { customType } from 'drizzle-orm/pg-core';

/** A WGS 84 longitude/latitude pair in degrees. */
export interface LonLat {
	lon: number;
	lat: number;
}

/**
 * PostGIS `geometry(Point,4326)`. Drizzle's own `geometry()` drops the SRID (it emits
 * `geometry(point)`, stored with SRID 0), so this type writes EWKT with the SRID and reads EWKB.
 */
export const pointWgs84 = customType<{ data: LonLat; driverData: string }>({
	dataType() {
		return 'geometry(Point,4326)';
	},
	toDriver(value: LonLat): string {
		return `SRID=4326;POINT(${value.lon} ${value.lat})`;
	},
	fromDriver(value: string): LonLat {
		return parseEwkbPoint(value);
	}
});

/**
 * Parse a hex EWKB point as PostgreSQL returns it: byte order, type (with the SRID flag
 * 0x20000000), optional SRID, then x and y as float64.
 */
export function parseEwkbPoint(hex: string): LonLat {
	const bytes = Uint8Array.from(hex.match(/../g) ?? [], (b) => parseInt(b, 16));
	const view = new DataView(bytes.buffer);
	const little = view.getUint8(0) === 1;
	const type = view.getUint32(1, little);
	if ((type & 0xff) !== 1)
		throw new Error(`expected a WKB point, got geometry type ${type & 0xff}`);
	const offset = type & 0x20000000 ? 9 : 5;
	return { lon: view.getFloat64(offset, little), lat: view.getFloat64(offset + 8, little) };
}
