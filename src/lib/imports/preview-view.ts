// The preview as a person reads it: the product's column labels with units, numbers rounded to
// what the quantity's precision warrants, coordinates as lat/lon and as entered.

import { cellText } from './cells';
import type { SiteDraft } from './site-draft';

export interface PreviewColumn {
	key: string;
	label: string;
}

/** Decimals shown per stored quantity (display only; the stored value is exact). */
const NUMBER_COLUMNS: [keyof SiteDraft, string, number][] = [
	['heatFlowMWm2', 'Heat flow (mW/m²)', 1],
	['heatFlowSigmaMWm2', 'σ heat flow (mW/m²)', 1],
	['gradientKPerKm', 'Gradient (K/km)', 1],
	['conductivityWmK', 'Conductivity (W/m/K)', 2],
	['heatProductionUWm3', 'Heat production (µW/m³)', 2],
	['topDepthM', 'Top (m)', 0],
	['bottomDepthM', 'Bottom (m)', 0],
	['elevationM', 'Elevation (m)', 0]
];

export const PREVIEW_COLUMNS: PreviewColumn[] = [
	{ key: 'code', label: 'Site code' },
	{ key: 'name', label: 'Name' },
	{ key: 'lat', label: 'Latitude (°)' },
	{ key: 'lon', label: 'Longitude (°)' },
	{ key: 'asEntered', label: 'As entered' },
	...NUMBER_COLUMNS.map(([key, label]) => ({ key, label })),
	{ key: 'method', label: 'Method' },
	{ key: 'qualityClass', label: 'Quality' }
];

/** Rounds for display without trailing zeros: 77.40400000000001 → "77.4". */
export function roundForDisplay(v: number, decimals: number): string {
	const r = Number(v.toFixed(decimals));
	return Object.is(r, -0) ? '0' : String(r);
}

/** One row's display values by PREVIEW_COLUMNS key ('' when absent). */
export function displayValues(values: Partial<SiteDraft>): Record<string, string> {
	const out: Record<string, string> = {
		code: values.code ?? '',
		name: values.name ?? '',
		lat: values.location ? roundForDisplay(values.location.lat, 5) : '',
		lon: values.location ? roundForDisplay(values.location.lon, 5) : '',
		asEntered:
			values.originalX != null && values.originalY != null
				? `${cellText(values.originalX)} / ${cellText(values.originalY)} (EPSG:${values.originalEpsg})`
				: '',
		method: values.method ?? '',
		qualityClass: values.qualityClass ?? ''
	};
	for (const [key, , decimals] of NUMBER_COLUMNS) {
		const v = values[key];
		out[key] = typeof v === 'number' ? roundForDisplay(v, decimals) : '';
	}
	return out;
}
