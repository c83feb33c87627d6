import type { z } from 'zod';

export type FieldErrors = Record<string, string>;

export type FormResult<T> =
	{ ok: true; data: T } | { ok: false; errors: FieldErrors; values: Record<string, string> };

/** The submitted text fields (never passwords), to show a refused form again as it was. */
export function formValues(form: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [key, value] of form.entries())
		if (typeof value === 'string' && !/password/i.test(key)) values[key] = value;
	return values;
}

/**
 * Validate a submitted form with a zod schema. On failure, return one message per field and the
 * submitted values (never passwords) so the page can show them again.
 */
export function parseForm<S extends z.ZodType>(schema: S, form: FormData): FormResult<z.infer<S>> {
	const raw: Record<string, string> = {};
	for (const [key, value] of form.entries()) if (typeof value === 'string') raw[key] = value;
	const result = schema.safeParse(raw);
	if (result.success) return { ok: true, data: result.data };
	const errors: FieldErrors = {};
	for (const issue of result.error.issues) {
		const key = String(issue.path[0] ?? 'form');
		errors[key] ??= issue.message;
	}
	const values = Object.fromEntries(Object.entries(raw).filter(([k]) => !/password/i.test(k)));
	return { ok: false, errors, values };
}
