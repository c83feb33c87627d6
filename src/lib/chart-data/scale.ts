// Minimal linear scales and "nice" ticks for hand-written SVG charts (no chart library is
// installed). Same idea as d3's linear scale, reduced to what the geotherm plots need.

export interface LinearScale {
	(value: number): number;
	domain: [number, number];
	range: [number, number];
}

/** Maps [d0, d1] linearly onto [r0, r1]; a zero-width domain maps everything to r0. */
export function linearScale(domain: [number, number], range: [number, number]): LinearScale {
	const [d0, d1] = domain;
	const [r0, r1] = range;
	const span = d1 - d0;
	const scale = ((v: number) =>
		span === 0 ? r0 : r0 + ((v - d0) / span) * (r1 - r0)) as LinearScale;
	scale.domain = [d0, d1];
	scale.range = [r0, r1];
	return scale;
}

/** A tick step of 1, 2 or 5 × 10^n giving about `count` intervals over `span`. */
export function niceStep(span: number, count = 6): number {
	if (!(span > 0) || !Number.isFinite(span)) return 1;
	const raw = span / Math.max(1, count);
	const power = 10 ** Math.floor(Math.log10(raw));
	const m = raw / power;
	// Round to the nearest of 1, 2, 5, 10 on a log scale (thresholds √2, √10, √50, as d3 does).
	return (m >= Math.sqrt(50) ? 10 : m >= Math.sqrt(10) ? 5 : m >= Math.SQRT2 ? 2 : 1) * power;
}

/** The smallest multiple of the nice step at or above `value`. */
export function niceCeil(value: number, count = 6): number {
	const step = niceStep(value, count);
	return Math.ceil(value / step - 1e-9) * step;
}

/** Ticks at multiples of the nice step inside [min, max] (inclusive, with float slack). */
export function ticks(min: number, max: number, count = 6): number[] {
	const step = niceStep(max - min, count);
	const out: number[] = [];
	const first = Math.ceil(min / step - 1e-9);
	for (let i = first; i * step <= max + step * 1e-9; i++) {
		out.push(Number((i * step).toPrecision(12))); // drop float noise like 0.30000000000000004
	}
	return out;
}
