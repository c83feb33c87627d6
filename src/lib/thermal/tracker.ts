// Exact order statistics of a column that changes a little from one depth to the next (Monte Carlo
// bands). It keeps the samples sorted: each update re-reads the values in the previous order and
// repairs it by insertion sort, which costs O(n + number of samples that swapped places). Between
// neighbouring depths few sample geotherms cross, so that is close to one predictable pass over the
// column — cheaper than counting against percentile brackets or selecting from scratch, both of
// which branch unpredictably on every sample. When many samples swap at once (first depth, a
// sudden reshuffle) the repair gives up after a move budget and the order is rebuilt by a full sort,
// so the worst case stays O(n log n) per update. Exact in every case: the array is really sorted.
// Percentile definition: type 7 (see percentile.ts).

export class SampleOrder {
	private readonly n: number;
	/** Sample indices in ascending order of their value at the last update. */
	readonly order: Int32Array;
	/** The values at the last update, ascending (sorted[i] = column[order[i]]). */
	readonly sorted: Float64Array;
	private started = false;
	// Insertion moves allowed per update before a full sort is cheaper: a comparator sort makes about
	// n·log2(n) calls, each several times dearer than one move of the repair loop.
	private readonly moveBudget: number;
	/** How many updates needed a full sort (diagnostic; the tests check the repair path is used). */
	fullSorts = 0;

	constructor(n: number) {
		this.n = n;
		this.order = Int32Array.from({ length: n }, (_, i) => i);
		this.sorted = new Float64Array(n);
		this.moveBudget = 4 * n * Math.ceil(Math.log2(n + 1));
	}

	/** Sorts the samples by `column` (length n, no NaN), starting from the previous order. */
	update(column: Float64Array): void {
		if (!this.started) {
			this.started = true;
			this.fullSort(column);
			return;
		}
		const n = this.n;
		const order = this.order;
		const v = this.sorted;
		for (let i = 0; i < n; i++) v[i] = column[order[i]];
		let budget = this.moveBudget;
		for (let i = 1; i < n; i++) {
			const x = v[i];
			if (!(v[i - 1] > x)) continue; // the common case: still in order
			const id = order[i];
			let j = i;
			do {
				v[j] = v[j - 1];
				order[j] = order[j - 1];
				j--;
			} while (j > 0 && v[j - 1] > x);
			v[j] = x;
			order[j] = id;
			budget -= i - j;
			if (budget < 0) {
				this.fullSort(column);
				return;
			}
		}
	}

	/** Type-7 percentile of the last column: order statistics k and k + 1 at h = (n − 1)p. */
	ranks(p: number): [lower: number, upper: number, weight: number] {
		const h = (this.n - 1) * p;
		const k = Math.floor(h);
		return [this.sorted[k], this.sorted[Math.min(k + 1, this.n - 1)], h - k];
	}

	private fullSort(column: Float64Array): void {
		this.fullSorts++;
		const order = this.order;
		// Comparisons, not subtraction, so ±Infinity values still sort.
		order.sort((a, b) => (column[a] < column[b] ? -1 : column[a] > column[b] ? 1 : 0));
		for (let i = 0; i < this.n; i++) this.sorted[i] = column[order[i]];
	}
}
