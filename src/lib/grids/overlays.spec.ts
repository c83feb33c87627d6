import { describe, expect, it } from 'vitest';
import { overlayLegend, overlayProblem, overlayUrl, type OverlayChoice } from './overlays';

const base = '/api/v1/grids/abc';
const links = {
	geotiff: `${base}/heat-flow.tif`,
	sigmaGeotiff: null,
	csv: `${base}/grid.csv`,
	png: `${base}/heat-flow.png`,
	sigmaPng: null,
	contours: `${base}/contours.geojson`,
	temperatureAtDepth: `${base}/temperature-at-depth.tif?depthM=3000`,
	isothermDepth: `${base}/isotherm-depth.tif?temperatureC=150`,
	temperatureAtDepthPng: `${base}/temperature-at-depth.png?depthM=3000&band=p50`,
	isothermDepthPng: `${base}/isotherm-depth.png?temperatureC=150&band=p50`
};
const choice = (c: Partial<OverlayChoice>): OverlayChoice => ({
	kind: 'value',
	isothermC: 150,
	depthM: 3000,
	percentile: 'p50',
	...c
});

describe('grid overlays', () => {
	it('draw the chosen isotherm, depth and percentile; no σ overlay without σ', () => {
		expect(overlayUrl(links, choice({}))).toBe(links.png);
		expect(overlayUrl(links, choice({ kind: 'sigma' }))).toBeNull();
		expect(
			overlayUrl(links, choice({ kind: 'isotherm-depth', isothermC: 120, percentile: 'p90' }))
		).toBe(`${base}/isotherm-depth.png?temperatureC=120&band=p90`);
		expect(overlayUrl(links, choice({ kind: 'temperature-at-depth', depthM: 4500 }))).toBe(
			`${base}/temperature-at-depth.png?depthM=4500&band=p50`
		);
		expect(
			overlayUrl(links, choice({ kind: 'temperature-at-depth', depthM: 4500, crust: 'basin' }))
		).toBe(`${base}/temperature-at-depth.png?depthM=4500&band=p50&crust=basin`);
	});

	it('follow the chosen crust: its base limits the depth, its assumptions are in the legend', () => {
		const deep = choice({ kind: 'temperature-at-depth', depthM: 28_000 });
		expect(overlayProblem(deep)).toBeNull();
		expect(overlayProblem({ ...deep, crust: 'thin' })).toBe(
			'Choose a depth within the 25 km of the model “Thin, stretched crust (25 km)”.'
		);
		const shield = overlayLegend(choice({ kind: 'isotherm-depth', crust: 'shield' }));
		expect(shield.classes.at(-1)!.label).toBe('not reached within the 45 km crust');
		expect(shield.assumptions).toContain('Thick old shield crust (45 km)');
		expect(overlayLegend(choice({})).assumptions).toBe('');
	});

	it('name an isotherm or depth outside the limits in a sentence, only for its own overlay', () => {
		expect(overlayProblem(choice({ kind: 'isotherm-depth', isothermC: 5 }))).toBe(
			'Choose an isotherm from 20 to 1000 °C.'
		);
		expect(overlayProblem(choice({ kind: 'isotherm-depth', isothermC: NaN }))).not.toBeNull();
		expect(overlayProblem(choice({ kind: 'temperature-at-depth', depthM: 40_000 }))).toBe(
			'Choose a depth from 0.1 to 30 km.'
		);
		expect(overlayProblem(choice({ kind: 'value', isothermC: 5 }))).toBeNull();
	});

	it('give each overlay a legend with units, and the at-depth ones their grey not-reached class', () => {
		expect(overlayLegend(choice({})).title).toBe('Estimated surface heat flow (mW/m²)');
		const depth = overlayLegend(choice({ kind: 'isotherm-depth', percentile: 'p10' }));
		expect(depth.title).toBe('Depth of 150 °C (km), P10');
		expect(depth.classes.at(-1)!.label).toBe('not reached within the 35 km crust');
		const temp = overlayLegend(choice({ kind: 'temperature-at-depth', depthM: 4500 }));
		expect(temp.title).toBe('Temperature at 4.5 km (°C), P50 (median)');
		expect(temp.classes[0].label).toBe('< 100 °C');
	});
});
