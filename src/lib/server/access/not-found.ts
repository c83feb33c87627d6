import { error } from '@sveltejs/kit';
import { isUuid } from '../../uuid';

/**
 * THE answer for an id that does not exist AND for one the viewer may not see: the same status
 * and the same words for datasets, sites, files and imports, so nobody can tell a hidden id from
 * an unknown one. (A malformed id matches no route and gets the generic 404 of hooks.server.ts.)
 */
export const NOT_FOUND_MESSAGE = 'Not found: it does not exist or is not shared with you.';

export function notFound(): never {
	error(404, NOT_FOUND_MESSAGE);
}

/** Repositories check ids too (not only the route matcher): PostgreSQL would answer 500 otherwise. */
export function requireUuid(id: string): void {
	if (!isUuid(id)) notFound();
}
