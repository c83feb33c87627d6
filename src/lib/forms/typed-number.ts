/**
 * Numbers as people type them into a form. A decimal comma is read as a decimal point when that
 * is unambiguous ("2,5"); "1,250" could be either 1.25 or 1250, so it is refused with a sentence
 * rather than guessed. No thousands separators: the fields here (depths, temperatures,
 * conductivities) are short numbers. Blank is "not given" (null).
 */
export type TypedNumber = { ok: true; value: number | null } | { ok: false; message: string };

const PLAIN = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;
const COMMA = /^[-+]?\d*,(\d+)$/;

export function readTypedNumber(text: string): TypedNumber {
	const t = text.trim().replace(/\u2212/g, '-');
	if (t === '') return { ok: true, value: null };
	let value: number;
	if (PLAIN.test(t)) value = Number(t);
	else {
		const comma = COMMA.exec(t);
		if (!comma) return { ok: false, message: 'Enter a number, such as 2.5 or 2,5.' };
		if (comma[1].length === 3 && /^[-+]?\d/.test(t))
			return {
				ok: false,
				message: `“${t}” could mean ${t.replace(',', '.')} or ${t.replace(',', '')}: write it with a point, or without the comma.`
			};
		value = Number(t.replace(',', '.'));
	}
	if (!Number.isFinite(value)) return { ok: false, message: 'Enter a number of ordinary size.' };
	return { ok: true, value };
}

/**
 * A computation's requirement ("must be > 0", "must be >= 0") in words for a form, with what the
 * user entered: "must be greater than 0 (you entered −5)".
 */
export function requirementInWords(requirement: string, entered: unknown): string {
	const words = requirement
		.replace(/>=\s*/g, 'at least ')
		.replace(/<=\s*/g, 'at most ')
		.replace(/>\s*/g, 'greater than ')
		.replace(/<\s*/g, 'less than ')
		.replace(/\s*;.*$/, '');
	const shown = typeof entered === 'number' && Number.isFinite(entered) ? String(entered) : null;
	return shown === null ? words : `${words} (you entered ${shown.replace('-', '\u2212')})`;
}

/** A form field's live check for a number typed by a person (blank is allowed: the form says if it is required). */
export function typedNumberCheck(text: string): string | undefined {
	const r = readTypedNumber(text);
	return r.ok ? undefined : r.message;
}
