import { apiHandler, jsonAnswer } from '$lib/server/api/http';
import { openApiDocument } from '$lib/server/api/openapi';
import type { RequestHandler } from './$types';

/** The OpenAPI 3.1 document of /api/v1, generated from the route schemas. */
export const GET: RequestHandler = apiHandler(async ({ request }) =>
	jsonAnswer(request, openApiDocument())
);
