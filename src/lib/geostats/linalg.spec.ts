import { describe, expect, it } from 'vitest';
import { cholesky, choleskyLower, choleskySolve, invert, luFactor, luSolve } from './linalg';
import { createRandom } from '../foundation/random';

describe('LU with partial pivoting (Golub & Van Loan 2013, Alg. 3.4.1)', () => {
	it('solves random systems, including a zero leading pivot', () => {
		const rnd = createRandom(3).uniform;
		for (const n of [1, 2, 5, 12, 25]) {
			const a = Float64Array.from({ length: n * n }, () => rnd() * 2 - 1);
			a[0] = n === 1 ? 2 : 0; // a zero first pivot forces a row swap
			const x = Float64Array.from({ length: n }, () => rnd() * 10 - 5);
			const b = new Float64Array(n);
			for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) b[r] += a[r * n + c] * x[c];
			const lu = a.slice();
			const piv = new Int32Array(n);
			expect(luFactor(lu, n, piv)).toBe(true);
			luSolve(lu, n, piv, b);
			for (let k = 0; k < n; k++) expect(b[k]).toBeCloseTo(x[k], 9);
		}
	});

	it('reports a singular matrix (two equal rows)', () => {
		const a = Float64Array.from([1, 2, 3, 4, 5, 6, 1, 2, 3]);
		expect(luFactor(a, 3, new Int32Array(3))).toBe(false);
		expect(invert(Float64Array.from([1, 2, 2, 4]), 2)).toBeNull();
	});

	it('inverts', () => {
		const inv = invert(Float64Array.from([4, 7, 2, 6]), 2)!;
		expect(Array.from(inv).map((v) => +v.toFixed(12))).toEqual([0.6, -0.7, -0.2, 0.4]);
	});
});

describe('Cholesky', () => {
	it('factorises an SPD matrix and rejects an indefinite one', () => {
		const a = Float64Array.from([4, 2, 2, 3]);
		expect(cholesky(a, 2)).toBe(true);
		expect(Array.from(a)).toEqual([2, 0, 1, Math.sqrt(2)]);
		expect(cholesky(Float64Array.from([1, 2, 2, 1]), 2)).toBe(false);
	});
});

describe('choleskyLower / choleskySolve (Golub & Van Loan 2013, Alg. 4.2.1)', () => {
	it('solves an SPD system (hand-checked: A = [[4, 2, 0], [2, 5, 1], [0, 1, 3]], x = [1, −1, 2])', () => {
		const a = Float64Array.from([4, 2, 0, 2, 5, 1, 0, 1, 3]);
		// b = A x = [2, −1, 5]
		const b = Float64Array.from([2, -1, 5]);
		expect(choleskyLower(a, 3)).toBe(true);
		expect(a[0]).toBe(2); // l₁₁ = √4
		choleskySolve(a, 3, b);
		expect(b[0]).toBeCloseTo(1, 12);
		expect(b[1]).toBeCloseTo(-1, 12);
		expect(b[2]).toBeCloseTo(2, 12);
	});

	it('fails on a singular or indefinite matrix, as luFactor does', () => {
		expect(choleskyLower(Float64Array.from([1, 1, 1, 1]), 2)).toBe(false);
		expect(choleskyLower(Float64Array.from([1, 2, 2, 1]), 2)).toBe(false);
	});
});
