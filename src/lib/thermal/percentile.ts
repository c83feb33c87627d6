// Percentiles by selection instead of sorting: O(n) per percentile, which keeps a 10,000-sample
// band over a thousand depths fast. Definition: linear interpolation between order statistics at
// h = (n − 1)·p (Hyndman & Fan 1996, type 7; the default of most statistics packages).

/** Rearranges a[lo..hi] so a[k] is the k-th smallest and everything left/right is <=/>= it (Hoare). */
export function selectInPlace(a: Float64Array, k: number, lo = 0, hi = a.length - 1): void {
	while (hi > lo) {
		// Median of three as pivot value guards against already ordered columns.
		const x = median3(a[lo], a[k], a[hi]);
		let i = lo;
		let j = hi;
		do {
			while (a[i] < x) i++;
			while (x < a[j]) j--;
			if (i <= j) {
				const tmp = a[i];
				a[i] = a[j];
				a[j] = tmp;
				i++;
				j--;
			}
		} while (i <= j);
		if (j < k) lo = i;
		if (k < i) hi = j;
	}
}

function median3(a: number, b: number, c: number): number {
	if (a < b) return b < c ? b : a < c ? c : a;
	return a < c ? a : b < c ? c : b;
}

/**
 * Type-7 percentiles (fractions in [0, 1], ascending) of the values in `a`, which is reordered.
 * NaN must not occur; +Infinity is allowed and propagates.
 */
export function percentilesInPlace(a: Float64Array, fractions: readonly number[]): number[] {
	const n = a.length;
	const out: number[] = [];
	let lo = 0;
	for (const p of fractions) {
		const h = (n - 1) * p;
		const k = Math.floor(h);
		selectInPlace(a, k, lo, n - 1);
		let value = a[k];
		if (h > k) {
			let next = Infinity; // the (k+1)-th smallest is the minimum of the right part
			for (let i = k + 1; i < n; i++) if (a[i] < next) next = a[i];
			value = next === value ? value : value + (h - k) * (next - value);
		}
		out.push(value);
		lo = k; // later (larger) percentiles lie in a[k..n-1]
	}
	return out;
}
