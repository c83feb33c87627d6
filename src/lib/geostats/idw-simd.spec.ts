import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import { compileIdwSimd } from '../../../scripts/build-wasm.js';
import { createRandom } from '../foundation/random';
import { idwEverySitePower2Rows } from './idw';
import { IDW_SIMD_WASM } from './idw-simd-module';
import { IDW_SIMD_WASM_BASE64 } from './idw-simd.wasm';

// Invented sites (common practice, no source: the wasm pass must equal the JavaScript pass).
// Widths 23 and 64: cells after the last wasm group of eight (a JavaScript group of four and a
// tail), and none; one site sits on a cell centre (a hit, the careful pass), two on one point.
function inputs(seed: number, n: number) {
	const rnd = createRandom(seed).uniform;
	const xs = new Float64Array(n);
	const ys = new Float64Array(n);
	const zs = new Float64Array(n);
	for (let s = 0; s < n; s++) {
		xs[s] = rnd() * 64_000;
		ys[s] = rnd() * 40_000;
		zs[s] = 30 + rnd() * 90;
	}
	xs[0] = 2500;
	ys[0] = 7500;
	xs[1] = xs[2];
	ys[1] = ys[2];
	return { xs, ys, zs };
}

function run(nx: number, ny: number, seed: number, n: number, wasm?: Uint8Array<ArrayBuffer>) {
	const { xs, ys, zs } = inputs(seed, n);
	const out = new Float64Array(nx * ny);
	idwEverySitePower2Rows(xs, ys, zs, nx, 0, 0, 1000, 1000, 0, ny, out, wasm);
	return out;
}

describe('IDW SIMD fast pass (idw-simd.wat)', () => {
	it('the committed binary is the .wat compiled again (they cannot drift)', async () => {
		expect(IDW_SIMD_WASM_BASE64).toBe(await compileIdwSimd());
	});

	it('gives the JavaScript pass bit for bit (same operations in the same order)', () => {
		for (const [nx, ny, seed, n] of [
			[23, 17, 3, 500],
			[64, 40, 4, 1201]
		]) {
			const js = run(nx, ny, seed, n);
			const simd = run(nx, ny, seed, n, IDW_SIMD_WASM);
			expect(simd).toEqual(js);
			// The hit cell takes the site's value exactly (the careful pass after the wasm pass).
			expect(simd[7 * nx + 2]).toBe(inputs(seed, n).zs[0]);
		}
	});

	it('the wasm row function itself gives the JavaScript sums', () => {
		// Proves the wasm pass runs (the kernel falls back silently where SIMD is missing).
		const { xs, ys, zs } = inputs(5, 300);
		const n = xs.length;
		const nx = 8;
		const inst = new WebAssembly.Instance(new WebAssembly.Module(IDW_SIMD_WASM));
		const mem = new Float64Array((inst.exports.memory as WebAssembly.Memory).buffer);
		mem.set(xs, 0);
		mem.set(ys, n);
		mem.set(zs, 2 * n);
		const cy = 3500;
		(inst.exports.row as (...a: number[]) => void)(n, nx, 0, 1000, cy, 24 * n, 24 * n + 8 * nx);
		for (let i = 0; i < nx; i++) {
			const cx = (i + 0.5) * 1000;
			let sw = 0;
			let swz = 0;
			for (let s = 0; s < n; s++) {
				const ex = xs[s] - cx;
				const ey = ys[s] - cy;
				const w = 1 / (ex * ex + ey * ey);
				sw += w;
				swz += w * zs[s];
			}
			expect(mem[3 * n + nx + i]).toBe(sw);
			expect(mem[3 * n + i]).toBe(swz / sw);
		}
	});

	it('runs in an empty context (as on the threads) and falls back on bytes that are no wasm', () => {
		const js = run(23, 17, 3, 500);
		const { xs, ys, zs } = inputs(3, 500);
		const f = runInNewContext(`(${idwEverySitePower2Rows.toString()})`, {});
		const out = new Float64Array(23 * 17);
		f(xs, ys, zs, 23, 0, 0, 1000, 1000, 0, 17, out, IDW_SIMD_WASM);
		expect(out).toEqual(js);
		expect(run(23, 17, 3, 500, new Uint8Array([1, 2, 3]))).toEqual(js);
	});
});
