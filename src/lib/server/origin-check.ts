import { json } from '@sveltejs/kit';

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
	return json(
		{
			message:
				'Cross-site request refused: this address only accepts changes from Thermalith’s own pages.'
		},
		{ status: 403 }
	);
}
