// The product's own import fields: what an uploaded column can be mapped to, with the synonyms
// header guessing uses and the quantity whose unit the user chooses. Names are Thermalith's own.

import type { Quantity } from '../geo/units';

export type FieldKey =
	| 'code'
	| 'name'
	| 'x'
	| 'y'
	| 'lon'
	| 'lat'
	| 'epsg'
	| 'elevation'
	| 'waterDepth'
	| 'topDepth'
	| 'bottomDepth'
	| 'heatFlow'
	| 'heatFlowSigma'
	| 'gradient'
	| 'gradientSigma'
	| 'conductivity'
	| 'conductivitySigma'
	| 'conductivitySamples'
	| 'conductivityMethod'
	| 'heatProduction'
	| 'heatProductionSigma'
	| 'surfaceTemperature'
	| 'method'
	| 'corrections'
	| 'year'
	| 'remarks';

export type FieldKind =
	'text' | 'number' | 'count' | 'year' | 'angle' | 'epsg' | 'method' | 'corrections';

export interface FieldDef {
	key: FieldKey;
	/** Label in the mapping UI and in messages when no header applies. */
	label: string;
	/** The product's own column name, used by the template (unit suffix included). */
	templateColumn: string;
	kind: FieldKind;
	/** Set when the column has a unit choice. */
	quantity?: Quantity;
	/** Header spellings (normalised by mapping.ts) that suggest this field. */
	synonyms: string[];
	/** One-line help for the mapping UI. */
	help: string;
}

const SIGMA_WORDS = [
	'sigma',
	'sd',
	'std',
	'stdev',
	'err',
	'error',
	'uncertainty',
	'unc',
	'1s',
	'plusminus'
];

/** Synonyms of a 1-σ column: each base spelling with a sigma word before or after it. */
function sigmaOf(bases: string[]): string[] {
	return bases.flatMap((b) => SIGMA_WORDS.flatMap((w) => [`${b} ${w}`, `${w} ${b}`, `d${b}`]));
}

const HEAT_FLOW = [
	'heat flow',
	'heatflow',
	'hf',
	'q',
	'q0',
	'qs',
	'surface heat flow',
	'heat flow density',
	'hfd'
];
const GRADIENT = [
	'gradient',
	'grad',
	'temperature gradient',
	'geothermal gradient',
	'thermal gradient',
	'dtdz',
	'g'
];
const CONDUCTIVITY = [
	'conductivity',
	'thermal conductivity',
	'k',
	'tc',
	'lambda',
	'cond',
	'mean conductivity'
];
const HEAT_PRODUCTION = [
	'heat production',
	'radiogenic heat production',
	'a',
	'a0',
	'hp',
	'heat generation',
	'rhp'
];

/** Every import field, in template order. */
export const FIELDS: readonly FieldDef[] = [
	{
		key: 'code',
		label: 'Site code',
		templateColumn: 'site_code',
		kind: 'text',
		synonyms: [
			'site code',
			'code',
			'site',
			'site id',
			'id',
			'borehole',
			'well',
			'hole',
			'station',
			'borehole id',
			'well id',
			'bh',
			'sample'
		],
		help: 'Unique within the dataset; required.'
	},
	{
		key: 'name',
		label: 'Site name',
		templateColumn: 'site_name',
		kind: 'text',
		synonyms: ['site name', 'name', 'borehole name', 'well name', 'locality', 'location name'],
		help: 'Free text.'
	},
	{
		key: 'lon',
		label: 'Longitude',
		templateColumn: 'longitude_deg',
		kind: 'angle',
		synonyms: ['longitude', 'lon', 'long', 'lng', 'longitude deg', 'lon deg', 'longitude e'],
		help: 'Decimal degrees or D°M′S″ with E/W; in the chosen geographic CRS.'
	},
	{
		key: 'lat',
		label: 'Latitude',
		templateColumn: 'latitude_deg',
		kind: 'angle',
		synonyms: ['latitude', 'lat', 'latitude deg', 'lat deg', 'latitude n'],
		help: 'Decimal degrees or D°M′S″ with N/S; in the chosen geographic CRS.'
	},
	{
		key: 'x',
		label: 'Easting / x',
		templateColumn: 'x',
		kind: 'number',
		synonyms: [
			'x',
			'easting',
			'east',
			'e',
			'x coord',
			'x coordinate',
			'utm e',
			'utm x',
			'utm easting'
		],
		help: 'Projected easting in the chosen CRS.'
	},
	{
		key: 'y',
		label: 'Northing / y',
		templateColumn: 'y',
		kind: 'number',
		synonyms: [
			'y',
			'northing',
			'north',
			'n',
			'y coord',
			'y coordinate',
			'utm n',
			'utm y',
			'utm northing'
		],
		help: 'Projected northing in the chosen CRS.'
	},
	{
		key: 'epsg',
		label: 'CRS (EPSG code) per row',
		templateColumn: 'epsg',
		kind: 'epsg',
		synonyms: ['epsg', 'crs', 'srid', 'epsg code', 'coordinate system', 'spatial reference'],
		help: 'Overrides the file-wide CRS for that row.'
	},
	{
		key: 'elevation',
		label: 'Elevation',
		templateColumn: 'elevation_m',
		kind: 'number',
		quantity: 'depth',
		synonyms: [
			'elevation',
			'elev',
			'altitude',
			'alt',
			'height',
			'z',
			'ground level',
			'kb elevation'
		],
		help: 'Ground (or sea floor) above sea level.'
	},
	{
		key: 'waterDepth',
		label: 'Water depth',
		templateColumn: 'water_depth_m',
		kind: 'number',
		quantity: 'depth',
		synonyms: ['water depth', 'waterdepth', 'wd', 'bathymetry', 'sea depth'],
		help: 'Marine sites: depth of the sea floor.'
	},
	{
		key: 'topDepth',
		label: 'Top depth',
		templateColumn: 'top_depth_m',
		kind: 'number',
		quantity: 'depth',
		synonyms: [
			'top depth',
			'top',
			'depth top',
			'from',
			'depth from',
			'interval top',
			'min depth',
			'upper depth'
		],
		help: 'Top of the interval used, below ground.'
	},
	{
		key: 'bottomDepth',
		label: 'Bottom depth',
		templateColumn: 'bottom_depth_m',
		kind: 'number',
		quantity: 'depth',
		synonyms: [
			'bottom depth',
			'bottom',
			'base',
			'depth bottom',
			'to',
			'depth to',
			'interval bottom',
			'max depth',
			'lower depth',
			'total depth',
			'td',
			'depth'
		],
		help: 'Bottom of the interval used, below ground.'
	},
	{
		key: 'heatFlow',
		label: 'Heat flow',
		templateColumn: 'heat_flow_mW_m2',
		kind: 'number',
		quantity: 'heatFlow',
		synonyms: HEAT_FLOW,
		help: 'Positive upward (out of the ground).'
	},
	{
		key: 'heatFlowSigma',
		label: 'Heat flow 1-σ',
		templateColumn: 'heat_flow_sigma_mW_m2',
		kind: 'number',
		quantity: 'heatFlow',
		synonyms: sigmaOf(HEAT_FLOW),
		help: 'One standard deviation.'
	},
	{
		key: 'gradient',
		label: 'Temperature gradient',
		templateColumn: 'gradient_K_km',
		kind: 'number',
		quantity: 'gradient',
		synonyms: GRADIENT,
		help: 'Over the interval used.'
	},
	{
		key: 'gradientSigma',
		label: 'Gradient 1-σ',
		templateColumn: 'gradient_sigma_K_km',
		kind: 'number',
		quantity: 'gradient',
		synonyms: sigmaOf(GRADIENT),
		help: 'One standard deviation.'
	},
	{
		key: 'conductivity',
		label: 'Thermal conductivity',
		templateColumn: 'conductivity_W_mK',
		kind: 'number',
		quantity: 'conductivity',
		synonyms: CONDUCTIVITY,
		help: 'Mean over the interval.'
	},
	{
		key: 'conductivitySigma',
		label: 'Conductivity 1-σ',
		templateColumn: 'conductivity_sigma_W_mK',
		kind: 'number',
		quantity: 'conductivity',
		synonyms: sigmaOf(CONDUCTIVITY),
		help: 'One standard deviation.'
	},
	{
		key: 'conductivitySamples',
		label: 'Conductivity samples',
		templateColumn: 'conductivity_samples',
		kind: 'count',
		synonyms: [
			'conductivity samples',
			'k samples',
			'tc samples',
			'n k',
			'nk',
			'k n',
			'tc n',
			'n tc',
			'samples',
			'n samples',
			'number of samples'
		],
		help: 'How many conductivity measurements.'
	},
	{
		key: 'conductivityMethod',
		label: 'Conductivity method',
		templateColumn: 'conductivity_method',
		kind: 'text',
		synonyms: ['conductivity method', 'k method', 'tc method', 'measurement method k'],
		help: 'Free text, e.g. divided bar, needle probe, optical scanning.'
	},
	{
		key: 'heatProduction',
		label: 'Heat production',
		templateColumn: 'heat_production_uW_m3',
		kind: 'number',
		quantity: 'heatProduction',
		synonyms: HEAT_PRODUCTION,
		help: 'Radiogenic heat production.'
	},
	{
		key: 'heatProductionSigma',
		label: 'Heat production 1-σ',
		templateColumn: 'heat_production_sigma_uW_m3',
		kind: 'number',
		quantity: 'heatProduction',
		synonyms: sigmaOf(HEAT_PRODUCTION),
		help: 'One standard deviation.'
	},
	{
		key: 'surfaceTemperature',
		label: 'Surface temperature',
		templateColumn: 'surface_temperature_C',
		kind: 'number',
		quantity: 'temperature',
		synonyms: [
			'surface temperature',
			'surface temp',
			'ts',
			't0',
			'mean annual temperature',
			'mast',
			'ground surface temperature',
			'gst',
			'bottom water temperature',
			'bwt'
		],
		help: 'Ground surface or sea-floor temperature.'
	},
	{
		key: 'method',
		label: 'Method',
		templateColumn: 'method',
		kind: 'method',
		synonyms: ['method', 'hf method', 'heat flow method', 'determination', 'technique', 'type'],
		help: 'interval, Bullard, BHT, marine probe or other.'
	},
	{
		key: 'corrections',
		label: 'Corrections',
		templateColumn: 'corrections',
		kind: 'corrections',
		synonyms: ['corrections', 'correction', 'corrected', 'corr', 'corrections applied'],
		help: 'Any of topographic, palaeoclimatic, sedimentation, other; separated by , ; / or +.'
	},
	{
		key: 'year',
		label: 'Year measured',
		templateColumn: 'year_measured',
		kind: 'year',
		synonyms: ['year measured', 'year', 'measured', 'date', 'date measured', 'survey year', 'yr'],
		help: 'Four-digit year or a date.'
	},
	{
		key: 'remarks',
		label: 'Remarks',
		templateColumn: 'remarks',
		kind: 'text',
		synonyms: ['remarks', 'remark', 'comment', 'comments', 'notes', 'note', 'description'],
		help: 'Free text.'
	}
];

const byKey = new Map<FieldKey, FieldDef>(FIELDS.map((f) => [f.key, f]));

/** The definition of a field. */
export function field(key: FieldKey): FieldDef {
	const f = byKey.get(key);
	if (!f) throw new RangeError(`unknown import field ${key}`);
	return f;
}
