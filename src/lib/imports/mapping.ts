// Which uploaded column feeds which import field, in which unit; and a guess from header names.

import { FIELDS, field, type FieldKey } from './fields';
import type { ImportIssue } from './types';
import { recogniseUnit, STORED_UNIT, UNITS, type Quantity } from '../geo/units';

/** One mapped column: its index in ParsedTable.headers and, for quantities, the unit id. */
export interface ColumnChoice {
	column: number;
	unit?: string;
}

export type ColumnMapping = Partial<Record<FieldKey, ColumnChoice>>;

/** Lower-case words of a header: symbols to words, everything else non-alphanumeric to spaces. */
export function headerWords(text: string): string[] {
	return text
		.toLowerCase()
		.replace(/[μµ]/g, 'u')
		.replace(/σ/g, ' sigma ')
		.replace(/[λκ]/g, ' lambda ')
		.replace(/±|\+\/-|\+-/g, ' plusminus ')
		.replace(/²/g, '2')
		.replace(/³/g, '3')
		.replace(/°/g, 'deg')
		.replace(/[^a-z0-9]+/g, ' ')
		.trim()
		.split(' ')
		.filter(Boolean);
}

const synonymWords = new Map<FieldKey, string[][]>(
	FIELDS.map((f) => [f.key, f.synonyms.map((s) => headerWords(s))])
);

const unitWords = new Map<Quantity, { id: string; words: string }[]>(
	(Object.keys(UNITS) as Quantity[]).map((q) => [
		q,
		UNITS[q].flatMap((u) =>
			[u.id, u.label, ...u.aliases].map((a) => ({ id: u.id, words: headerWords(a).join(' ') }))
		)
	])
);

function unitFromWords(quantity: Quantity, words: string[]): string | undefined {
	const text = words.join(' ');
	return unitWords.get(quantity)?.find((u) => u.words === text)?.id;
}

function sameWords(a: string[], b: string[]): boolean {
	return a.length === b.length && a.every((w, i) => w === b[i]);
}

/** Same words, or the same letters once punctuation is gone: `dT/dz` is the synonym `dtdz`. */
function sameName(a: string[], b: string[]): boolean {
	return sameWords(a, b) || (a.length > 1 && a.join('') === b.join(''));
}

/**
 * Words a header may add after a field without a unit choice (coordinates, codes): `Northing_m`,
 * `Latitude (deg)`, `lon_dd`. They say how the value is written, not what it is.
 */
const PLAIN_SUFFIXES = new Set([
	'm',
	'metres',
	'meters',
	'deg',
	'degrees',
	'dd',
	'decimal degrees',
	'wgs84',
	'wgs 84'
]);

/** Matches one header against one field: null, or the unit found in the header (if any). */
function matchHeader(header: string, key: FieldKey): { unit?: string } | null {
	const def = field(key);
	const bracket = /^(.*?)[([{]\s*([^)\]}]*)\s*[)\]}]\s*$/.exec(header.trim());
	const nameText = bracket ? bracket[1] : header;
	const bracketUnit =
		bracket && def.quantity ? recogniseUnit(def.quantity, bracket[2])?.id : undefined;
	const words = headerWords(nameText);
	for (const syn of synonymWords.get(key) ?? []) {
		if (sameName(words, syn)) return { unit: bracketUnit };
		if (words.length <= syn.length) continue;
		// The name is the synonym followed by a unit: `Q_mW_m2`, `dT/dz K/km`, `HF mW/m²`.
		for (let cut = syn.length; cut < words.length; cut++) {
			if (!sameName(words.slice(0, cut), syn)) continue;
			const rest = words.slice(cut);
			if (!def.quantity) {
				if (PLAIN_SUFFIXES.has(rest.join(' '))) return {};
				continue;
			}
			const unit = unitFromWords(def.quantity, rest);
			if (unit) return { unit };
		}
	}
	return null;
}

/**
 * Guesses a mapping from header names (case, spacing, punctuation and unit suffix insensitive):
 * each field gets the first unclaimed matching header; units come from the header when it names
 * one, a 1-σ column without a unit takes its value column's unit, otherwise the stored unit.
 */
export function suggestMapping(headers: readonly string[]): ColumnMapping {
	const mapping: ColumnMapping = {};
	const taken = new Set<number>();
	for (const def of FIELDS) {
		for (let c = 0; c < headers.length; c++) {
			if (taken.has(c)) continue;
			const m = matchHeader(headers[c], def.key);
			if (!m) continue;
			mapping[def.key] = def.quantity ? { column: c, unit: m.unit ?? '' } : { column: c };
			taken.add(c);
			break;
		}
	}
	const sigmaOf: [FieldKey, FieldKey][] = [
		['heatFlowSigma', 'heatFlow'],
		['gradientSigma', 'gradient'],
		['conductivitySigma', 'conductivity'],
		['heatProductionSigma', 'heatProduction']
	];
	for (const [s, v] of sigmaOf) {
		const sigma = mapping[s];
		if (sigma && sigma.unit === '') sigma.unit = mapping[v]?.unit || undefined;
	}
	for (const def of FIELDS) {
		const choice = mapping[def.key];
		if (choice && def.quantity && !choice.unit) choice.unit = STORED_UNIT[def.quantity];
	}
	return mapping;
}

/** Whole-file problems with a mapping (no code, no coordinates, bad unit, one column twice). */
export function checkMapping(mapping: ColumnMapping, headers: readonly string[]): ImportIssue[] {
	const issues: ImportIssue[] = [];
	const fileError = (column: string, value: string, code: string, message: string) =>
		issues.push({ row: null, severity: 'error', column, value, code, message });
	if (!mapping.code)
		fileError(
			'Site code',
			'',
			'mapping.no-code',
			'Map a column to "Site code": every site needs one.'
		);
	const projected = mapping.x && mapping.y;
	const geographic = mapping.lon && mapping.lat;
	if (!projected && !geographic)
		fileError(
			'Coordinates',
			'',
			'mapping.no-coordinates',
			'Map both "Easting / x" and "Northing / y", or both "Longitude" and "Latitude".'
		);
	if ((mapping.x && !mapping.y) || (!mapping.x && mapping.y))
		fileError(
			'Coordinates',
			'',
			'mapping.half-xy',
			'Map both "Easting / x" and "Northing / y", not only one.'
		);
	if ((mapping.lon && !mapping.lat) || (!mapping.lon && mapping.lat))
		fileError(
			'Coordinates',
			'',
			'mapping.half-lonlat',
			'Map both "Longitude" and "Latitude", not only one.'
		);
	const used = new Map<number, FieldKey>();
	for (const def of FIELDS) {
		const choice = mapping[def.key];
		if (!choice) continue;
		const header = headers[choice.column];
		if (header === undefined) {
			fileError(
				def.label,
				String(choice.column),
				'mapping.bad-column',
				`"${def.label}" is mapped to column ${choice.column + 1}, which the file does not have.`
			);
			continue;
		}
		const other = used.get(choice.column);
		if (other)
			fileError(
				header,
				header,
				'mapping.column-twice',
				`Column "${header}" is mapped to both "${field(other).label}" and "${def.label}".`
			);
		used.set(choice.column, def.key);
		if (def.quantity && !UNITS[def.quantity].some((u) => u.id === choice.unit))
			fileError(
				header,
				choice.unit ?? '',
				'mapping.bad-unit',
				`Column "${header}" ("${def.label}") has unit ${JSON.stringify(choice.unit ?? '')}; choose one of ${UNITS[def.quantity].map((u) => u.label).join(', ')}.`
			);
	}
	return issues;
}

/** Headers no field is mapped to; the preview lists them so nothing is dropped unseen. */
export function unmappedColumns(mapping: ColumnMapping, headers: readonly string[]): string[] {
	const used = new Set(Object.values(mapping).map((c) => c?.column));
	return headers.filter((_, i) => !used.has(i));
}
