// Angles as people type them into spreadsheets: decimal degrees (with a decimal point or comma)
// and degrees-minutes-seconds with symbols, letters or spaces, with a hemisphere letter or a sign.

export type AngleResult = { ok: true; degrees: number } | { ok: false; error: string };

const HEMI_SIGN: Record<string, number> = { N: 1, E: 1, S: -1, W: -1 };

/**
 * Parses one latitude or longitude in degrees: `-7.5`, `7,5`, `59°12'30.5"N`, `59 12 30.5 N`,
 * `N 59 12.5`, `7°30'W`, `59:12:30`, `59d12m30s`. Checks minutes/seconds < 60 and the ±90°/±180° range.
 */
export function parseAngle(text: string, axis: 'lat' | 'lon'): AngleResult {
	const raw = text.trim();
	if (raw === '') return { ok: false, error: 'is empty' };
	let s = raw
		.toUpperCase()
		.replace(/[′’‘`´]/g, "'")
		.replace(/[″“”]|''/g, '"')
		.replace(/º|˚|DEG\b/g, '°')
		.replace(/−/g, '-');
	// Letter form 59d12m30s[N]: turn the letters into symbols first, so the seconds "s" is no "S"outh.
	if (/\dD/.test(s))
		s = s
			.replace(/(\d)\s*D\s*/, '$1°')
			.replace(/(\d)\s*M\s*/, "$1'")
			.replace(/(\d)\s*S(?=\s*[NSEW]?$)/, '$1"');
	// Hemisphere letter at the start or the end: only N/S/E/W.
	let hemi: string | null = null;
	const lead = /^([NSEW])\s*/.exec(s);
	const trail = /\s*([NSEW])$/.exec(s);
	if (lead && trail && s.length > 1) return { ok: false, error: 'has two hemisphere letters' };
	if (lead) {
		hemi = lead[1];
		s = s.slice(lead[0].length);
	} else if (trail) {
		hemi = trail[1];
		s = s.slice(0, s.length - trail[0].length);
	}
	if (hemi && ((axis === 'lat' && 'EW'.includes(hemi)) || (axis === 'lon' && 'NS'.includes(hemi))))
		return {
			ok: false,
			error: `has hemisphere ${hemi}, which is not a ${axis === 'lat' ? 'latitude' : 'longitude'}`
		};
	let sign = 1;
	const signMatch = /^([+-])\s*/.exec(s);
	if (signMatch) {
		sign = signMatch[1] === '-' ? -1 : 1;
		s = s.slice(signMatch[0].length);
	}
	if (hemi && signMatch && sign < 0)
		return { ok: false, error: 'has both a minus sign and a hemisphere letter' };
	// Components separated by °, ', ", D/M/S letters, colons or whitespace.
	const parts = s.split(/[°'":\s]+/).filter(Boolean);
	if (parts.length === 0 || parts.length > 3) return { ok: false, error: 'is not an angle' };
	const nums: number[] = [];
	for (let i = 0; i < parts.length; i++) {
		let p = parts[i];
		// A decimal comma is allowed in the last component only ("59 12 30,5", "7,5").
		if (i === parts.length - 1 && /^\d+,\d+$/.test(p)) p = p.replace(',', '.');
		if (!/^\d+(\.\d+)?$|^\.\d+$/.test(p)) return { ok: false, error: 'is not an angle' };
		if (i < parts.length - 1 && p.includes('.'))
			return { ok: false, error: 'has a fraction before the last component' };
		nums.push(Number(p));
	}
	const [d, m = 0, sec = 0] = nums;
	if (m >= 60) return { ok: false, error: `has minutes ${m} ≥ 60` };
	if (sec >= 60) return { ok: false, error: `has seconds ${sec} ≥ 60` };
	const value = sign * (hemi ? HEMI_SIGN[hemi] : 1) * (d + m / 60 + sec / 3600);
	const limit = axis === 'lat' ? 90 : 180;
	if (Math.abs(value) > limit)
		return {
			ok: false,
			error: `is outside ±${limit}° for a ${axis === 'lat' ? 'latitude' : 'longitude'}`
		};
	return { ok: true, degrees: value };
}
