// Exact percentiles of a column that changes a little from one depth to the next (Monte Carlo
// bands). For each percentile it remembers two samples that bracketed the wanted rank at the
// previous depth; one pass counts how many values lie below the lower one and collects the few
// lying between the two, and sorting that small window gives the exact order statistics whenever
// the counts show the wanted ranks are inside it. Otherwise (first depth, a sudden reshuffle) it
// finds new brackets by selection. Exact in every case; fast when ranks drift slowly.
// Percentile definition: type 7 (see percentile.ts).
//
// Why the complexity: large bands (10,000 samples at 1,001 depths, the Monte Carlo benchmark's
// case, against a 300 ms target) need it. The site panel's band (2,000 samples, 141 depths) would
// cost only about 14 ms more with a plain sort per depth; if large bands are never drawn, replace
// this file with that sort.

import { selectInPlace } from './percentile';

// Ranks kept on each side of the wanted ones: starts small, doubles when the ranks drifted out of
// the window, and shrinks back slowly while they stay inside.
const MIN_HALF_WIDTH = 16;

export class PercentileTracker {
	private readonly n: number;
	private readonly fractions: readonly number[];
	private readonly lowId: Int32Array;
	private readonly highId: Int32Array;
	private readonly windowValues: Float64Array[];
	private readonly windowIds: Int32Array[];
	private readonly scratch: Float64Array;
	private readonly halfWidth: Float64Array;
	private readonly maxWindow: number;
	/** How many times brackets had to be found by selection (diagnostic). */
	reseeds = 0;

	constructor(n: number, fractions: readonly number[]) {
		this.n = n;
		this.fractions = fractions;
		this.lowId = new Int32Array(fractions.length).fill(-1);
		this.highId = new Int32Array(fractions.length).fill(-1);
		// A window of more than a quarter of the samples means the brackets are stale.
		this.maxWindow = Math.max(64, Math.ceil(n / 4));
		this.windowValues = fractions.map(() => new Float64Array(this.maxWindow));
		this.windowIds = fractions.map(() => new Int32Array(this.maxWindow));
		this.scratch = new Float64Array(n);
		this.halfWidth = new Float64Array(fractions.length).fill(MIN_HALF_WIDTH);
	}

	/**
	 * Order statistics k and k + 1 (k = floor((n − 1)p)) of `column` for every fraction p, as
	 * pairs [lower, upper, weight]: the type-7 value is lower + weight·(upper − lower).
	 */
	update(column: Float64Array): [number, number, number][] {
		const m = this.fractions.length;
		if (this.lowId[0] < 0) for (let f = 0; f < m; f++) this.reseed(column, f);
		const ok = this.scanAll(column);
		const out: [number, number, number][] = [];
		for (let f = 0; f < m; f++) {
			let result = ok[f] ? this.finish(f) : null;
			if (!result) {
				this.halfWidth[f] = Math.min(this.n, 2 * this.halfWidth[f]);
				this.reseed(column, f);
				result = (this.scanOne(column, f) ? this.finish(f) : null) ?? this.bySelection(column, f);
			}
			out.push(result);
		}
		return out;
	}

	// Per fraction: the bracket values, the count below, and the window size of the last scan.
	private readonly lo = new Float64Array(8);
	private readonly hi = new Float64Array(8);
	private readonly below = new Int32Array(8);
	private readonly count = new Int32Array(8);

	private brackets(column: Float64Array, f: number): void {
		let lo = column[this.lowId[f]];
		let hi = column[this.highId[f]];
		if (lo > hi) [lo, hi] = [hi, lo];
		this.lo[f] = lo;
		this.hi[f] = hi;
		this.below[f] = 0;
		this.count[f] = 0;
	}

	/** One pass over the column for every fraction at once (the common case). */
	private scanAll(column: Float64Array): boolean[] {
		const m = this.fractions.length;
		if (m !== 3) return this.fractions.map((_, f) => this.scanOne(column, f));
		// Unrolled for the three band percentiles: this loop is the hot path of monteCarloGeotherm.
		for (let f = 0; f < 3; f++) this.brackets(column, f);
		const [lo0, lo1, lo2] = this.lo;
		const [hi0, hi1, hi2] = this.hi;
		const [v0, v1, v2] = this.windowValues;
		const [i0, i1, i2] = this.windowIds;
		let b0 = 0;
		let b1 = 0;
		let b2 = 0;
		let c0 = 0;
		let c1 = 0;
		let c2 = 0;
		for (let s = 0; s < this.n; s++) {
			const x = column[s];
			if (x < lo0) b0++;
			else if (x <= hi0) {
				if (c0 < this.maxWindow) {
					v0[c0] = x;
					i0[c0] = s;
				}
				c0++;
			}
			if (x < lo1) b1++;
			else if (x <= hi1) {
				if (c1 < this.maxWindow) {
					v1[c1] = x;
					i1[c1] = s;
				}
				c1++;
			}
			if (x < lo2) b2++;
			else if (x <= hi2) {
				if (c2 < this.maxWindow) {
					v2[c2] = x;
					i2[c2] = s;
				}
				c2++;
			}
		}
		this.below[0] = b0;
		this.below[1] = b1;
		this.below[2] = b2;
		this.count[0] = c0;
		this.count[1] = c1;
		this.count[2] = c2;
		return [0, 1, 2].map((f) => this.count[f] <= this.maxWindow);
	}

	private scanOne(column: Float64Array, f: number): boolean {
		this.brackets(column, f);
		const lo = this.lo[f];
		const hi = this.hi[f];
		const values = this.windowValues[f];
		const ids = this.windowIds[f];
		let below = 0;
		let count = 0;
		for (let s = 0; s < this.n; s++) {
			const x = column[s];
			if (x < lo) below++;
			else if (x <= hi) {
				if (count === this.maxWindow) return false;
				values[count] = x;
				ids[count] = s;
				count++;
			}
		}
		this.below[f] = below;
		this.count[f] = count;
		return true;
	}

	/** Reads the order statistics from the scanned window, or null if they are outside it. */
	private finish(f: number): [number, number, number] | null {
		const below = this.below[f];
		const count = this.count[f];
		const [k, k1, weight] = this.ranks(f);
		if (k < below || k1 > below + count - 1) return null;
		const hw = Math.round(this.halfWidth[f]);
		this.halfWidth[f] = Math.max(MIN_HALF_WIDTH, 0.95 * this.halfWidth[f]);
		// Selection inside the small window: next lower bracket, the two order statistics, upper bracket.
		const values = this.windowValues[f];
		const ids = this.windowIds[f];
		const w = this.scratch;
		w.set(values.subarray(0, count));
		const rl = Math.max(0, k - hw - below);
		const r = k - below;
		const r1 = k1 - below;
		const rh = Math.min(count - 1, k1 + hw - below);
		selectInPlace(w, rl, 0, count - 1);
		const vl = w[rl];
		selectInPlace(w, r, rl, count - 1);
		const a = w[r];
		selectInPlace(w, r1, r, count - 1);
		const b = w[r1];
		selectInPlace(w, rh, r1, count - 1);
		const vh = w[rh];
		this.lowId[f] = ids[indexOfValue(values, vl, count)];
		this.highId[f] = ids[indexOfValue(values, vh, count)];
		return [a, b, weight];
	}

	private ranks(f: number): [number, number, number] {
		const h = (this.n - 1) * this.fractions[f];
		const k = Math.floor(h);
		return [k, Math.min(k + 1, this.n - 1), h - k];
	}

	private reseed(column: Float64Array, f: number): void {
		this.reseeds++;
		const [k, k1] = this.ranks(f);
		const s = this.scratch;
		s.set(column);
		const hw = Math.round(this.halfWidth[f]);
		const rLow = Math.max(0, k - hw);
		const rHigh = Math.min(this.n - 1, k1 + hw);
		selectInPlace(s, rLow);
		const vLow = s[rLow];
		selectInPlace(s, rHigh, rLow);
		const vHigh = s[rHigh];
		this.lowId[f] = column.indexOf(vLow);
		this.highId[f] = column.indexOf(vHigh);
	}

	private bySelection(column: Float64Array, f: number): [number, number, number] {
		const [k, k1, weight] = this.ranks(f);
		const s = this.scratch;
		s.set(column);
		selectInPlace(s, k);
		let next = s[k];
		if (k1 > k) {
			next = Infinity;
			for (let i = k + 1; i < this.n; i++) if (s[i] < next) next = s[i];
		}
		return [s[k], next, weight];
	}
}

function indexOfValue(values: Float64Array, v: number, count: number): number {
	for (let i = 0; i < count; i++) if (values[i] === v) return i;
	return 0; // unreachable: v was taken from these values
}
