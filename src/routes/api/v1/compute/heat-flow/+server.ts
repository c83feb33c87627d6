import { heatFlowRequestSchema } from '$lib/api/schemas';
import { computeHeatFlow } from '$lib/server/api/compute';
import { apiHandler, computedAnswer, limitCaller, parseJsonBody } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** Heat flow from a posted temperature log and conductivity intervals; stores nothing. */
export const POST: RequestHandler = apiHandler(async (event) => {
	await limitCaller(getDb(), event, 'computation');
	return computedAnswer(computeHeatFlow(await parseJsonBody(heatFlowRequestSchema, event.request)));
});
