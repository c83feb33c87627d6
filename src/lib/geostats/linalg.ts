/*
 * Small dense linear algebra, written here rather than imported because the kriging
 * systems are tiny (≤ a few dozen unknowns), solved tens of thousands of times per grid,
 * and must run allocation-free in a browser or worker; no installed package offers that.
 * Matrices are row-major Float64Arrays: a[r * n + c].
 */

/** Pivots smaller than this fraction of the largest matrix entry mark the system as singular. */
export const SINGULAR_TOLERANCE = 1e-13;

/**
 * In-place LU factorisation with partial (row) pivoting, PA = LU (Golub & Van Loan 2013,
 * Alg. 3.4.1). The kriging matrix bordered by 1s is symmetric but indefinite, so plain
 * Cholesky does not apply; row pivoting also copes with its zero corner entry.
 * Returns false when a pivot is below SINGULAR_TOLERANCE × max|a| (e.g. duplicate rows).
 */
export function luFactor(a: Float64Array, n: number, piv: Int32Array): boolean {
	let scale = 0;
	for (let k = 0; k < n * n; k++) {
		const v = Math.abs(a[k]);
		if (v > scale) scale = v;
	}
	if (!(scale > 0) || !Number.isFinite(scale)) return false;
	const tol = SINGULAR_TOLERANCE * scale;
	for (let k = 0; k < n; k++) {
		let p = k;
		let best = Math.abs(a[k * n + k]);
		for (let r = k + 1; r < n; r++) {
			const v = Math.abs(a[r * n + k]);
			if (v > best) {
				best = v;
				p = r;
			}
		}
		piv[k] = p;
		if (!(best > tol)) return false;
		if (p !== k) {
			const rp = p * n;
			const rk = k * n;
			for (let c = 0; c < n; c++) {
				const t = a[rk + c];
				a[rk + c] = a[rp + c];
				a[rp + c] = t;
			}
		}
		const pivot = a[k * n + k];
		for (let r = k + 1; r < n; r++) {
			const rr = r * n;
			const f = a[rr + k] / pivot;
			if (f === 0) continue;
			a[rr + k] = f;
			for (let c = k + 1; c < n; c++) a[rr + c] -= f * a[k * n + c];
		}
	}
	return true;
}

/** Solves A x = b in place (b becomes x) using the factors from luFactor. */
export function luSolve(lu: Float64Array, n: number, piv: Int32Array, b: Float64Array): void {
	for (let k = 0; k < n; k++) {
		const p = piv[k];
		if (p !== k) {
			const t = b[k];
			b[k] = b[p];
			b[p] = t;
		}
	}
	for (let r = 1; r < n; r++) {
		let s = b[r];
		const rr = r * n;
		for (let c = 0; c < r; c++) s -= lu[rr + c] * b[c];
		b[r] = s;
	}
	for (let r = n - 1; r >= 0; r--) {
		let s = b[r];
		const rr = r * n;
		for (let c = r + 1; c < n; c++) s -= lu[rr + c] * b[c];
		b[r] = s / lu[rr + r];
	}
}

/**
 * In-place Cholesky factorisation A = L Lᵀ of a symmetric positive-definite matrix; the lower
 * triangle becomes L and the upper triangle is zeroed. Returns false if A is not positive
 * definite to working precision. Used to simulate Gaussian fields with a known covariance.
 */
export function cholesky(a: Float64Array, n: number): boolean {
	for (let j = 0; j < n; j++) {
		let d = a[j * n + j];
		for (let k = 0; k < j; k++) d -= a[j * n + k] * a[j * n + k];
		if (!(d > 0)) return false;
		const l = Math.sqrt(d);
		a[j * n + j] = l;
		for (let i = j + 1; i < n; i++) {
			let s = a[i * n + j];
			for (let k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
			a[i * n + j] = s / l;
		}
		for (let c = j + 1; c < n; c++) a[j * n + c] = 0;
	}
	return true;
}

/** Inverse of a square matrix via LU (n³); returns null if singular. */
export function invert(a: Float64Array, n: number): Float64Array | null {
	const lu = a.slice();
	const piv = new Int32Array(n);
	if (!luFactor(lu, n, piv)) return null;
	const inv = new Float64Array(n * n);
	const col = new Float64Array(n);
	for (let c = 0; c < n; c++) {
		col.fill(0);
		col[c] = 1;
		luSolve(lu, n, piv, col);
		for (let r = 0; r < n; r++) inv[r * n + c] = col[r];
	}
	return inv;
}

/**
 * Cholesky factorisation A = L Lᵀ in place into the lower triangle (the upper triangle is left
 * as it was), for the kriging covariance matrices: the same pivot test as luFactor (a pivot,
 * here l_jj², below SINGULAR_TOLERANCE × max(max|a|, minScale) fails), so a caller can fall back
 * to LU. Half the work of LU and no pivot search (Golub & Van Loan 2013, Alg. 4.2.1).
 */
export function choleskyLower(a: Float64Array, n: number, minScale = 0): boolean {
	let scale = minScale;
	for (let k = 0; k < n * n; k++) {
		const v = Math.abs(a[k]);
		if (v > scale) scale = v;
	}
	if (!(scale > 0) || !Number.isFinite(scale)) return false;
	const tol = SINGULAR_TOLERANCE * scale;
	for (let j = 0; j < n; j++) {
		const rj = j * n;
		let d = a[rj + j];
		for (let k = 0; k < j; k++) d -= a[rj + k] * a[rj + k];
		if (!(d > tol)) return false;
		const l = Math.sqrt(d);
		a[rj + j] = l;
		const inv = 1 / l;
		for (let i = j + 1; i < n; i++) {
			const ri = i * n;
			let s = a[ri + j];
			for (let k = 0; k < j; k++) s -= a[ri + k] * a[rj + k];
			a[ri + j] = s * inv;
		}
	}
	return true;
}

/** Solves L Lᵀ x = b in place (b becomes x) with the factor from choleskyLower. */
export function choleskySolve(l: Float64Array, n: number, b: Float64Array): void {
	for (let r = 0; r < n; r++) {
		const rr = r * n;
		let s = b[r];
		for (let c = 0; c < r; c++) s -= l[rr + c] * b[c];
		b[r] = s / l[rr + r];
	}
	for (let r = n - 1; r >= 0; r--) {
		let s = b[r];
		for (let c = r + 1; c < n; c++) s -= l[c * n + r] * b[c];
		b[r] = s / l[r * n + r];
	}
}
