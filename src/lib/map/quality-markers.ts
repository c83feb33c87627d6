import type { QualityClass } from '$lib/sites/quality';

/**
 * How a site marker shows its quality class: size and outline, never colour (colour is the heat
 * flow). The better constrained, the larger the marker and the heavier its outline; no class at
 * all gets a small dashed outline. The legend draws from this table.
 */
export interface QualityMarker {
	radius: number;
	weight: number;
	dashArray?: string;
}

export const QUALITY_MARKERS: Record<QualityClass | 'none', QualityMarker> = {
	'well-constrained': { radius: 8, weight: 3 },
	constrained: { radius: 7, weight: 2 },
	indicative: { radius: 5.5, weight: 1 },
	unconstrained: { radius: 4.5, weight: 1, dashArray: '2 2' },
	none: { radius: 4, weight: 1, dashArray: '2 2' }
};
