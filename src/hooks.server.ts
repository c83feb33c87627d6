import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { ANONYMOUS } from '$lib/server/access';
import { config } from '$lib/server/config';
import { closeDb } from '$lib/server/db';
import { closeMailer } from '$lib/server/mail';

/** Fail at boot, naming the variable, rather than on the first request. */
export const init: ServerInit = async () => {
	config();
	// adapter-node exits once the event loop is empty; open pools would keep it alive after SIGTERM.
	process.once('sveltekit:shutdown', () => {
		void closeDb();
		closeMailer();
	});
};

export const handle: Handle = async ({ event, resolve }) => {
	event.locals.viewer = ANONYMOUS;
	return resolve(event);
};

/** Unexpected errors: log them with an id the user can quote; show nothing internal. */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = crypto.randomUUID();
	if (status !== 404) {
		console.error(`[error ${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	}
	return {
		message: status === 404 ? 'Page not found' : `Something went wrong on our side (${message}).`,
		errorId
	};
};
