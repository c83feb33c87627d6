import { z } from 'zod';
import { apiHandler, jsonAnswer, parseQuery } from '$lib/server/api/http';
import { presentDataset } from '$lib/server/api/presenters';
import { getDb } from '$lib/server/db';
import { datasetById } from '$lib/server/repositories/api';
import type { RequestHandler } from './$types';

/** One dataset with its citation; hidden and unknown ids get the same 404. */
export const GET: RequestHandler = apiHandler(async ({ url, request, locals, params }) => {
	parseQuery(z.strictObject({}), url);
	const row = await datasetById(getDb(), locals.viewer, params.id);
	return jsonAnswer(request, presentDataset(row, url.origin));
});
