import { defaultLagClasses, empiricalVariogram } from './empirical';
import { InputError } from '../foundation/errors';
import type { Sample, Variogram, VariogramModel, VariogramPoint } from './types';
import { validateSamples } from './validate';
import { structure } from './variogram';

/*
 * Weighted least-squares variogram fit (Cressie 1985; Cressie 1993, §2.6.2): minimise
 *   J = Σₖ N(hₖ) (γ̂(hₖ) − γ(hₖ))² / γ(hₖ)²
 * over nugget ≥ 0, partial sill > 0 and range > 0.
 *
 * Why our own optimiser: no numerical-optimisation package is installed, and the problem
 * has structure a general optimiser would ignore. For a fixed range a the model
 * γ = nugget + c·f(h; a) is linear in (nugget, c), so those two follow from a 2 × 2
 * weighted least-squares solve (with the bounds handled by checking the edges), iterated
 * a few times because the weights N/γ² depend on the model (iteratively reweighted least
 * squares). That leaves a one-dimensional search over a: a coarse geometric grid (robust
 * against J's local minima, which hole effects in γ̂ produce) followed by golden-section
 * refinement around the best grid point. Reweighting converges to a fixed point that is
 * close to, but not exactly, the minimum of J, so a final Nelder–Mead polish (Nelder & Mead
 * 1965) minimises J itself over (nugget, c, log a) from there.
 */

/** Cressie's WLS criterion Σ N (γ̂ − γ)² / γ² (dimensionless) of a variogram against lag classes. */
export function wlsObjective(points: VariogramPoint[], v: Variogram): number {
	let j = 0;
	for (const p of points) {
		const g = v.nugget + v.partialSill * structure(v.model, p.hM, v.rangeM);
		j += (p.pairs * (p.gamma - g) ** 2) / (g * g);
	}
	return j;
}

const RANGE_GRID = 64;
const IRLS_STEPS = 12;

interface Linear {
	nugget: number;
	partialSill: number;
	objective: number;
}

/** Best (nugget, partial sill) for a fixed range, and the resulting WLS objective. */
function fitLinear(points: VariogramPoint[], f: Float64Array, cMin: number): Linear {
	const m = points.length;
	const model = new Float64Array(m);
	for (let k = 0; k < m; k++) model[k] = Math.max(points[k].gamma, cMin);
	let nugget = 0;
	let c = cMin;
	for (let step = 0; step < IRLS_STEPS; step++) {
		let sw = 0;
		let swf = 0;
		let swff = 0;
		let swg = 0;
		let swfg = 0;
		for (let k = 0; k < m; k++) {
			const w = points[k].pairs / (model[k] * model[k]);
			const fk = f[k];
			const g = points[k].gamma;
			sw += w;
			swf += w * fk;
			swff += w * fk * fk;
			swg += w * g;
			swfg += w * fk * g;
		}
		const sse = (n0: number, c0: number): number => {
			let s = 0;
			for (let k = 0; k < m; k++) {
				const r = points[k].gamma - n0 - c0 * f[k];
				s += (points[k].pairs / (model[k] * model[k])) * r * r;
			}
			return s;
		};
		const candidates: [number, number][] = [
			[0, Math.max(cMin, swff > 0 ? swfg / swff : cMin)],
			[Math.max(0, (swg - cMin * swf) / sw), cMin]
		];
		const det = sw * swff - swf * swf;
		if (det > 1e-12 * sw * swff) {
			const n1 = (swff * swg - swf * swfg) / det;
			const c1 = (sw * swfg - swf * swg) / det;
			if (n1 >= 0 && c1 >= cMin) candidates.push([n1, c1]);
		}
		let best = Infinity;
		for (const [n0, c0] of candidates) {
			const s = sse(n0, c0);
			if (s < best) {
				best = s;
				nugget = n0;
				c = c0;
			}
		}
		for (let k = 0; k < m; k++) model[k] = Math.max(nugget + c * f[k], cMin);
	}
	let objective = 0;
	for (let k = 0; k < m; k++) {
		const g = nugget + c * f[k];
		objective += (points[k].pairs * (points[k].gamma - g) ** 2) / (g * g);
	}
	return { nugget, partialSill: c, objective };
}

/** WLS fit of one model to empirical lag classes; returns the variogram and its objective. */
export function fitVariogramToPoints(
	points: VariogramPoint[],
	model: VariogramModel
): { variogram: Variogram; objective: number } {
	const usable = points.filter((p) => p.pairs > 0 && p.hM > 0);
	if (usable.length < 3) {
		throw new InputError(
			'opts.lagM',
			usable.length,
			'gives fewer than 3 non-empty lag classes; choose other lagM / lags'
		);
	}
	const gMax = Math.max(...usable.map((p) => p.gamma));
	if (!(gMax > 0)) {
		throw new InputError('samples', gMax, 'have no variation in value; nothing to fit');
	}
	// Lower bound on the partial sill: a pure-nugget model cannot be kriged with.
	const cMin = 1e-6 * gMax;
	const hMin = Math.min(...usable.map((p) => p.hM));
	const hMax = Math.max(...usable.map((p) => p.hM));
	const aLo = hMin / 4;
	const aHi = hMax * 3;
	const f = new Float64Array(usable.length);
	const at = (a: number): Linear => {
		for (let k = 0; k < usable.length; k++) f[k] = structure(model, usable[k].hM, a);
		return fitLinear(usable, f, cMin);
	};
	const ratio = Math.pow(aHi / aLo, 1 / (RANGE_GRID - 1));
	let bestK = 0;
	let bestJ = Infinity;
	for (let k = 0; k < RANGE_GRID; k++) {
		const j = at(aLo * Math.pow(ratio, k)).objective;
		if (j < bestJ) {
			bestJ = j;
			bestK = k;
		}
	}
	// Golden-section search on log(a) between the grid neighbours of the best point.
	let lo = Math.log(aLo) + Math.max(0, bestK - 1) * Math.log(ratio);
	let hi = Math.log(aLo) + Math.min(RANGE_GRID - 1, bestK + 1) * Math.log(ratio);
	const phi = (Math.sqrt(5) - 1) / 2;
	let x1 = hi - phi * (hi - lo);
	let x2 = lo + phi * (hi - lo);
	let j1 = at(Math.exp(x1)).objective;
	let j2 = at(Math.exp(x2)).objective;
	for (let it = 0; it < 40 && hi - lo > 1e-7; it++) {
		if (j1 <= j2) {
			hi = x2;
			x2 = x1;
			j2 = j1;
			x1 = hi - phi * (hi - lo);
			j1 = at(Math.exp(x1)).objective;
		} else {
			lo = x1;
			x1 = x2;
			j1 = j2;
			x2 = lo + phi * (hi - lo);
			j2 = at(Math.exp(x2)).objective;
		}
	}
	let rangeM = Math.exp(j1 <= j2 ? x1 : x2);
	let best = at(rangeM);
	const gridBest = aLo * Math.pow(ratio, bestK);
	const onGrid = at(gridBest);
	if (onGrid.objective < best.objective) {
		best = onGrid;
		rangeM = gridBest;
	}
	const exact = (p: number[]): number => {
		const v: Variogram = {
			model,
			nugget: Math.max(0, p[0]),
			partialSill: Math.max(cMin, p[1]),
			rangeM: Math.exp(p[2])
		};
		return wlsObjective(usable, v);
	};
	const start = [best.nugget, best.partialSill, Math.log(rangeM)];
	const step = [0.05 * (best.nugget + best.partialSill), 0.05 * best.partialSill, 0.05];
	const polished = nelderMead(exact, start, step, 400);
	if (polished.value < best.objective) {
		return {
			variogram: {
				model,
				nugget: Math.max(0, polished.point[0]),
				partialSill: Math.max(cMin, polished.point[1]),
				rangeM: Math.exp(polished.point[2])
			},
			objective: polished.value
		};
	}
	return {
		variogram: { model, nugget: best.nugget, partialSill: best.partialSill, rangeM },
		objective: best.objective
	};
}

/** Minimal Nelder–Mead simplex minimiser (Nelder & Mead 1965, standard coefficients). */
function nelderMead(
	f: (p: number[]) => number,
	start: number[],
	step: number[],
	maxIter: number
): { point: number[]; value: number } {
	const d = start.length;
	const pts: number[][] = [start.slice()];
	for (let k = 0; k < d; k++) {
		const p = start.slice();
		p[k] += step[k] || 1e-3;
		pts.push(p);
	}
	let vals = pts.map(f);
	for (let it = 0; it < maxIter; it++) {
		const order = vals.map((_, k) => k).sort((a, b) => vals[a] - vals[b]);
		const sorted = order.map((k) => pts[k]);
		vals = order.map((k) => vals[k]);
		pts.splice(0, pts.length, ...sorted);
		if (Math.abs(vals[d] - vals[0]) <= 1e-12 * (Math.abs(vals[0]) + 1e-12)) break;
		const centroid = new Array<number>(d).fill(0);
		for (let k = 0; k < d; k++) for (let q = 0; q < d; q++) centroid[q] += pts[k][q] / d;
		const along = (t: number) => centroid.map((c, q) => c + t * (pts[d][q] - c));
		const reflected = along(-1);
		const fr = f(reflected);
		if (fr < vals[0]) {
			const expanded = along(-2);
			const fe = f(expanded);
			if (fe < fr) {
				pts[d] = expanded;
				vals[d] = fe;
			} else {
				pts[d] = reflected;
				vals[d] = fr;
			}
		} else if (fr < vals[d - 1]) {
			pts[d] = reflected;
			vals[d] = fr;
		} else {
			const contracted = fr < vals[d] ? along(-0.5) : along(0.5);
			const fc = f(contracted);
			if (fc < Math.min(fr, vals[d])) {
				pts[d] = contracted;
				vals[d] = fc;
			} else {
				for (let k = 1; k <= d; k++) {
					pts[k] = pts[k].map((x, q) => pts[0][q] + 0.5 * (x - pts[0][q]));
					vals[k] = f(pts[k]);
				}
			}
		}
	}
	let bestK = 0;
	for (let k = 1; k <= d; k++) if (vals[k] < vals[bestK]) bestK = k;
	return { point: pts[bestK], value: vals[bestK] };
}

/**
 * Fits one variogram model with nugget to the samples' empirical variogram by Cressie's
 * WLS. Default lag classes: half the bounding-box diagonal split into 15 (see
 * defaultLagClasses). Distances in metres, sills in value-unit².
 */
export function fitVariogram(
	samples: Sample[],
	opts: { model: VariogramModel; lagM?: number; lags?: number }
): Variogram {
	validateSamples(samples, 3);
	if (opts === null || typeof opts !== 'object') {
		throw new InputError('opts', opts, 'must be an object with a model');
	}
	if (!['spherical', 'exponential', 'gaussian'].includes(opts.model)) {
		throw new InputError(
			'opts.model',
			opts.model,
			"must be 'spherical', 'exponential' or 'gaussian'"
		);
	}
	const lags = defaultLagClasses(samples, opts);
	return fitVariogramToPoints(empiricalVariogram(samples, lags), opts.model).variogram;
}

/**
 * Fits every model in `opts.models` (default all three) and ranks them by the WLS
 * objective, best first. The objectives are comparable because data and weighting are the same.
 */
export function rankVariogramModels(
	samples: Sample[],
	opts: { lagM?: number; lags?: number; models?: VariogramModel[] } = {}
): { variogram: Variogram; objective: number }[] {
	validateSamples(samples, 3);
	const models = opts.models ?? (['spherical', 'exponential', 'gaussian'] as VariogramModel[]);
	if (models.length === 0) throw new InputError('opts.models', models, 'is empty');
	const points = empiricalVariogram(samples, defaultLagClasses(samples, opts));
	return models
		.map((m) => fitVariogramToPoints(points, m))
		.sort((a, b) => a.objective - b.objective);
}

/**
 * Automatic model choice: the model with the smallest WLS objective among `opts.models`
 * (default all three). Override by calling fitVariogram with a model, or pass `models`.
 */
export function fitBestVariogram(
	samples: Sample[],
	opts: { lagM?: number; lags?: number; models?: VariogramModel[] } = {}
): Variogram {
	return rankVariogramModels(samples, opts)[0].variogram;
}
