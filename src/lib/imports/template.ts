// The downloadable upload template: Thermalith's own column names with one invented example row.

import { writeCsv } from '../csv/write';
import { FIELDS, type FieldKey } from './fields';

/** File name the template is shipped and offered under (static/examples/). */
export const TEMPLATE_FILE_NAME = 'thermalith-template.csv';

/** Fields left out of the template: its coordinates are WGS 84 longitude/latitude. */
const NOT_IN_TEMPLATE: ReadonlySet<FieldKey> = new Set(['x', 'y', 'epsg']);

/** One invented example row (consistent: 62.4 mW/m² / 2.6 W/m/K = 24.0 K/km). */
const EXAMPLE: Partial<Record<FieldKey, string>> = {
	code: 'DEMO-001',
	name: 'Invented example borehole',
	lon: '8.25',
	lat: '59.4',
	elevation: '212',
	waterDepth: '',
	topDepth: '100',
	bottomDepth: '850',
	heatFlow: '62.4',
	heatFlowSigma: '4.1',
	gradient: '24.0',
	gradientSigma: '0.6',
	conductivity: '2.6',
	conductivitySigma: '0.15',
	conductivitySamples: '18',
	conductivityMethod: 'divided bar',
	heatProduction: '2.1',
	heatProductionSigma: '0.3',
	surfaceTemperature: '6.2',
	method: 'borehole_interval',
	corrections: 'topographic, palaeoclimatic',
	year: '2019',
	remarks: 'Invented example row (demo data); replace it with your sites.'
};

/** The template's columns in order (units in the names: m, mW/m², K/km, W/m/K, µW/m³, °C). */
export function templateColumns(): string[] {
	return FIELDS.filter((f) => !NOT_IN_TEMPLATE.has(f.key)).map((f) => f.templateColumn);
}

/** The template as comma-separated UTF-8 text with a header and one invented example row. */
export function templateCsv(): string {
	const fields = FIELDS.filter((f) => !NOT_IN_TEMPLATE.has(f.key));
	return writeCsv(
		fields.map((f) => f.templateColumn),
		[fields.map((f) => EXAMPLE[f.key] ?? '')]
	);
}
