/**
 * The words of an /api/v1 refusal for people, read from the one error body
 * (`{ "error": { "code", "message", "details" } }`, server/api/error-body.ts). Browser code that
 * calls the API shows failures through these, so no caller digs in the body itself.
 */

/** The message of a parsed error body, or `fallback` when the body is not one. */
export function errorMessageOf(body: unknown, fallback: string): string {
	const message = (body as { error?: { message?: unknown } } | null)?.error?.message;
	return typeof message === 'string' && message !== '' ? message : fallback;
}

/** The message of a failed answer (reads its body), or its status line. */
export async function apiErrorMessage(res: Response): Promise<string> {
	const body = await res.json().catch(() => null);
	return errorMessageOf(body, `${res.status} ${res.statusText}`.trim());
}
