import { geothermRequestSchema } from '$lib/api/schemas';
import { computeGeotherm } from '$lib/server/api/compute';
import { apiHandler, computedAnswer, limitCaller, parseJsonBody } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** A geotherm with its P10–P90 band for a posted crustal model; stores nothing. */
export const POST: RequestHandler = apiHandler(async (event) => {
	await limitCaller(getDb(), event, 'computation');
	return computedAnswer(computeGeotherm(await parseJsonBody(geothermRequestSchema, event.request)));
});
