// One uploaded row → the site as it will be stored, plus its errors (blocking) and warnings.
// Duplicate codes need the whole file and are checked in preview.ts.

import { qualityClass } from '../sites/quality';
import {
	cellText,
	controlCharacter,
	isBlank,
	parseCountCell,
	parseNumberCell,
	parseTextCell,
	parseYearCell
} from './cells';
import { degreesOutsideZone, getCrs, parseEpsg, toWgs84 } from '../geo/crs';
import { parseAngle } from './dms';
import { FIELDS, field, type FieldKey } from './fields';
import type { ColumnMapping } from './mapping';
import {
	EARLIEST_PLAUSIBLE_YEAR,
	MAX_GRADIENT_MISMATCH,
	MAX_PLAUSIBLE_HEAT_FLOW_MWM2,
	MAX_PLAUSIBLE_HEAT_PRODUCTION_UWM3,
	PLAUSIBLE_CONDUCTIVITY_WMK
} from '../foundation/limits';
import type { SiteDraft } from './site-draft';
import type { Cell, ImportIssue, ParsedTable, Severity } from './types';
import { findUnit, type UnitDef } from '../geo/units';
import { flagsOf } from '../sites/flags';
import {
	methodSpellings,
	parseCorrections,
	parseMethod,
	type Correction,
	type HeatFlowMethod
} from './vocabulary';

export interface ValidateOptions {
	mapping: ColumnMapping;
	/** CRS of the coordinate columns when no per-row EPSG column is mapped; default 4326. */
	epsg?: number;
	/** The sites are in a volcanic area: no warning for heat flow above MAX_PLAUSIBLE_HEAT_FLOW_MWM2. */
	volcanicArea?: boolean;
	/** Distance in metres under which two sites are reported as possibly the same; default 100. */
	nearDistanceM?: number;
	/** Server hook: a message when a site is close to an existing one (shown as a warning), else null. */
	nearExisting?: (site: SiteDraft) => string | null;
	/** Year used for the "measured in the future" warning; default the current UTC year. */
	currentYear?: number;
}

export interface RowResult {
	/** The row number the user sees (header = 1) or the feature number. */
	row: number;
	/** The stored value; null when the row has an error. */
	site: SiteDraft | null;
	/** What could be read, for the preview table even when the row has errors. */
	values: Partial<SiteDraft>;
	errors: ImportIssue[];
	warnings: ImportIssue[];
}

const NUMERIC_FIELDS = [
	['elevation', 'elevationM', false],
	['waterDepth', 'waterDepthM', false],
	['topDepth', 'topDepthM', false],
	['bottomDepth', 'bottomDepthM', false],
	['heatFlow', 'heatFlowMWm2', false],
	['heatFlowSigma', 'heatFlowSigmaMWm2', true],
	['gradient', 'gradientKPerKm', false],
	['gradientSigma', 'gradientSigmaKPerKm', true],
	['conductivity', 'conductivityWmK', false],
	['conductivitySigma', 'conductivitySigmaWmK', true],
	['heatProduction', 'heatProductionUWm3', false],
	['heatProductionSigma', 'heatProductionSigmaUWm3', true],
	['surfaceTemperature', 'surfaceTemperatureC', false]
] as const satisfies readonly (readonly [FieldKey, keyof SiteDraft, boolean])[];

/** Column indices and units resolved once per file, so each row is cheap. */
export interface RowContext {
	table: ParsedTable;
	options: ValidateOptions;
	columns: Partial<Record<FieldKey, number>>;
	units: Partial<Record<FieldKey, UnitDef>>;
	defaultEpsg: number;
	currentYear: number;
}

/** Resolves a mapping against a table once (call checkMapping first for whole-file problems). */
export function prepareRowContext(table: ParsedTable, options: ValidateOptions): RowContext {
	const columns: Partial<Record<FieldKey, number>> = {};
	const units: Partial<Record<FieldKey, UnitDef>> = {};
	for (const def of FIELDS) {
		const choice = options.mapping[def.key];
		if (!choice) continue;
		columns[def.key] = choice.column;
		if (def.quantity) {
			const unit = findUnit(def.quantity, choice.unit ?? '');
			if (!unit) throw new RangeError(`unit ${choice.unit} is not a ${def.quantity} unit`);
			units[def.key] = unit;
		}
	}
	return {
		table,
		options,
		columns,
		units,
		defaultEpsg: options.epsg ?? 4326,
		currentYear: options.currentYear ?? new Date().getUTCFullYear()
	};
}

// eslint-disable-next-line no-control-regex -- shown as a replacement character in messages
const CONTROL_ALL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g;

/** The site code as messages quote it: trimmed, control characters shown as �, cut short. */
function codeForMessages(cell: Cell | undefined): string | null {
	const t = cellText(cell).replace(CONTROL_ALL, '�');
	if (t === '') return null;
	return t.length > 40 ? `${t.slice(0, 40)}…` : t;
}

function fmt(n: number): string {
	return Number.isInteger(n) ? String(n) : String(Number(n.toPrecision(6)));
}

/** Validates data row `index` of the context's table. */
export function validateRow(ctx: RowContext, index: number): RowResult {
	const { table, columns, units } = ctx;
	const cells = table.rows[index];
	const row = table.sourceRowNumbers[index];
	const where = table.rowKind === 'feature' ? 'Feature' : 'Row';
	const errors: ImportIssue[] = [];
	const warnings: ImportIssue[] = [];
	const headerOf = (key: FieldKey) =>
		columns[key] !== undefined ? table.headers[columns[key]!] : field(key).label;
	const cellOf = (key: FieldKey): Cell | undefined =>
		columns[key] !== undefined ? cells[columns[key]!] : undefined;
	// Every message names the row and, when it has one, the site code, so a report line can be
	// found in the file by either.
	const siteCode = columns.code !== undefined ? codeForMessages(cells[columns.code]) : null;
	const here = siteCode === null ? `${where} ${row}` : `${where} ${row} (site ${siteCode})`;
	const add = (
		severity: Severity,
		key: FieldKey | string,
		value: string,
		code: string,
		text: string
	) => {
		const column = (FIELDS.some((f) => f.key === key) ? headerOf(key as FieldKey) : key) as string;
		const shown = value === '' ? 'empty' : JSON.stringify(value);
		const issue: ImportIssue = {
			row,
			siteCode,
			severity,
			column,
			value,
			code,
			message: `${here}, column "${column}": ${shown} ${text}`
		};
		(severity === 'error' ? errors : warnings).push(issue);
	};
	const values: Partial<SiteDraft> = {};

	// Control characters in any mapped cell block the row (PostgreSQL refuses NUL in text).
	for (const def of FIELDS) {
		const c = columns[def.key];
		if (c === undefined) continue;
		const bad = controlCharacter(cells[c]);
		if (bad)
			add(
				'error',
				def.key,
				cellText(cells[c]).replace(CONTROL_ALL, '�'),
				'text.control-character',
				`contains the control character ${bad}, which cannot be stored; remove it.`
			);
	}

	// Site code and text fields.
	const code = parseTextCell(cellOf('code'));
	if (code === null) add('error', 'code', '', 'code.missing', '— every site needs a site code.');
	else values.code = code;
	values.name = parseTextCell(cellOf('name'));
	values.conductivityMethod = parseTextCell(cellOf('conductivityMethod'));
	values.remarks = parseTextCell(cellOf('remarks'));

	// Numbers in a unit.
	const num: Partial<Record<FieldKey, number | null>> = {};
	for (const [key, prop, isSigma] of NUMERIC_FIELDS) {
		if (columns[key] === undefined) {
			(values as Record<string, unknown>)[prop] = null;
			continue;
		}
		const cell = cellOf(key);
		const r = parseNumberCell(cell, table.decimalComma);
		if (!r.ok) {
			add('error', key, cellText(cell), r.code, `${r.error} (${field(key).label}).`);
			continue;
		}
		const unit = units[key]!;
		const v =
			r.value === null ? null : isSigma ? unit.deltaToStored(r.value) : unit.toStored(r.value);
		num[key] = v;
		(values as Record<string, unknown>)[prop] = v;
		if (v !== null && isSigma && v < 0)
			add(
				'error',
				key,
				cellText(cell),
				'sigma.negative',
				'is negative; a standard deviation must be ≥ 0.'
			);
	}
	const samples =
		columns.conductivitySamples !== undefined
			? parseCountCell(cellOf('conductivitySamples'), table.decimalComma)
			: null;
	if (samples && !samples.ok)
		add(
			'error',
			'conductivitySamples',
			cellText(cellOf('conductivitySamples')),
			'count.invalid',
			`${samples.error}.`
		);
	values.conductivitySamples = samples && samples.ok ? samples.value : null;
	const year = columns.year !== undefined ? parseYearCell(cellOf('year')) : null;
	if (year && !year.ok)
		add('error', 'year', cellText(cellOf('year')), 'year.invalid', `${year.error}.`);
	values.yearMeasured = year && year.ok ? year.value : null;
	if (
		values.yearMeasured != null &&
		(values.yearMeasured < EARLIEST_PLAUSIBLE_YEAR || values.yearMeasured > ctx.currentYear)
	)
		add(
			'warning',
			'year',
			cellText(cellOf('year')),
			'year.implausible',
			`is before ${EARLIEST_PLAUSIBLE_YEAR} or in the future; check the year.`
		);

	// Method and corrections.
	let method: HeatFlowMethod = 'other';
	if (columns.method !== undefined) {
		const text = cellText(cellOf('method'));
		if (text === '')
			add('warning', 'method', '', 'method.missing', '— no method given; stored as "other".');
		else {
			const m = parseMethod(text);
			if (m) method = m;
			else
				add(
					'error',
					'method',
					text,
					'method.unknown',
					`is not a known method; use one of ${methodSpellings().join('; ')}.`
				);
		}
	}
	values.method = method;
	let corrections: Correction[] = [];
	if (columns.corrections !== undefined) {
		const text = cellText(cellOf('corrections'));
		const parsed = parseCorrections(text);
		corrections = parsed.corrections;
		for (const u of parsed.unknown)
			add(
				'error',
				'corrections',
				text,
				'corrections.unknown',
				`contains ${JSON.stringify(u)}, which is not topographic, palaeoclimatic, sedimentation or other.`
			);
	}
	values.corrections = corrections;

	// Coordinates.
	readLocation(ctx, cellOf, add, values);

	// Physical impossibilities (errors) and plausibility (warnings).
	const q = num.heatFlow ?? null;
	const k = num.conductivity ?? null;
	const a = num.heatProduction ?? null;
	const g = num.gradient ?? null;
	const text = (key: FieldKey) => cellText(cellOf(key));
	if (k !== null && k <= 0)
		add(
			'error',
			'conductivity',
			text('conductivity'),
			'conductivity.nonpositive',
			'is ≤ 0 W/m/K; thermal conductivity must be positive.'
		);
	else if (k !== null && (k < PLAUSIBLE_CONDUCTIVITY_WMK.min || k > PLAUSIBLE_CONDUCTIVITY_WMK.max))
		add(
			'warning',
			'conductivity',
			text('conductivity'),
			'conductivity.implausible',
			`(${fmt(k)} W/m/K) is outside ${PLAUSIBLE_CONDUCTIVITY_WMK.min}–${PLAUSIBLE_CONDUCTIVITY_WMK.max} W/m/K, unusual for rock (common practice).`
		);
	if (a !== null && a < 0)
		add(
			'error',
			'heatProduction',
			text('heatProduction'),
			'heat-production.negative',
			'is negative; radiogenic heat production cannot be.'
		);
	else if (a !== null && a > MAX_PLAUSIBLE_HEAT_PRODUCTION_UWM3)
		add(
			'warning',
			'heatProduction',
			text('heatProduction'),
			'heat-production.implausible',
			`(${fmt(a)} µW/m³) is above ${MAX_PLAUSIBLE_HEAT_PRODUCTION_UWM3} µW/m³, high even for granite.`
		);
	if (q !== null && q < 0)
		add(
			'warning',
			'heatFlow',
			text('heatFlow'),
			'heat-flow.negative',
			`(${fmt(q)} mW/m²) is negative, i.e. downward; Thermalith counts heat flow positive upward.`
		);
	else if (q !== null && q > MAX_PLAUSIBLE_HEAT_FLOW_MWM2 && !ctx.options.volcanicArea)
		add(
			'warning',
			'heatFlow',
			text('heatFlow'),
			'heat-flow.implausible',
			`(${fmt(q)} mW/m²) is above ${MAX_PLAUSIBLE_HEAT_FLOW_MWM2} mW/m², implausible outside volcanic areas.`
		);
	if (columns.heatFlow === undefined || q === null)
		if (!errors.some((e) => e.code.startsWith('number.') && e.column === headerOf('heatFlow')))
			add(
				'warning',
				'heatFlow',
				text('heatFlow'),
				'heat-flow.missing',
				'— the site has no heat-flow value.'
			);
	if (q !== null && k !== null && g !== null && k > 0 && q !== 0) {
		const expected = q / k; // mW/m² ÷ W/m/K = mK/m = K/km
		const mismatch = Math.abs(g - expected) / Math.abs(expected);
		if (mismatch > MAX_GRADIENT_MISMATCH)
			add(
				'warning',
				'gradient',
				text('gradient'),
				'gradient.inconsistent',
				`(${fmt(g)} K/km) differs by ${Math.round(mismatch * 100)} % from heat flow / conductivity = ${fmt(q)} / ${fmt(k)} = ${fmt(expected)} K/km (more than ${MAX_GRADIENT_MISMATCH * 100} %).`
			);
	}
	const top = num.topDepth ?? null;
	const bottom = num.bottomDepth ?? null;
	if (top !== null && bottom !== null && top > bottom)
		add(
			'error',
			'topDepth',
			text('topDepth'),
			'depth.top-below-bottom',
			`(${fmt(top)} m) is below the bottom depth (${fmt(bottom)} m); depths are positive down.`
		);

	values.qualityClass = qualityClass({
		heatFlowMWm2: q,
		heatFlowSigmaMWm2: num.heatFlowSigma ?? null,
		method,
		conductivitySamples: values.conductivitySamples ?? null
	});
	const site = errors.length === 0 ? (values as SiteDraft) : null;
	if (site && ctx.options.nearExisting) {
		const near = ctx.options.nearExisting(site);
		if (near) {
			const { lat, lon } = site.location;
			warnings.push({
				row,
				siteCode,
				severity: 'warning',
				column: 'Coordinates',
				value: `${lat}, ${lon}`,
				code: 'location.near-existing',
				message: `${here}: the site at ${lat.toFixed(5)}, ${lon.toFixed(5)} is ${near}`
			});
		}
	}
	values.flags = flagsOf(warnings);
	return { row, site, values, errors, warnings };
}

type Add = (
	severity: Severity,
	key: FieldKey | string,
	value: string,
	code: string,
	text: string
) => void;

function readLocation(
	ctx: RowContext,
	cellOf: (k: FieldKey) => Cell | undefined,
	add: Add,
	values: Partial<SiteDraft>
): void {
	const { columns, table } = ctx;
	const projected = columns.x !== undefined && columns.y !== undefined;
	const xKey: FieldKey = projected ? 'x' : 'lon';
	const yKey: FieldKey = projected ? 'y' : 'lat';
	values.originalX = null;
	values.originalY = null;
	values.originalEpsg = null;
	let epsg = ctx.defaultEpsg;
	if (columns.epsg !== undefined && !isBlank(cellOf('epsg'))) {
		const text = cellText(cellOf('epsg'));
		const code = parseEpsg(text);
		if (code === null || !getCrs(code)) {
			add(
				'error',
				'epsg',
				text,
				'crs.unknown',
				"is not an EPSG code in Thermalith's coordinate system list."
			);
			return;
		}
		epsg = code;
	}
	const crs = getCrs(epsg);
	if (!crs) {
		add(
			'error',
			'Coordinates',
			String(epsg),
			'crs.unknown',
			`— EPSG:${epsg} is not in Thermalith's coordinate system list.`
		);
		return;
	}
	if (!projected && crs.kind !== 'geographic') {
		add(
			'error',
			'Coordinates',
			String(epsg),
			'crs.not-geographic',
			`— longitude/latitude columns cannot be in projected EPSG:${epsg}; map easting/northing instead.`
		);
		return;
	}
	const read = (key: FieldKey, axis: 'lat' | 'lon'): number | null | undefined => {
		const cell = cellOf(key);
		if (isBlank(cell)) {
			add(
				'error',
				key,
				'',
				'coordinate.missing',
				'— the coordinate is missing; every site needs a location.'
			);
			return undefined;
		}
		if (projected) {
			const r = parseNumberCell(cell, table.decimalComma);
			if (!r.ok) {
				add('error', key, cellText(cell), r.code, `${r.error} (${field(key).label}).`);
				return undefined;
			}
			return r.value;
		}
		if (typeof cell === 'number') return cell;
		const r = parseAngle(cellText(cell), axis);
		if (!r.ok) {
			add('error', key, cellText(cell), 'angle.invalid', `${r.error}.`);
			return undefined;
		}
		return r.degrees;
	};
	const x = read(xKey, 'lon');
	const y = read(yKey, 'lat');
	if (x == null || y == null) return;
	values.originalX = x;
	values.originalY = y;
	values.originalEpsg = epsg;
	const t = toWgs84(x, y, epsg);
	const shown = `${cellText(cellOf(xKey))} / ${cellText(cellOf(yKey))}`;
	if (!t.ok) {
		add('error', 'Coordinates', shown, 'coordinate.transform', `— ${t.error}.`);
		return;
	}
	if (Math.abs(t.lat) > 90 || Math.abs(t.lon) > 180) {
		add(
			'error',
			'Coordinates',
			shown,
			'coordinate.out-of-range',
			`— in EPSG:${epsg} this is longitude ${fmt(t.lon)}°, latitude ${fmt(t.lat)}°, outside ±180° / ±90°.`
		);
		return;
	}
	values.location = { lon: t.lon, lat: t.lat };
	if (degreesOutsideZone(t.lon, epsg) > 0)
		add(
			'warning',
			'Coordinates',
			shown,
			'coordinate.outside-zone',
			`— lies at longitude ${fmt(t.lon)}°, far outside the zone of EPSG:${epsg} (${crs.name}); check the CRS.`
		);
}
