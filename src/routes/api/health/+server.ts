import { json } from '@sveltejs/kit';
import { version } from '$app/environment';
import { checkHealth } from '$lib/server/health';
import type { RequestHandler } from './$types';

/** Status of PostgreSQL (+ PostGIS), the object store and the mail server; 503 when any is down. */
export const GET: RequestHandler = async () => {
	const report = await checkHealth(version);
	return json(report, {
		status: report.status === 'ok' ? 200 : 503,
		headers: { 'cache-control': 'no-store' }
	});
};
