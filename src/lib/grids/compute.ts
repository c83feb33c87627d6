import {
	crossValidationResiduals,
	defaultLagClasses,
	empiricalVariogram,
	fitVariogramToPoints,
	idwRows,
	krigingRows,
	maskByDistance,
	mergeDuplicateSamples,
	type GridSpec,
	type IdwEverySiteInputs,
	type Sample,
	type Variogram,
	type VariogramPoint
} from '../geostats';
import { HIT_D2 } from '../geostats/idw';
import { NeighbourIndex } from '../geostats/neighbours';
import { DEFAULT_KRIGING_NEIGHBOURS, type GridRequest } from './request';

/**
 * One grid computation, pure (runs in the job worker, a benchmark or a test). Progress is
 * reported through an async callback between row strips, which also lets a worker that shares
 * its thread with a web server answer requests in between.
 */

export type VariogramSource = 'fitted' | 'user' | 'default';

export interface GridVariogram extends Variogram {
	source: VariogramSource;
	/** Why the default was used, when it was. */
	note?: string;
	/** Mean σᵢ² of the sites, (mW/m²)², taken out of a fitted nugget (see MEASUREMENT_ERROR_TREATMENT). */
	meanMeasurementVarianceMWm2: number;
}

export interface CrossValidation {
	rmseMWm2: number;
	meanErrorMWm2: number;
	/** Kriging only: mean of error / predicted σ (≈ 0 when unbiased). */
	meanStandardisedError: number | null;
	/** Kriging only: RMS of error / predicted σ (≈ 1 when σ is right). */
	rmsStandardisedError: number | null;
	/** [observed, predicted] pairs for the plot, mW/m². */
	pairs: [number, number][];
}

export interface GridComputation {
	value: Float32Array;
	/** Kriging standard error (1 σ, mW/m²); null for IDW, which has no error model. */
	sigma: Float32Array | null;
	variogram: GridVariogram | null;
	empirical: VariogramPoint[];
	crossValidation: CrossValidation;
	sitesUsed: number;
	maskedCells: number;
}

/**
 * The one treatment of measurement error (README.md here): the sites' σ enter kriging as known
 * measurement-error variance (added to the data covariance diagonal only, filtered kriging), so
 * the empirical variogram's nugget, which already contains that noise, would count it twice. A
 * FITTED nugget is therefore lowered by the sites' mean σᵢ² (not below 0) and keeps only
 * micro-scale variation; a nugget the user enters is taken as that micro-scale part as it is.
 */
export const MEASUREMENT_ERROR_TREATMENT =
	'Site σ is used as known measurement error; the fitted nugget is lowered by the mean site σ² so the error is not counted twice.';

/** Rows per progress step: small enough to report often, large enough that set-up is negligible. */
const STRIP_ROWS = 16;

/** A variogram fit that fails or gives non-finite parameters falls back to this (documented default). */
export function defaultVariogram(samples: Sample[]): Variogram {
	const mean = samples.reduce((t, s) => t + s.value, 0) / samples.length;
	const variance = samples.reduce((t, s) => t + (s.value - mean) ** 2, 0) / samples.length;
	const { lagM, lags } = defaultLagClasses(samples);
	// Sample variance as sill, no nugget, a third of the lag span as range (common practice, no source).
	return {
		model: 'spherical',
		nugget: 0,
		partialSill: variance > 0 ? variance : 1,
		rangeM: (lagM * lags) / 3
	};
}

function chooseVariogram(
	samples: Sample[],
	req: GridRequest
): { variogram: GridVariogram; empirical: VariogramPoint[] } {
	const withSigma = samples.map((s) => (s.sigma ?? 0) ** 2);
	const meanMeasurementVarianceMWm2 = withSigma.reduce((t, v) => t + v, 0) / samples.length;
	let empirical: VariogramPoint[] = [];
	try {
		empirical = empiricalVariogram(samples, defaultLagClasses(samples));
	} catch {
		empirical = [];
	}
	if (req.variogram) {
		const v = req.variogram;
		return {
			empirical,
			variogram: {
				model: v.model,
				nugget: v.nuggetMWm2,
				partialSill: v.sillMWm2 - v.nuggetMWm2,
				rangeM: v.rangeM,
				source: 'user',
				meanMeasurementVarianceMWm2
			}
		};
	}
	let fitted: Variogram | null = null;
	let note = '';
	try {
		// The same points as the plot: the O(n²) empirical variogram is computed once. The model
		// with the smallest WLS objective wins, as fitBestVariogram chooses.
		if (empirical.length === 0) throw new Error('no lag class holds a pair of sites');
		fitted = (['spherical', 'exponential', 'gaussian'] as const)
			.map((m) => fitVariogramToPoints(empirical, m))
			.sort((x, y) => x.objective - y.objective)[0].variogram;
		const ok = [fitted.nugget, fitted.partialSill, fitted.rangeM].every(Number.isFinite);
		if (!ok || !(fitted.partialSill > 0) || !(fitted.rangeM > 0)) {
			note = 'the fit gave no usable parameters';
			fitted = null;
		}
	} catch (err) {
		note = `the fit failed (${(err as Error).message})`;
		fitted = null;
	}
	if (!fitted) {
		return {
			empirical,
			variogram: {
				...defaultVariogram(samples),
				source: 'default',
				note: `Automatic variogram fit did not converge: ${note}; using the default (spherical, no nugget, sill = sample variance, range = a third of the lag span).`,
				meanMeasurementVarianceMWm2
			}
		};
	}
	return {
		empirical,
		variogram: {
			...fitted,
			nugget: Math.max(0, fitted.nugget - meanMeasurementVarianceMWm2),
			source: 'fitted',
			meanMeasurementVarianceMWm2
		}
	};
}

/**
 * Leave-one-out IDW: each site estimated from the others (the nearest maxNeighbours, or all),
 * with inverseDistanceGrid's weights 1/dᵖ = (d²)^(−p/2) and its hit rule (another site within
 * √HIT_D2 gives its value; several give their mean). With every site this is n² pairs, so the
 * loop is flat typed arrays with 1/d² for power 2, and the nearest sites come from the k-d tree.
 */
function idwCrossValidation(samples: Sample[], power: number, k?: number): CrossValidation {
	const pairs: [number, number][] = [];
	const n = samples.length;
	const xs = Float64Array.from(samples, (s) => s.x);
	const ys = Float64Array.from(samples, (s) => s.y);
	const zs = Float64Array.from(samples, (s) => s.value);
	const half = power / 2;
	const useNearest = k !== undefined && k < n - 1;
	const index = useNearest ? new NeighbourIndex(xs, ys) : null;
	const idx = new Int32Array(useNearest ? k + 1 : 0);
	const d2s = new Float64Array(useNearest ? k + 1 : 0);
	for (let i = 0; i < n; i++) {
		const xi = xs[i];
		const yi = ys[i];
		let sw = 0;
		let swz = 0;
		let hits = 0;
		let hitSum = 0;
		if (index) {
			const found = index.nearest(xi, yi, k! + 1, Infinity, idx, d2s);
			let used = 0;
			for (let f = 0; f < found && used < k!; f++) {
				const q = idx[f];
				if (q === i) continue;
				used++;
				const d2 = d2s[f];
				if (d2 < HIT_D2) {
					hits++;
					hitSum += zs[q];
				} else {
					const w = power === 2 ? 1 / d2 : Math.pow(d2, -half);
					sw += w;
					swz += w * zs[q];
				}
			}
		} else if (power === 2) {
			// The common case, n² pairs: no branch in the loops (site i itself is skipped by the
			// two ranges); a hit (d² < HIT_D2) makes Σw ≥ 1/HIT_D2, and such a site is redone
			// by the careful loop below, as in inverseDistanceGrid's kernel.
			for (let q = 0; q < i; q++) {
				const ex = xs[q] - xi;
				const ey = ys[q] - yi;
				const w = 1 / (ex * ex + ey * ey);
				sw += w;
				swz += w * zs[q];
			}
			for (let q = i + 1; q < n; q++) {
				const ex = xs[q] - xi;
				const ey = ys[q] - yi;
				const w = 1 / (ex * ex + ey * ey);
				sw += w;
				swz += w * zs[q];
			}
			if (sw < 1 / HIT_D2) {
				pairs.push([zs[i], swz / sw]);
				continue;
			}
			sw = 0;
			swz = 0;
		}
		if (!index) {
			for (let q = 0; q < n; q++) {
				const ex = xs[q] - xi;
				const ey = ys[q] - yi;
				const d2 = ex * ex + ey * ey;
				if (d2 < HIT_D2) {
					// Site i itself (d = 0) is left out; another site this close is a hit.
					if (q !== i) {
						hits++;
						hitSum += zs[q];
					}
				} else {
					const w = power === 2 ? 1 / d2 : Math.pow(d2, -half);
					sw += w;
					swz += w * zs[q];
				}
			}
		}
		pairs.push([zs[i], hits > 0 ? hitSum / hits : swz / sw]);
	}
	return summarise(pairs, null);
}

function summarise(pairs: [number, number][], variances: number[] | null): CrossValidation {
	const n = pairs.length;
	let se = 0,
		sse = 0,
		sz = 0,
		szz = 0;
	pairs.forEach(([obs, pred], i) => {
		const e = pred - obs;
		se += e;
		sse += e * e;
		if (variances) {
			const z = variances[i] > 0 ? e / Math.sqrt(variances[i]) : 0;
			sz += z;
			szz += z * z;
		}
	});
	return {
		rmseMWm2: Math.sqrt(sse / n),
		meanErrorMWm2: se / n,
		meanStandardisedError: variances ? sz / n : null,
		rmsStandardisedError: variances ? Math.sqrt(szz / n) : null,
		pairs
	};
}

/**
 * Runs idwEverySitePower2Rows over all rows of `grid` into `out` (full grid, index j · nx + i),
 * in strips of `stripRows`, calling `onRows` with the number of rows done after each strip
 * (in order, increasing). The server runs it on worker threads (src/lib/server/grids); it must
 * give the same numbers as the kernel on this thread, which every split of the rows does.
 * Aborting `signal` ends it early with a rejection.
 */
export type IdwStripRunner = (
	inputs: IdwEverySiteInputs,
	grid: GridSpec,
	stripRows: number,
	out: Float64Array,
	onRows: (rowsDone: number) => Promise<void>,
	signal?: AbortSignal
) => Promise<void>;

export interface ComputeGridOptions {
	/** Where IDW with every site and power 2 runs; on this thread, strip by strip, without it. */
	idwStrips?: IdwStripRunner;
}

/** Samples are projected metres and mW/m²; `onProgress` gets a fraction 0–1. */
export async function computeGrid(
	input: Sample[],
	grid: GridSpec,
	req: GridRequest,
	onProgress: (fraction: number) => Promise<void> = async () => {},
	options: ComputeGridOptions = {}
): Promise<GridComputation> {
	const samples = mergeDuplicateSamples(
		input.map((s) =>
			s.sigma !== undefined && s.sigma > 0 ? s : { x: s.x, y: s.y, value: s.value }
		)
	);
	const cells = grid.nx * grid.ny;
	const value = new Float32Array(cells);
	const sigma = req.method === 'kriging' ? new Float32Array(cells) : null;

	let variogram: GridVariogram | null = null;
	let empirical: VariogramPoint[] = [];
	let crossValidation: CrossValidation;
	const k =
		req.method === 'kriging'
			? (req.maxNeighbours ?? DEFAULT_KRIGING_NEIGHBOURS)
			: req.maxNeighbours;
	// IDW's set-up comes first: with every site at power 2 and a strip runner (the server's
	// threads), the rows start on the threads now and are computed while the cross-validation
	// runs here; their progress is reported after the cross-validation's.
	const value64 = new Float64Array(cells);
	const sigma64 = sigma ? new Float64Array(cells) : null;
	const idw =
		req.method === 'kriging'
			? null
			: idwRows(samples, grid, { power: req.power, maxNeighbours: k });
	const gridProgress = (rowsDone: number) => onProgress(0.15 + (0.8 * rowsDone) / grid.ny);
	let crossValidated!: () => void;
	const afterCrossValidation = new Promise<void>((r) => (crossValidated = r));
	const stop = new AbortController();
	const strips =
		idw?.everySitePower2 && options.idwStrips
			? options.idwStrips(
					idw.everySitePower2,
					grid,
					STRIP_ROWS,
					value64,
					async (rowsDone) => {
						await afterCrossValidation;
						await gridProgress(rowsDone);
					},
					stop.signal
				)
			: null;
	// Handled (awaited) after the cross-validation; until then a rejection must not count as
	// unhandled, which would end the process.
	strips?.catch(() => {});
	try {
		if (req.method === 'kriging') {
			({ variogram, empirical } = chooseVariogram(samples, req));
			await onProgress(0.05);
			const res = crossValidationResiduals(samples, variogram, { maxNeighbours: k });
			crossValidation = summarise(
				res.map((r, i) => [samples[i].value, r.estimate]),
				res.map((r) => r.variance)
			);
		} else {
			crossValidation = idwCrossValidation(samples, req.power, k);
		}
		await onProgress(0.15);
	} catch (err) {
		// The threads stop and end before the error goes on.
		stop.abort();
		await strips?.catch(() => {});
		throw err;
	}
	crossValidated();

	if (strips) {
		await strips;
	} else {
		// Set-up (checks, k-d tree, solver buffers) once; the strips only compute their rows.
		const rows =
			req.method === 'kriging'
				? krigingRows(samples, grid, variogram!, { maxNeighbours: k })
				: null;
		for (let j0 = 0; j0 < grid.ny; j0 += STRIP_ROWS) {
			const j1 = Math.min(grid.ny, j0 + STRIP_ROWS);
			if (rows) rows(j0, j1, value64, sigma64!);
			else idw!(j0, j1, value64);
			await gridProgress(j1);
		}
	}
	value.set(value64);
	if (sigma) sigma.set(sigma64!);

	let maskedCells = 0;
	if (req.maskDistanceM !== undefined) {
		const masked = maskByDistance(value64, grid, samples, req.maskDistanceM);
		for (let c = 0; c < cells; c++) {
			if (Number.isNaN(masked[c])) {
				value[c] = NaN;
				if (sigma) sigma[c] = NaN;
				maskedCells++;
			}
		}
	}
	await onProgress(1);
	return {
		value,
		sigma,
		variogram,
		empirical,
		crossValidation,
		sitesUsed: samples.length,
		maskedCells
	};
}
