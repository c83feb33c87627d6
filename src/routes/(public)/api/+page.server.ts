import { buildReference } from '$lib/api/reference';
import { openApiDocument } from '$lib/server/api/openapi';
import type { PageServerLoad } from './$types';

/** The API reference, read from the generated OpenAPI document (the one /api/v1/openapi.json serves). */
export const load: PageServerLoad = () => ({ reference: buildReference(openApiDocument()) });
