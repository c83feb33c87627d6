import { z } from 'zod';

/**
 * Flags a site keeps from its import: the warnings a contributor saw and imported anyway, so the
 * site page can say so and maps can filter on them later. Stored as `site.flags text[]`; this list
 * is the one definition (the import maps its warning codes onto it, pages show the labels).
 */
export const SITE_FLAGS = [
	'heat-flow-implausible',
	'heat-flow-negative',
	'heat-flow-missing',
	'conductivity-implausible',
	'heat-production-implausible',
	'gradient-inconsistent',
	'year-implausible',
	'outside-crs-zone',
	'method-missing',
	'near-existing-site',
	'near-duplicate-in-file'
] as const;

export type SiteFlag = (typeof SITE_FLAGS)[number];

export const siteFlagSchema = z.enum(SITE_FLAGS);

/** How a flag reads on a site page and in a filter. */
export const SITE_FLAG_LABELS: Record<SiteFlag, string> = {
	'heat-flow-implausible': 'Heat flow above the plausible range (checked at import)',
	'heat-flow-negative': 'Negative (downward) heat flow',
	'heat-flow-missing': 'No heat-flow value',
	'conductivity-implausible': 'Conductivity unusual for rock',
	'heat-production-implausible': 'Heat production unusually high',
	'gradient-inconsistent': 'Gradient inconsistent with heat flow / conductivity',
	'year-implausible': 'Implausible year of measurement',
	'outside-crs-zone': 'Coordinates far outside the zone of their CRS',
	'method-missing': 'No method given (stored as "other")',
	'near-existing-site': 'Close to a site that existed at import',
	'near-duplicate-in-file': 'Close to another site of the same file'
};

/** The flag an import warning leaves on its site, by the warning's code (none for the others). */
export const FLAG_OF_WARNING: Readonly<Record<string, SiteFlag>> = {
	'heat-flow.implausible': 'heat-flow-implausible',
	'heat-flow.negative': 'heat-flow-negative',
	'heat-flow.missing': 'heat-flow-missing',
	'conductivity.implausible': 'conductivity-implausible',
	'heat-production.implausible': 'heat-production-implausible',
	'gradient.inconsistent': 'gradient-inconsistent',
	'year.implausible': 'year-implausible',
	'coordinate.outside-zone': 'outside-crs-zone',
	'method.missing': 'method-missing',
	'location.near-existing': 'near-existing-site',
	'location.near-duplicate': 'near-duplicate-in-file'
};

/** Flags of a list of warnings, each once, in the list's order. */
export function flagsOf(warnings: readonly { code: string }[]): SiteFlag[] {
	const out: SiteFlag[] = [];
	for (const w of warnings) {
		const f = FLAG_OF_WARNING[w.code];
		if (f && !out.includes(f)) out.push(f);
	}
	return out;
}
