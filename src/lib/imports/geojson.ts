// eslint-disable-next-line @typescript-eslint/triple-slash-reference -- the standalone tsc run of src/lib/imports/*.ts does not include src/types
/// <reference path="../../types/vendor.d.ts" />
// GeoJSON (RFC 7946) FeatureCollection of Points → ParsedTable. Structure is checked with
// geojson-validation; each feature's properties become columns, its coordinates the columns
// `longitude` and `latitude` (and `elevation_m` when a third coordinate is given), in EPSG:4326.

import { valid } from 'geojson-validation';
import { ImportFormatError, type Cell, type ParsedTable } from './types';

/** Column names the coordinates get; the mapping suggests lon / lat / elevation for them. */
export const GEOJSON_COLUMNS = {
	lon: 'longitude',
	lat: 'latitude',
	elevation: 'elevation_m'
} as const;

function toCell(value: unknown): Cell {
	if (value === null || value === undefined) return null;
	if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean')
		return value;
	if (Array.isArray(value) && value.every((v) => typeof v === 'string')) return value.join(', ');
	return JSON.stringify(value);
}

/** Parses GeoJSON text (or an already parsed object); throws ImportFormatError naming the feature. */
export function parseGeoJson(input: string | unknown): ParsedTable {
	let obj: unknown = input;
	if (typeof input === 'string') {
		try {
			obj = JSON.parse(input.charCodeAt(0) === 0xfeff ? input.slice(1) : input);
		} catch (e) {
			throw new ImportFormatError(`The file is not valid JSON: ${(e as Error).message}`);
		}
	}
	const problems = valid(obj, true);
	if (problems.length > 0)
		throw new ImportFormatError(
			`The file is not valid GeoJSON (RFC 7946): ${problems.slice(0, 5).join('; ')}`
		);
	const fc = obj as { type: string; features?: unknown[] };
	if (fc.type !== 'FeatureCollection' || !Array.isArray(fc.features))
		throw new ImportFormatError(`Expected a GeoJSON FeatureCollection; got a ${fc.type}.`);
	const features = fc.features as {
		geometry: { type: string; coordinates: number[] } | null;
		properties: Record<string, unknown> | null;
	}[];
	const propertyNames: string[] = [];
	const seen = new Set<string>();
	let hasElevation = false;
	features.forEach((f, i) => {
		if (!f.geometry || f.geometry.type !== 'Point')
			throw new ImportFormatError(
				`Feature ${i + 1}: geometry must be a Point; got ${f.geometry ? f.geometry.type : 'null'}.`,
				{ row: i + 1, column: 'geometry', value: f.geometry?.type ?? null }
			);
		if (f.geometry.coordinates.length > 2) hasElevation = true;
		for (const key of Object.keys(f.properties ?? {}))
			if (!seen.has(key)) {
				seen.add(key);
				propertyNames.push(key);
			}
	});
	const coordColumns: string[] = [GEOJSON_COLUMNS.lon, GEOJSON_COLUMNS.lat];
	if (hasElevation) coordColumns.push(GEOJSON_COLUMNS.elevation);
	for (const c of coordColumns)
		if (seen.has(c))
			throw new ImportFormatError(
				`A property is named ${JSON.stringify(c)}, which the coordinates use; rename it.`,
				{
					column: c
				}
			);
	const headers = [...coordColumns, ...propertyNames];
	const rows: Cell[][] = features.map((f) => {
		const [lon, lat, z] = f.geometry!.coordinates;
		const coords: Cell[] = hasElevation ? [lon, lat, z ?? null] : [lon, lat];
		return [...coords, ...propertyNames.map((p) => toCell(f.properties?.[p]))];
	});
	return {
		headers,
		rows,
		sourceRowNumbers: features.map((_, i) => i + 1),
		rowKind: 'feature',
		decimalComma: false,
		source: { format: 'geojson' }
	};
}
