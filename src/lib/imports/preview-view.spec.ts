import { describe, expect, it } from 'vitest';
import { displayValues, PREVIEW_COLUMNS, roundForDisplay } from './preview-view';

// Display rounding only (the stored value stays exact); decimals per quantity are common practice, no source.
describe('the preview as a person reads it', () => {
	it('rounds floating-point noise away without trailing zeros', () => {
		expect(roundForDisplay(77.40400000000001, 1)).toBe('77.4');
		expect(roundForDisplay(62.76, 1)).toBe('62.8');
		expect(roundForDisplay(2.5, 2)).toBe('2.5');
		expect(roundForDisplay(-0.00001, 2)).toBe('0');
	});

	it('labels columns with their units and shows lat/lon and the coordinates as entered', () => {
		expect(PREVIEW_COLUMNS.map((c) => c.label)).toEqual(
			expect.arrayContaining([
				'Latitude (°)',
				'Longitude (°)',
				'As entered',
				'Heat flow (mW/m²)',
				'Gradient (K/km)',
				'Conductivity (W/m/K)'
			])
		);
		const v = displayValues({
			code: 'LV-01',
			location: { lon: 9.000000000001, lat: 59.538345678 },
			originalX: 500000,
			originalY: 6600000,
			originalEpsg: 25832,
			heatFlowMWm2: 66.944,
			gradientKPerKm: 23.9,
			conductivityWmK: 2.8
		});
		expect(v).toMatchObject({
			code: 'LV-01',
			lat: '59.53835',
			lon: '9',
			asEntered: '500000 / 6600000 (EPSG:25832)',
			heatFlowMWm2: '66.9',
			gradientKPerKm: '23.9',
			conductivityWmK: '2.8',
			heatProductionUWm3: ''
		});
	});
});
