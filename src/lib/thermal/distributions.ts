// Draws of uncertain inputs, truncated at physical bounds by rejection (redraw until inside),
// which keeps the shape of the distribution inside the bounds (common practice, no source).

import { InputError } from '../foundation/errors';
import type { Random } from '../foundation/random';

/** normal: N(mean, sigma). lognormal: the log-normal with that mean and standard deviation. */
export type Distribution = 'normal' | 'lognormal';

const MAX_REJECTIONS = 10_000;

/** One draw of a quantity with mean `mean` and standard deviation `sigma`, inside [min, max]. */
export function drawTruncated(
	random: Random,
	distribution: Distribution,
	mean: number,
	sigma: number,
	min: number,
	max: number,
	field: string
): number {
	if (sigma === 0) return mean;
	let mu = 0;
	let s = 0;
	if (distribution === 'lognormal') {
		if (!(mean > 0)) throw new InputError(field, mean, 'must be > 0 for a log-normal draw');
		// Match the log-normal's mean and variance: σ² = ln(1 + (sd/mean)²), μ = ln(mean) − σ²/2.
		const v = Math.log1p((sigma / mean) ** 2);
		s = Math.sqrt(v);
		mu = Math.log(mean) - v / 2;
	}
	for (let i = 0; i < MAX_REJECTIONS; i++) {
		const g = random.normal();
		const x = distribution === 'lognormal' ? Math.exp(mu + s * g) : mean + sigma * g;
		if (x >= min && x <= max) return x;
	}
	throw new InputError(
		field,
		mean,
		`has almost no probability inside its bounds [${min}, ${max}] (sigma ${sigma})`
	);
}
