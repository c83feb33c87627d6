// Conductivity samples CSV (top, bottom, conductivity, optional 1-σ) → ConductivityInterval[]
// for heatFlowFromLog. Columns are found from the headers like the site table's.

import type { ConductivityInterval } from '../thermal/intervals';
import { cellText, parseNumberCell } from './cells';
import { parseCsv } from './csv';
import { suggestMapping, type ColumnMapping } from './mapping';
import { ImportFormatError, type ImportIssue } from './types';
import { findUnit } from '../geo/units';

export interface ConductivitySamples {
	intervals: ConductivityInterval[];
	issues: ImportIssue[];
	ok: boolean;
}

export interface ConductivitySampleOptions {
	/** Override the guessed columns (fields topDepth, bottomDepth, conductivity, conductivitySigma). */
	mapping?: ColumnMapping;
}

/** Parses a conductivity-samples CSV; depths in m or ft and k in W/m/K or mcal/cm/s/°C (from headers). */
export function parseConductivitySamples(
	text: string,
	options: ConductivitySampleOptions = {}
): ConductivitySamples {
	const table = parseCsv(text);
	const guess = suggestMapping(table.headers);
	const m: ColumnMapping = options.mapping ?? {
		topDepth: guess.topDepth ?? { column: 0, unit: 'm' },
		bottomDepth: guess.bottomDepth ?? { column: 1, unit: 'm' },
		conductivity: guess.conductivity ?? { column: 2, unit: 'W/m/K' },
		conductivitySigma:
			guess.conductivitySigma ??
			(table.headers.length > 3
				? { column: 3, unit: guess.conductivity?.unit ?? 'W/m/K' }
				: undefined)
	};
	if (!m.topDepth || !m.bottomDepth || !m.conductivity || table.headers.length < 3)
		throw new ImportFormatError(
			'A conductivity-samples file needs top depth, bottom depth and conductivity columns.'
		);
	const issues: ImportIssue[] = [];
	const intervals: ConductivityInterval[] = [];
	table.rows.forEach((cells, i) => {
		const row = table.sourceRowNumbers[i];
		const get = (
			key: 'topDepth' | 'bottomDepth' | 'conductivity' | 'conductivitySigma',
			quantity: 'depth' | 'conductivity',
			required: boolean
		): number | null | undefined => {
			const choice = m[key];
			if (!choice) return null;
			const header = table.headers[choice.column];
			const cell = cells[choice.column];
			const r = parseNumberCell(cell, table.decimalComma);
			const fail = (text: string) => {
				const v = cellText(cell);
				issues.push({
					row,
					severity: 'error',
					column: header,
					value: v,
					code: 'number.invalid',
					message: `Row ${row}, column "${header}": ${v === '' ? 'empty' : JSON.stringify(v)} ${text}`
				});
				return undefined;
			};
			if (!r.ok) return fail(`${r.error}.`);
			if (r.value === null) return required ? fail('is missing.') : null;
			return findUnit(quantity, choice.unit ?? '')!.toStored(r.value);
		};
		const topM = get('topDepth', 'depth', true);
		const bottomM = get('bottomDepth', 'depth', true);
		const k = get('conductivity', 'conductivity', true);
		const sigma = get('conductivitySigma', 'conductivity', false);
		if (topM == null || bottomM == null || k == null || sigma === undefined) return;
		const problem = (column: string, value: string, text: string) =>
			issues.push({
				row,
				severity: 'error',
				column,
				value,
				code: 'sample.invalid',
				message: `Row ${row}, column "${column}": ${JSON.stringify(value)} ${text}`
			});
		if (bottomM <= topM)
			return problem(
				table.headers[m.bottomDepth!.column],
				cellText(cells[m.bottomDepth!.column]),
				`is not below the top depth (${topM} m).`
			);
		if (k <= 0)
			return problem(
				table.headers[m.conductivity!.column],
				cellText(cells[m.conductivity!.column]),
				'is ≤ 0; conductivity must be positive.'
			);
		if (sigma !== null && sigma < 0)
			return problem(
				table.headers[m.conductivitySigma!.column],
				cellText(cells[m.conductivitySigma!.column]),
				'is negative; a standard deviation must be ≥ 0.'
			);
		intervals.push(
			sigma === null
				? { topM, bottomM, conductivityWmK: k }
				: { topM, bottomM, conductivityWmK: k, sigmaWmK: sigma }
		);
	});
	intervals.sort((a, b) => a.topM - b.topM);
	return { intervals, issues, ok: issues.length === 0 };
}
