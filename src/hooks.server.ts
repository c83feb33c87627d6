import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { svelteKitHandler } from 'better-auth/svelte-kit';
import { auth } from '$lib/server/auth';
import { stampClientAddress } from '$lib/server/auth/client-address';
import { config } from '$lib/server/config';
import { closeDb, getDb } from '$lib/server/db';
import { failStaleImports } from '$lib/server/imports/stale';
import { jobs, stopJobs } from '$lib/server/jobs/boss';
import { startHousekeeping } from '$lib/server/jobs/housekeeping';
import { startImportWorker } from '$lib/server/jobs/import-queue';
import { closeMailer, startMailWorker } from '$lib/server/mail';
import { runtimeCspSources } from '$lib/server/csp-sources';
import { nulRefusal } from '$lib/server/nul-guard';
import { crossOriginRefusal } from '$lib/server/origin-check';
import { withSecurityHeaders } from '$lib/server/security-headers';
import { viewerFor } from '$lib/server/session-viewer';

/** Fail at boot, naming the variable, rather than on the first request. */
export const init: ServerInit = async () => {
	config();
	if (!building) {
		// Housekeeping only: a database that is not up yet must not keep the app from starting.
		await failStaleImports(getDb())
			.then((stale) => stale && console.warn(`${stale} interrupted import(s) marked as failed`))
			.catch((err) => console.warn('could not check for interrupted imports:', err.message));
	}
	if (!building && config().THERMALITH_WORKERS === 'on') {
		// Queued jobs (mail, the hourly housekeeping, imports) are taken by this process; a queue that is not reachable yet is retried
		// by pg-boss once it is, and must not keep the app from starting.
		startMailWorker()
			.then(async () => {
				const boss = await jobs(config().DATABASE_URL);
				await startHousekeeping(boss, getDb());
				await startImportWorker(boss, getDb());
			})
			.catch((err) => console.warn('job workers not started:', err.message));
	}
	// adapter-node exits once the event loop is empty; open pools would keep it alive after SIGTERM.
	process.once('sveltekit:shutdown', () => {
		void stopJobs().finally(() => {
			void closeDb();
			closeMailer();
		});
	});
};

/** Outermost: every response, including better-auth's and early refusals, gets the security headers. */
const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (building) return response;
	return withSecurityHeaders(response, {
		https: event.url.protocol === 'https:' || (config().ORIGIN ?? '').startsWith('https://'),
		extraSources: runtimeCspSources(),
		private: Boolean(event.locals.user) || event.url.pathname.startsWith('/api/auth/')
	});
};

/**
 * Before any work: state-changing requests with cookies must come from this site's pages, and
 * no address may carry a NUL character.
 */
const requestGuards: Handle = async ({ event, resolve }) =>
	crossOriginRefusal(event.request, event.url.origin) ?? nulRefusal(event.url) ?? resolve(event);

const session: Handle = async ({ event, resolve }) => {
	stampClientAddress(event);
	const current = building ? null : await auth().api.getSession({ headers: event.request.headers });
	event.locals.user = current?.user ?? null;
	event.locals.session = current?.session ?? null;
	event.locals.viewer = await viewerFor(getDb(), event.locals.user);
	return svelteKitHandler({ event, resolve, auth: auth(), building });
};

export const handle: Handle = sequence(securityHeaders, requestGuards, session);

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
