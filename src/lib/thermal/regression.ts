// Ordinary least squares of y on x with standard errors (common practice, no source; the standard
// formulas are in any statistics text: s² = SSR/(n − 2), σ_slope = s/√Sxx, σ_intercept = s √(1/n + x̄²/Sxx)).

import { InputError } from '../foundation/errors';

/** Result of a straight-line least-squares fit y = intercept + slope·x. */
export interface LinearFit {
	slope: number;
	intercept: number;
	/** Standard error of the slope; NaN when n = 2 (no degrees of freedom left). */
	sigmaSlope: number;
	/** Standard error of the intercept; NaN when n = 2. */
	sigmaIntercept: number;
	/** Residual standard deviation s = √(SSR/(n − 2)); NaN when n = 2. */
	residualSigma: number;
	samples: number;
}

/** Least-squares line through (x[from..to), y[from..to)); x need not be sorted but must vary. */
export function linearFit(
	x: ArrayLike<number>,
	y: ArrayLike<number>,
	from = 0,
	to = x.length
): LinearFit {
	const n = to - from;
	if (n < 2) throw new InputError('samples', n, 'must be at least 2 for a straight-line fit');
	// Centre first (two passes) to avoid the cancellation of the one-pass Σx² − n x̄² formula.
	let sx = 0;
	let sy = 0;
	for (let i = from; i < to; i++) {
		sx += x[i];
		sy += y[i];
	}
	const mx = sx / n;
	const my = sy / n;
	let sxx = 0;
	let sxy = 0;
	for (let i = from; i < to; i++) {
		const dx = x[i] - mx;
		sxx += dx * dx;
		sxy += dx * (y[i] - my);
	}
	if (!(sxx > 0)) throw new InputError('x', mx, 'must take at least two different values');
	const slope = sxy / sxx;
	const intercept = my - slope * mx;
	let ssr = 0;
	for (let i = from; i < to; i++) {
		const r = y[i] - intercept - slope * x[i];
		ssr += r * r;
	}
	const residualSigma = n > 2 ? Math.sqrt(ssr / (n - 2)) : NaN;
	return {
		slope,
		intercept,
		sigmaSlope: residualSigma / Math.sqrt(sxx),
		sigmaIntercept: residualSigma * Math.sqrt(1 / n + (mx * mx) / sxx),
		residualSigma,
		samples: n
	};
}
