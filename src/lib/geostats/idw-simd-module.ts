import { IDW_SIMD_WASM_BASE64 } from './idw-simd.wasm';

/**
 * The IDW fast pass as wasm bytes (see idw-simd.wat), decoded once. Bytes rather than a compiled
 * module because idwEverySitePower2Rows also runs on worker threads, which get them as data.
 */
export const IDW_SIMD_WASM: Uint8Array<ArrayBuffer> = Uint8Array.from(
	atob(IDW_SIMD_WASM_BASE64),
	(c) => c.charCodeAt(0)
);
