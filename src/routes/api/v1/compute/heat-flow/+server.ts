import { heatFlowRequestSchema } from '$lib/api/schemas';
import { computeHeatFlow } from '$lib/server/api/compute';
import { apiHandler, computedAnswer, parseJsonBody } from '$lib/server/api/http';
import type { RequestHandler } from './$types';

/** Heat flow from a posted temperature log and conductivity intervals; stores nothing. */
export const POST: RequestHandler = apiHandler(async ({ request }) =>
	computedAnswer(computeHeatFlow(await parseJsonBody(heatFlowRequestSchema, request)))
);
