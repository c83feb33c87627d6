// Depth–temperature logs from LAS or two-column CSV → { depthM, temperatureC } sorted by depth,
// the input shape of heatFlowFromLog (src/lib/thermal/borehole.ts). Missing values and repeated
// depths are reported as warnings naming the line/row; non-numbers are errors.

import { parseNumberCell, cellText } from './cells';
import { parseCsv } from './csv';
import { lasItem, type LasCurve, type LasFile } from './las';
import { clipToken, quoteToken } from './quote';
import { ImportFormatError, type Cell, type ImportIssue } from './types';
import { findUnit, recogniseUnit, type UnitDef } from '../geo/units';

export interface TemperatureLog {
	depthM: number[];
	temperatureC: number[];
	issues: ImportIssue[];
	/** False when an error means the log is not what the file says. */
	ok: boolean;
}

interface RawPoint {
	depth: number | null;
	temperature: number | null;
	row: number;
}

function issue(
	row: number | null,
	severity: 'error' | 'warning',
	column: string,
	value: string,
	code: string,
	text: string,
	where: string
): ImportIssue {
	const shown = value === '' ? 'the value' : quoteToken(value);
	return {
		row,
		severity,
		column,
		value,
		code,
		message: `${where} ${row}, ${column}: ${shown} ${text}`
	};
}

/** Sorts points by depth, reports and skips missing values, keeps the first of repeated depths. */
export function cleanLog(
	points: RawPoint[],
	depthName: string,
	temperatureName: string,
	where: string,
	prior: ImportIssue[] = []
): TemperatureLog {
	const issues = [...prior];
	const kept = points.filter((p) => {
		if (p.depth === null || p.temperature === null) {
			const name = p.depth === null ? depthName : temperatureName;
			issues.push(
				issue(
					p.row,
					'warning',
					name,
					'',
					'log.missing',
					'is missing (empty or the NULL value); the point is left out.',
					where
				)
			);
			return false;
		}
		return true;
	});
	kept.sort((a, b) => a.depth! - b.depth! || a.row - b.row);
	const depthM: number[] = [];
	const temperatureC: number[] = [];
	let last: RawPoint | null = null;
	for (const p of kept) {
		if (last && p.depth === last.depth) {
			issues.push(
				issue(
					p.row,
					'warning',
					depthName,
					String(p.depth),
					'log.duplicate-depth',
					`m repeats the depth of ${where.toLowerCase()} ${last.row}${p.temperature !== last.temperature ? ` with a different temperature (${p.temperature} vs ${last.temperature} °C)` : ''}; the first is kept.`,
					where
				)
			);
			continue;
		}
		depthM.push(p.depth!);
		temperatureC.push(p.temperature!);
		last = p;
	}
	return { depthM, temperatureC, issues, ok: !issues.some((i) => i.severity === 'error') };
}

const DEPTH_MNEMONICS = ['DEPT', 'DEPTH', 'MD', 'TVD'];
const TEMPERATURE_MNEMONIC = /^(TEMP|TMP|BHT|TEMPERATURE|MTEM|FTEMP|WTEP|TEMP_[A-Z0-9]+)$/i;

/** The curve the reader would take as temperature: by mnemonic, else by a temperature unit. */
export function findTemperatureCurve(las: LasFile, exclude?: string): LasCurve | undefined {
	const candidates = las.curves.filter((c) => c.mnemonic !== exclude);
	return (
		candidates.find((c) => TEMPERATURE_MNEMONIC.test(c.mnemonic)) ??
		candidates.find(
			(c) => c.unit !== '' && recogniseUnit('temperature', c.unit) && !/^(F|FT)$/i.test(c.unit)
		)
	);
}

export interface LasLogOptions {
	/** Mnemonic of the temperature curve; default found by findTemperatureCurve. */
	temperatureCurve?: string;
	/** Mnemonic of the depth curve; default DEPT/DEPTH/MD or the first curve. */
	depthCurve?: string;
	/** Unit ids overriding the curves' own units ('m' | 'ft', 'degC' | 'K' | 'degF'). */
	depthUnit?: string;
	temperatureUnit?: string;
}

function unitFor(
	quantity: 'depth' | 'temperature',
	curve: LasCurve,
	override: string | undefined
): UnitDef {
	const unit = override ? findUnit(quantity, override) : recogniseUnit(quantity, curve.unit);
	if (!unit)
		throw new ImportFormatError(
			`LAS line ${curve.line}: curve ${clipToken(curve.mnemonic)} has unit ${quoteToken(curve.unit)}, not a ${quantity === 'depth' ? 'depth unit (M, FT)' : 'temperature unit (DEGC, DEGF, K)'}; choose the unit.`,
			{ row: curve.line, column: curve.mnemonic, value: curve.unit }
		);
	return unit;
}

/** A temperature log (depth m, °C) from a parsed LAS file; depth in ft and °F/K converted. */
export function temperatureLogFromLas(las: LasFile, options: LasLogOptions = {}): TemperatureLog {
	const byName = (m: string) =>
		las.curves.find((c) => c.mnemonic.toUpperCase() === m.toUpperCase());
	const depth = options.depthCurve
		? byName(options.depthCurve)
		: (DEPTH_MNEMONICS.map(byName).find(Boolean) ?? las.curves[0]);
	if (!depth)
		throw new ImportFormatError(
			`LAS: no curve named ${quoteToken(options.depthCurve ?? '')}; curves: ${las.curves.map((c) => clipToken(c.mnemonic)).join(', ')}.`
		);
	const temperature = options.temperatureCurve
		? byName(options.temperatureCurve)
		: findTemperatureCurve(las, depth.mnemonic);
	if (!temperature)
		throw new ImportFormatError(
			`LAS: ${options.temperatureCurve ? `no curve named ${quoteToken(options.temperatureCurve)}` : 'no temperature curve found (mnemonic TEMP/TMP/BHT or unit DEGC/DEGF/K)'}; curves: ${las.curves.map((c) => `${clipToken(c.mnemonic)} (${clipToken(c.unit) || 'no unit'})`).join(', ')}. Choose one.`
		);
	const depthUnit = unitFor(
		'depth',
		depth,
		options.depthUnit ?? (depth.unit === '' ? unitFromWell(las) : undefined)
	);
	const tUnit = unitFor('temperature', temperature, options.temperatureUnit);
	const points: RawPoint[] = las.dataLines.map((line, i) => {
		const d = depth.values[i];
		const t = temperature.values[i];
		return {
			depth: d === null ? null : depthUnit.toStored(d),
			temperature: t === null ? null : tUnit.toStored(t),
			row: line
		};
	});
	return cleanLog(points, depth.mnemonic, temperature.mnemonic, 'Line');
}

function unitFromWell(las: LasFile): string | undefined {
	const strt = lasItem(las.well, 'STRT');
	return strt ? recogniseUnit('depth', strt.unit)?.id : undefined;
}

export interface CsvLogOptions {
	depthUnit?: string;
	temperatureUnit?: string;
	/** Column indices; default the first two columns. */
	depthColumn?: number;
	temperatureColumn?: number;
}

/** A temperature log from a two-column CSV (any header names; units chosen, default m and °C). */
export function temperatureLogFromCsv(text: string, options: CsvLogOptions = {}): TemperatureLog {
	const table = parseCsv(text);
	const dc = options.depthColumn ?? 0;
	const tc = options.temperatureColumn ?? 1;
	if (table.headers.length < 2 || dc >= table.headers.length || tc >= table.headers.length)
		throw new ImportFormatError(
			`A temperature log needs a depth and a temperature column; the file has ${table.headers.length} column(s).`
		);
	const du = findUnit('depth', options.depthUnit ?? 'm');
	const tu = findUnit('temperature', options.temperatureUnit ?? 'degC');
	if (!du || !tu) throw new RangeError('unknown depth or temperature unit');
	const errors: ImportIssue[] = [];
	const read = (cell: Cell, column: string, row: number, unit: UnitDef): number | null => {
		const r = parseNumberCell(cell, table.decimalComma);
		if (!r.ok) {
			errors.push(
				issue(
					row,
					'error',
					`column "${clipToken(column)}"`,
					cellText(cell),
					'number.invalid',
					`${r.error}.`,
					'Row'
				)
			);
			return null;
		}
		return r.value === null ? null : unit.toStored(r.value);
	};
	const points: RawPoint[] = [];
	table.rows.forEach((cells, i) => {
		const row = table.sourceRowNumbers[i];
		const before = errors.length;
		const depth = read(cells[dc], table.headers[dc], row, du);
		const temperature = read(cells[tc], table.headers[tc], row, tu);
		if (errors.length === before) points.push({ depth, temperature, row });
	});
	return cleanLog(
		points,
		`column "${clipToken(table.headers[dc])}"`,
		`column "${clipToken(table.headers[tc])}"`,
		'Row',
		errors
	);
}
