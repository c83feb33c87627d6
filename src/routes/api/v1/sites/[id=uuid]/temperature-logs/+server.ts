import { z } from 'zod';
import { apiHandler, jsonAnswer, parseQuery } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { siteTemperatureLogs } from '$lib/server/repositories/api';
import type { RequestHandler } from './$types';

/** The temperature logs of a site the caller may see (depths in m, temperatures in °C). */
export const GET: RequestHandler = apiHandler(async ({ url, request, locals, params }) => {
	parseQuery(z.strictObject({}), url);
	const logs = await siteTemperatureLogs(getDb(), locals.viewer, params.id);
	return jsonAnswer(request, {
		items: logs.map((l) => ({ ...l, createdAt: l.createdAt.toISOString() }))
	});
});
