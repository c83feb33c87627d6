import type { ParamMatcher } from '@sveltejs/kit';
import { isUuid } from '$lib/uuid';

/** `[id=uuid]`: anything else is not a route at all (404 before any database query). */
export const match: ParamMatcher = (param) => isUuid(param);
