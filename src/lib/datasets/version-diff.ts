/**
 * What changed between two versions of a dataset: sites matched by code (unique within a
 * version), added, removed, and changed field by field. Pure, so the rule is tested without a
 * database; the repository decides which fields are compared.
 */

export type SiteValues = { code: string } & Record<string, unknown>;

export interface FieldChange {
	field: string;
	before: unknown;
	after: unknown;
}

export interface VersionDiff {
	added: string[];
	removed: string[];
	changed: { code: string; changes: FieldChange[] }[];
	unchanged: number;
}

/** Equal as data: numbers exactly, arrays and points by their JSON, null and undefined alike. */
function same(a: unknown, b: unknown): boolean {
	return JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
}

export function diffVersions(
	previous: readonly SiteValues[],
	current: readonly SiteValues[],
	fields: readonly string[]
): VersionDiff {
	const before = new Map(previous.map((s) => [s.code, s]));
	const after = new Map(current.map((s) => [s.code, s]));
	const byCode = (a: string, b: string) => a.localeCompare(b, 'en');
	const added = [...after.keys()].filter((c) => !before.has(c)).sort(byCode);
	const removed = [...before.keys()].filter((c) => !after.has(c)).sort(byCode);
	const changed: VersionDiff['changed'] = [];
	let unchanged = 0;
	for (const code of [...after.keys()].filter((c) => before.has(c)).sort(byCode)) {
		const old = before.get(code)!;
		const now = after.get(code)!;
		const changes = fields
			.filter((f) => !same(old[f], now[f]))
			.map((f) => ({ field: f, before: old[f] ?? null, after: now[f] ?? null }));
		if (changes.length) changed.push({ code, changes });
		else unchanged++;
	}
	return { added, removed, changed, unchanged };
}

/** A value as the diff table shows it. */
export function diffValue(v: unknown): string {
	if (v === null || v === undefined || v === '') return '—';
	if (Array.isArray(v)) return v.length ? v.join(', ') : '—';
	if (typeof v === 'object' && v && 'lon' in v && 'lat' in v) {
		const p = v as { lon: number; lat: number };
		return `${p.lon}, ${p.lat}`;
	}
	return String(v);
}
