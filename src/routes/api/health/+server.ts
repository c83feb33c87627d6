import { json } from '@sveltejs/kit';
import { version } from '$app/environment';
import { checkHealth, publicHealth } from '$lib/server/health';
import type { RequestHandler } from './$types';

/**
 * Status of PostgreSQL (+ PostGIS), the object store and the mail server; 503 when any is down.
 * Details (versions, errors) only for platform administrators.
 */
export const GET: RequestHandler = async ({ locals }) => {
	const report = await checkHealth(version);
	return json(locals.viewer.isPlatformAdmin ? report : publicHealth(report), {
		status: report.status === 'ok' ? 200 : 503,
		headers: { 'cache-control': 'no-store' }
	});
};
