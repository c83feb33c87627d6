// The contributor's own fixes in the preview: a corrected cell, or a row left out on purpose.
// Applied to the parsed table before validation, so the preview shows exactly what is stored.

import type { Cell, ParsedTable } from './types';

/** A new value for one cell: the row number the user sees and the column's index. */
export interface CellCorrection {
	row: number;
	column: number;
	value: string;
}

export interface RowEdits {
	corrections: CellCorrection[];
	/** Row numbers (as the user sees them) not to import. */
	excluded: number[];
}

export const NO_EDITS: RowEdits = { corrections: [], excluded: [] };

/** A correction as it is recorded with the batch: with the column's name and the value it replaced. */
export interface AppliedCorrection extends CellCorrection {
	header: string;
	was: string | number | boolean | null;
}

export interface EditedTable {
	table: ParsedTable;
	corrections: AppliedCorrection[];
	/** Excluded row numbers that exist in the file, ascending. */
	excluded: number[];
	/** Edits naming a row or column the file does not have (a stale page): refused by the caller. */
	unknown: string[];
}

const wire = (c: Cell): string | number | boolean | null =>
	c instanceof Date ? c.toISOString() : (c ?? null);

/** The table with corrections applied and excluded rows removed; the input is not changed. */
export function applyEdits(table: ParsedTable, edits: RowEdits): EditedTable {
	const indexOfRow = new Map<number, number>();
	table.sourceRowNumbers.forEach((r, i) => indexOfRow.set(r, i));
	const unknown: string[] = [];
	const excludedSet = new Set<number>();
	for (const r of edits.excluded) {
		if (indexOfRow.has(r)) excludedSet.add(r);
		else unknown.push(`row ${r} to exclude is not in the file`);
	}
	const rows = table.rows.slice();
	const corrections: AppliedCorrection[] = [];
	for (const c of edits.corrections) {
		const i = indexOfRow.get(c.row);
		if (i === undefined || c.column < 0 || c.column >= table.headers.length) {
			unknown.push(`row ${c.row}, column ${c.column + 1} to correct is not in the file`);
			continue;
		}
		if (excludedSet.has(c.row)) continue;
		if (rows[i] === table.rows[i]) rows[i] = table.rows[i].slice();
		corrections.push({ ...c, header: table.headers[c.column], was: wire(table.rows[i][c.column]) });
		rows[i][c.column] = c.value;
	}
	const keep: number[] = [];
	for (let i = 0; i < rows.length; i++)
		if (!excludedSet.has(table.sourceRowNumbers[i])) keep.push(i);
	return {
		table: {
			...table,
			rows: keep.map((i) => rows[i]),
			sourceRowNumbers: keep.map((i) => table.sourceRowNumbers[i])
		},
		corrections,
		excluded: [...excludedSet].sort((a, b) => a - b),
		unknown
	};
}
