// @ts-check
/** Small, dependency-free console helpers for the orchestration scripts (they run before `npm ci`). */

const useColour = process.stdout.isTTY && !process.env.NO_COLOR;
/** @param {string} code @param {string} text */
const paint = (code, text) => (useColour ? `\x1b[${code}m${text}\x1b[0m` : text);

/** @param {string} message */
export function step(message) {
	console.log(`${paint('33', '▸')} ${message}`);
}

/** @param {string} message */
export function ok(message) {
	console.log(`${paint('32', '✓')} ${message}`);
}

/** @param {string} message */
export function warn(message) {
	console.warn(`${paint('33', '!')} ${message}`);
}

/** @param {string} message */
export function failure(message) {
	console.error(`${paint('31', '✗')} ${message}`);
}

/** A problem the user can act on: printed as its message alone, without a stack. */
export class FatalError extends Error {
	/** @param {string} message */
	constructor(message) {
		super(message);
		this.name = 'FatalError';
	}
}

/**
 * Stop the run with a message. It throws instead of exiting so that the orchestrator's one exit
 * path (scripts/lib/orchestrator.js) stops every service this run started first.
 * @param {string} message @returns {never}
 */
export function fatal(message) {
	throw new FatalError(message);
}
