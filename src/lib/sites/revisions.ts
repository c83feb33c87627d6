import { METHOD_LABELS, type HeatFlowMethod } from './methods';

/**
 * A site's heat-flow values and their history. The site row holds the current values; each
 * version (as submitted, computed from a log, corrected by hand) is a revision with its
 * provenance, and the contributor chooses which one is current. The one list of sources (also the
 * `site_value_source` enum) and the view model of the revision list on the site page.
 */
export const SITE_VALUE_SOURCES = ['submitted', 'log_computation', 'correction'] as const;
export type SiteValueSource = (typeof SITE_VALUE_SOURCES)[number];

export const SOURCE_LABELS: Record<SiteValueSource, string> = {
	submitted: 'As submitted',
	log_computation: 'Computed from a log',
	correction: 'Corrected by hand'
};

/** The values a revision carries (the same names as the site's columns). */
export interface SiteValues {
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2: number | null;
	gradientKPerKm: number | null;
	gradientSigmaKPerKm: number | null;
	conductivityWmK: number | null;
	conductivitySigmaWmK: number | null;
	conductivitySamples: number | null;
	topDepthM: number | null;
	bottomDepthM: number | null;
	method: HeatFlowMethod;
}

export const SITE_VALUE_KEYS = [
	'heatFlowMWm2',
	'heatFlowSigmaMWm2',
	'gradientKPerKm',
	'gradientSigmaKPerKm',
	'conductivityWmK',
	'conductivitySigmaWmK',
	'conductivitySamples',
	'topDepthM',
	'bottomDepthM',
	'method'
] as const satisfies readonly (keyof SiteValues)[];

/** The revision-relevant values of any row with the site's columns. */
export function pickSiteValues(row: SiteValues): SiteValues {
	const out = {} as Record<string, unknown>;
	for (const k of SITE_VALUE_KEYS) out[k] = row[k];
	return out as unknown as SiteValues;
}

/** A stored revision with what the page needs to say where it came from. */
export interface RevisionRecord extends SiteValues {
	id: string;
	source: SiteValueSource;
	createdAt: Date | string;
	createdByName: string | null;
	reason: string | null;
	importFileName: string | null;
	computation: { method: string; fromM: number; toM: number; logName: string | null } | null;
}

export interface RevisionRow {
	id: string | null; // null: the submitted values, not yet stored as a revision
	label: string;
	current: boolean;
	heatFlow: string;
	gradient: string;
	conductivity: string;
	interval: string;
	method: string;
	/** Who, when and from what, in one sentence. */
	provenance: string;
}

const fmt = (v: number | null, sigma: number | null, unit: string, digits: number) =>
	v === null
		? '—'
		: `${v.toFixed(digits)}${sigma !== null ? ` ± ${sigma.toFixed(digits)}` : ''} ${unit}`;

function formatInterval(top: number | null, bottom: number | null): string {
	if (top === null && bottom === null) return '—';
	return `${top ?? '?'}–${bottom ?? '?'} m`;
}

function formatWhen(at: Date | string): string {
	// ISO date and minutes in UTC: the same on server and browser, whatever the locale.
	return new Date(at).toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}

function provenance(r: RevisionRecord): string {
	const who = r.createdByName ?? 'unknown contributor';
	const when = formatWhen(r.createdAt);
	switch (r.source) {
		case 'submitted':
			return r.importFileName
				? `Imported from ${r.importFileName} by ${who}, ${when}.`
				: `Entered with the dataset, ${when}.`;
		case 'log_computation': {
			const c = r.computation;
			const what = c
				? `${c.method === 'bullard' ? 'Bullard' : 'interval'} method over ${c.fromM}–${c.toM} m of ${c.logName ?? 'a log since removed'}`
				: 'a log computation since removed';
			return `Computed by ${who} with the ${what}, ${when}.`;
		}
		case 'correction':
			return `Corrected by ${who}, ${when}. Reason: ${r.reason ?? '—'}`;
	}
}

function row(values: SiteValues, base: Omit<RevisionRow, keyof ReturnType<typeof cells>>) {
	return { ...base, ...cells(values) };
}

function cells(v: SiteValues) {
	return {
		heatFlow: fmt(v.heatFlowMWm2, v.heatFlowSigmaMWm2, 'mW/m²', 1),
		gradient: fmt(v.gradientKPerKm, v.gradientSigmaKPerKm, 'K/km', 1),
		conductivity: fmt(v.conductivityWmK, v.conductivitySigmaWmK, 'W/(m·K)', 2),
		interval: formatInterval(v.topDepthM, v.bottomDepthM),
		method: METHOD_LABELS[v.method] ?? v.method
	};
}

/**
 * Rows of the revision list, oldest first. Without any stored revision the site's own values are
 * the submitted ones, shown as such and current. `currentRevisionId` null with stored revisions
 * means the submitted revision is current (it was never replaced).
 */
export function revisionRows(
	site: SiteValues & { createdAt: Date | string },
	revisions: readonly RevisionRecord[],
	currentRevisionId: string | null
): RevisionRow[] {
	if (revisions.length === 0) {
		return [
			row(site, {
				id: null,
				label: SOURCE_LABELS.submitted,
				current: true,
				provenance: `Entered with the dataset, ${formatWhen(site.createdAt)}.`
			})
		];
	}
	const sorted = [...revisions].sort(
		(a, b) => new Date(a.createdAt).getTime() - new Date(b.createdAt).getTime()
	);
	const currentId =
		currentRevisionId ?? sorted.find((r) => r.source === 'submitted')?.id ?? sorted[0].id;
	return sorted.map((r) =>
		row(r, {
			id: r.id,
			label: SOURCE_LABELS[r.source],
			current: r.id === currentId,
			provenance: provenance(r)
		})
	);
}
