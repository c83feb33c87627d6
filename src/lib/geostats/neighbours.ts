import KDBush from 'kdbush';

/*
 * Neighbour search on kdbush's static k-d tree (Agafonkin; sorted in place, flat arrays).
 * kdbush 4 offers box (`range`) and radius (`within`) queries but no k-nearest query
 * (that lives in geokdbush, which is for lon/lat and not installed), so `nearest` below is
 * our own k-nearest search over kdbush's tree layout: node [l, r] splits at m = (l + r) >> 1
 * on an axis alternating x, y, x, …, and holds at most `nodeSize` points once a leaf.
 * It is the classic branch-and-bound search (Friedman, Bentley & Finkel 1977): visit the
 * near half first and skip a far half whose splitting line is farther than the current
 * k-th best distance.
 */

const NODE_SIZE = 16;

/** Spatial index over sample positions (projected metres) with k-nearest and radius queries. */
export class NeighbourIndex {
	readonly size: number;
	private readonly tree: KDBush;
	private readonly ids: Uint16Array | Uint32Array;
	private readonly coords: ArrayLike<number>;
	private stack = new Float64Array(4 * 128);
	private heapD = new Float64Array(0);
	private heapI = new Int32Array(0);

	constructor(xs: ArrayLike<number>, ys: ArrayLike<number>) {
		this.size = xs.length;
		this.tree = new KDBush(Math.max(xs.length, 1), NODE_SIZE, Float64Array);
		if (xs.length === 0) this.tree.add(Infinity, Infinity);
		for (let k = 0; k < xs.length; k++) this.tree.add(xs[k], ys[k]);
		this.tree.finish();
		this.ids = this.tree.ids;
		this.coords = this.tree.coords;
	}

	/**
	 * The point indices in the tree's storage order: a k-d sort, so points that follow each
	 * other are mostly close together (visiting points in this order keeps neighbour sets alike).
	 */
	spatialOrder(): Int32Array {
		return this.size === 0 ? new Int32Array(0) : Int32Array.from(this.ids);
	}

	/** Indices of all points within radiusM (inclusive) of (x, y). */
	within(x: number, y: number, radiusM: number): number[] {
		if (this.size === 0) return [];
		return this.tree.within(x, y, radiusM);
	}

	/**
	 * Writes the indices and squared distances (m²) of the k nearest points within
	 * maxDistM of (x, y) into outIdx / outD2, nearest first; returns how many were found.
	 */
	nearest(
		x: number,
		y: number,
		k: number,
		maxDistM: number,
		outIdx: Int32Array,
		outD2: Float64Array
	): number {
		if (this.size === 0 || k <= 0) return 0;
		if (this.heapD.length < k) {
			this.heapD = new Float64Array(k);
			this.heapI = new Int32Array(k);
		}
		const hd = this.heapD;
		const hi = this.heapI;
		const ids = this.ids;
		const coords = this.coords;
		let count = 0;
		// Max-heap of the best k: hd[0] is the current k-th best (worst kept) distance².
		let worst = maxDistM === Infinity ? Infinity : maxDistM * maxDistM;
		const limit = worst;
		let stack = this.stack;
		// Frame: left, right, axis, squared distance from the query to this half's split line.
		stack[0] = 0;
		stack[1] = ids.length - 1;
		stack[2] = 0;
		stack[3] = 0;
		let sp = 4;
		while (sp > 0) {
			const planeD2 = stack[--sp];
			const axis = stack[--sp];
			const right = stack[--sp];
			const left = stack[--sp];
			if (planeD2 > worst || (count === k && planeD2 === worst)) continue;
			if (right - left <= NODE_SIZE) {
				for (let p = left; p <= right; p++) {
					const ddx = coords[2 * p] - x;
					const ddy = coords[2 * p + 1] - y;
					const d2 = ddx * ddx + ddy * ddy;
					if (d2 <= limit && (count < k || d2 < worst)) {
						if (count < k) {
							heapPush(hd, hi, count++, d2, ids[p]);
							if (count === k) worst = hd[0];
						} else {
							siftDown(hd, hi, k, d2, ids[p]);
							worst = hd[0];
						}
					}
				}
				continue;
			}
			const m = (left + right) >> 1;
			const mx = coords[2 * m];
			const my = coords[2 * m + 1];
			const ddx = mx - x;
			const ddy = my - y;
			const d2 = ddx * ddx + ddy * ddy;
			if (d2 <= limit && (count < k || d2 < worst)) {
				if (count < k) {
					heapPush(hd, hi, count++, d2, ids[m]);
					if (count === k) worst = hd[0];
				} else {
					siftDown(hd, hi, k, d2, ids[m]);
					worst = hd[0];
				}
			}
			const delta = axis === 0 ? x - mx : y - my;
			const far2 = Math.max(planeD2, delta * delta);
			if (sp + 8 > stack.length) {
				const bigger = new Float64Array(stack.length * 2);
				bigger.set(stack);
				stack = this.stack = bigger;
			}
			// Push the far half first so the near half is searched first.
			if (delta <= 0) {
				// query is left of / below the split: near = left half
				pushFrame(stack, sp, m + 1, right, 1 - axis, far2);
				pushFrame(stack, sp + 4, left, m - 1, 1 - axis, planeD2);
			} else {
				pushFrame(stack, sp, left, m - 1, 1 - axis, far2);
				pushFrame(stack, sp + 4, m + 1, right, 1 - axis, planeD2);
			}
			sp += 8;
		}

		// Heap-sort the kept points so the output is nearest first.
		for (let n = count; n > 0; n--) {
			outIdx[n - 1] = hi[0];
			outD2[n - 1] = hd[0];
			const lastD = hd[n - 1];
			const lastI = hi[n - 1];
			if (n > 1) siftDown(hd, hi, n - 1, lastD, lastI);
		}
		return count;
	}
}

function pushFrame(
	stack: Float64Array,
	at: number,
	left: number,
	right: number,
	axis: number,
	planeD2: number
): void {
	stack[at] = left;
	stack[at + 1] = right;
	stack[at + 2] = axis;
	stack[at + 3] = planeD2;
}

/** Adds (d2, id) as item number `at` of a max-heap and sifts it up. */
function heapPush(hd: Float64Array, hi: Int32Array, at: number, d2: number, id: number): void {
	let c = at;
	while (c > 0) {
		const p = (c - 1) >> 1;
		if (hd[p] >= d2) break;
		hd[c] = hd[p];
		hi[c] = hi[p];
		c = p;
	}
	hd[c] = d2;
	hi[c] = id;
}

/** Replaces the heap root with (d2, id) and restores the max-heap property over n items. */
function siftDown(hd: Float64Array, hi: Int32Array, n: number, d2: number, id: number): void {
	let c = 0;
	for (;;) {
		let child = 2 * c + 1;
		if (child >= n) break;
		if (child + 1 < n && hd[child + 1] > hd[child]) child++;
		if (hd[child] <= d2) break;
		hd[c] = hd[child];
		hi[c] = hi[child];
		c = child;
	}
	hd[c] = d2;
	hi[c] = id;
}
