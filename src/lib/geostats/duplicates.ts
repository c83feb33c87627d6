import { InputError } from '../foundation/errors';
import { validateSamples } from './validate';
import type { Sample } from './types';

/**
 * Throws a InputError naming the second of two samples at exactly the same
 * location when neither has a positive sigma: their kriging equations would be identical
 * (the system is singular whatever the nugget, since C(0) = sill on and off the diagonal).
 * With a sigma on either one, filtered kriging weighs them and no merge is needed.
 */
export function assertNoExactDuplicates(samples: Sample[]): void {
	const order = samples.map((_, k) => k);
	order.sort((a, b) => samples[a].x - samples[b].x || samples[a].y - samples[b].y || a - b);
	for (let q = 1; q < order.length; q++) {
		const a = samples[order[q - 1]];
		const b = samples[order[q]];
		if (a.x !== b.x || a.y !== b.y) continue;
		// Walk back over the whole run of co-located samples.
		for (let p = q - 1; p >= 0; p--) {
			const c = samples[order[p]];
			if (c.x !== b.x || c.y !== b.y) break;
			if (!((c.sigma ?? 0) > 0) && !((b.sigma ?? 0) > 0)) {
				const first = Math.min(order[p], order[q]);
				const second = Math.max(order[p], order[q]);
				throw new InputError(
					`samples[${second}]`,
					{ x: b.x, y: b.y },
					`is at the same location as samples[${first}] (${b.x}, ${b.y}) and neither has a sigma; ` +
						'merge them first (mergeDuplicateSamples)'
				);
			}
		}
	}
}

/**
 * Merges samples at exactly the same location (metres) into one. If every member has
 * sigma > 0 the result is the inverse-variance weighted mean with σ = (Σ σᵢ⁻²)^(−1/2);
 * otherwise the members without sigma are treated as exact and the result is their plain
 * mean with no sigma. Order of first appearance is kept.
 */
export function mergeDuplicateSamples(samples: Sample[]): Sample[] {
	validateSamples(samples, 0);
	const groups = new Map<string, Sample[]>();
	for (const s of samples) {
		const key = `${s.x}|${s.y}`;
		const g = groups.get(key);
		if (g) g.push(s);
		else groups.set(key, [s]);
	}
	const out: Sample[] = [];
	for (const g of groups.values()) {
		if (g.length === 1) {
			out.push({ ...g[0] });
			continue;
		}
		const exact = g.filter((s) => !((s.sigma ?? 0) > 0));
		if (exact.length > 0) {
			const mean = exact.reduce((t, s) => t + s.value, 0) / exact.length;
			out.push({ x: g[0].x, y: g[0].y, value: mean });
		} else {
			let sw = 0;
			let swz = 0;
			for (const s of g) {
				const w = 1 / (s.sigma! * s.sigma!);
				sw += w;
				swz += w * s.value;
			}
			out.push({ x: g[0].x, y: g[0].y, value: swz / sw, sigma: 1 / Math.sqrt(sw) });
		}
	}
	return out;
}
