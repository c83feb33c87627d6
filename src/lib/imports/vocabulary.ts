// The method and correction vocabularies as people spell them, mapped to the stored enums.
// The spellings are the trade's ordinary terms (common practice, no source).

import { HEAT_FLOW_METHODS, type HeatFlowMethod } from '../sites/methods';

export { HEAT_FLOW_METHODS, type HeatFlowMethod };

export const CORRECTIONS = ['topographic', 'palaeoclimatic', 'sedimentation', 'other'] as const;
export type Correction = (typeof CORRECTIONS)[number];

function words(text: string): string {
	return text
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, ' ')
		.trim();
}

const METHOD_SPELLINGS: Record<HeatFlowMethod, string[]> = {
	borehole_interval: [
		'borehole interval',
		'interval',
		'interval method',
		'int',
		'borehole',
		'gradient conductivity',
		'gradient x conductivity',
		'conventional'
	],
	bullard: [
		'bullard',
		'bullard plot',
		'bullard method',
		'thermal resistance',
		'resistance integral'
	],
	bottom_hole_temperature: [
		'bottom hole temperature',
		'bottom hole temperatures',
		'bht',
		'bhts',
		'corrected bht',
		'horner',
		'horner bht'
	],
	marine_probe: [
		'marine probe',
		'probe',
		'marine',
		'sediment probe',
		'ocean probe',
		'seafloor probe',
		'sea floor probe'
	],
	other: ['other', 'unknown', 'mixed']
};

const CORRECTION_SPELLINGS: Record<Correction, string[]> = {
	topographic: ['topographic', 'topography', 'topo', 'terrain', 't'],
	palaeoclimatic: [
		'palaeoclimatic',
		'paleoclimatic',
		'palaeoclimate',
		'paleoclimate',
		'palaeo',
		'paleo',
		'climate',
		'climatic',
		'pc',
		'p'
	],
	sedimentation: ['sedimentation', 'sediment', 'sedimentary', 'sed', 's'],
	other: ['other', 'o']
};

const methodLookup = new Map<string, HeatFlowMethod>();
for (const m of HEAT_FLOW_METHODS) {
	methodLookup.set(words(m), m);
	for (const s of METHOD_SPELLINGS[m]) methodLookup.set(words(s), m);
}
const correctionLookup = new Map<string, Correction>();
for (const c of CORRECTIONS)
	for (const s of CORRECTION_SPELLINGS[c]) correctionLookup.set(words(s), c);

/** The stored method for a spelling ("Bullard", "interval", "BHT", "probe"); null if unknown. */
export function parseMethod(text: string): HeatFlowMethod | null {
	return methodLookup.get(words(text)) ?? null;
}

/** Accepted method spellings, for messages and help. */
export function methodSpellings(): string[] {
	return HEAT_FLOW_METHODS.map((m) => `${m} (${METHOD_SPELLINGS[m].slice(0, 3).join(', ')})`);
}

const NONE = new Set(['', 'none', 'no', 'n', '-', 'nil', 'uncorrected']);

/**
 * Splits a corrections cell ("topo, palaeo", "T+P", "none") into stored values, in canonical order;
 * unknown parts are returned separately so the caller reports them.
 */
export function parseCorrections(text: string): { corrections: Correction[]; unknown: string[] } {
	const trimmed = text.trim().toLowerCase();
	if (NONE.has(trimmed)) return { corrections: [], unknown: [] };
	const found = new Set<Correction>();
	const unknown: string[] = [];
	for (const part of trimmed.split(/[,;/+|&]|\band\b/)) {
		const key = words(part);
		if (key === '') continue;
		const c = correctionLookup.get(key);
		if (c) found.add(c);
		else unknown.push(part.trim());
	}
	return { corrections: CORRECTIONS.filter((c) => found.has(c)), unknown };
}
