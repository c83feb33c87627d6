import { json } from '@sveltejs/kit';
import { answersErrorBody, errorBody } from './api/error-body';

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * Refuse a state-changing request that carries cookies but comes from a page of another origin.
 * SvelteKit checks Origin only for form posts; JSON API routes would otherwise rely on SameSite
 * cookies and CORS preflight alone. Requests without an Origin header (curl, server-to-server)
 * are left to authentication, as browsers always send Origin on cross-origin POST/PUT/PATCH/DELETE.
 * Returns the 403 to send, or null to go on.
 */
export function crossOriginRefusal(request: Request, appOrigin: string): Response | null {
	if (!STATE_CHANGING.has(request.method)) return null;
	if (!request.headers.has('cookie')) return null;
	const origin = request.headers.get('origin');
	if (origin === null || origin === appOrigin) return null;
	const message =
		'Cross-site request refused: this address only accepts changes from Thermalith’s own pages.';
	return answersErrorBody(new URL(request.url).pathname)
		? json(errorBody('cross_site_refused', message), { status: 403 })
		: json({ message }, { status: 403 });
}
