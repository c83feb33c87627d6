// Number formatting shared by the geotherm chart, panel and table: one place decides how a
// percentile range reads, so the chart label and the key numbers never disagree.

import { mToKm } from '$lib/geo/units';
import type { PercentileTriple } from '$lib/thermal';

/** "4.2 (3.8–4.7) km" from depths in metres; an unreached percentile reads "—" or "> base". */
export function formatDepthRangeKm(
	p50M: number | null,
	p10M: number | null,
	p90M: number | null,
	digits = 1
): string {
	const km = (m: number | null, open: string) => (m == null ? open : mToKm(m).toFixed(digits));
	if (p50M == null) return 'not reached';
	return `${km(p50M, '—')} (${km(p10M, '—')}–${km(p90M, 'beyond base')}) km`;
}

/** "612 (580–650) °C" or "38.5 (33.0–44.1) mW/m²". */
export function formatTriple(t: PercentileTriple, unit: string, digits = 0): string {
	return `${t.p50.toFixed(digits)} (${t.p10.toFixed(digits)}–${t.p90.toFixed(digits)}) ${unit}`;
}
