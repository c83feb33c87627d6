import type { GridPlan } from '$lib/grids/plan';
import type { Grid } from '../db/schema';

/** Float32 cells of a finished grid (stored little-endian, row-major, south row first). */
export function cellsOf(buf: Buffer | null): Float32Array | null {
	if (!buf) return null;
	const copy = new Uint8Array(buf.byteLength);
	copy.set(buf);
	return new Float32Array(copy.buffer);
}

export function planOf(row: Grid): GridPlan {
	return row.plan as unknown as GridPlan;
}
