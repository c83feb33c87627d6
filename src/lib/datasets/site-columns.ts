/**
 * The site columns of downloads and of the version diff, with the upload template's column names
 * (imports/fields.ts), so a downloaded CSV imports again unchanged.
 */
import { FIELDS, type FieldKey } from '../imports/fields';

/** Import field → key of the site row (`lon`/`lat` come from the location point). */
const EXPORTED: readonly [FieldKey, string][] = [
	['code', 'code'],
	['name', 'name'],
	['lon', 'lon'],
	['lat', 'lat'],
	['elevation', 'elevationM'],
	['waterDepth', 'waterDepthM'],
	['topDepth', 'topDepthM'],
	['bottomDepth', 'bottomDepthM'],
	['heatFlow', 'heatFlowMWm2'],
	['heatFlowSigma', 'heatFlowSigmaMWm2'],
	['gradient', 'gradientKPerKm'],
	['gradientSigma', 'gradientSigmaKPerKm'],
	['conductivity', 'conductivityWmK'],
	['conductivitySigma', 'conductivitySigmaWmK'],
	['conductivitySamples', 'conductivitySamples'],
	['conductivityMethod', 'conductivityMethod'],
	['heatProduction', 'heatProductionUWm3'],
	['heatProductionSigma', 'heatProductionSigmaUWm3'],
	['surfaceTemperature', 'surfaceTemperatureC'],
	['method', 'method'],
	['corrections', 'corrections'],
	['year', 'yearMeasured'],
	['remarks', 'remarks']
];

export interface SiteColumn {
	/** Key of the site row. */
	key: string;
	/** Column name in CSV and property name in GeoJSON (the template's, units included). */
	header: string;
	label: string;
}

const field = (k: FieldKey) => FIELDS.find((f) => f.key === k)!;

/** Download columns, in template order, then the product's computed quality class. */
export const SITE_EXPORT_COLUMNS: readonly SiteColumn[] = [
	...EXPORTED.map(([k, key]) => ({ key, header: field(k).templateColumn, label: field(k).label })),
	{ key: 'qualityClass', header: 'quality_class', label: 'Quality class' }
];

const LABELS: Record<string, string> = {
	...Object.fromEntries(SITE_EXPORT_COLUMNS.map((c) => [c.key, c.label])),
	location: 'Location (longitude, latitude)',
	originalX: 'Original x',
	originalY: 'Original y',
	originalEpsg: 'Original CRS (EPSG)'
};

/** How a site field is named in the version diff; unknown keys as they are. */
export function siteFieldLabel(key: string): string {
	return LABELS[key] ?? key;
}
