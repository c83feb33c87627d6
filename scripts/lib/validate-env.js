// @ts-check
/**
 * Check the environment handed to the app before anything starts, with the app's own schema
 * (src/lib/server/env-schema.js), so the scripts and the app never disagree about a variable.
 * Imported after `npm ci` (the schema needs zod).
 */
import { envProblems } from '../../src/lib/server/env-schema.js';
import { fatal } from './log.js';

/** @param {Record<string, string>} env */
export function validateEnvironment(env) {
	const problems = envProblems(env);
	if (problems.length) fatal(`the environment is not usable:\n  - ${problems.join('\n  - ')}`);
}
