import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { svelteKitHandler } from 'better-auth/svelte-kit';
import { auth } from '$lib/server/auth';
import { stampClientAddress } from '$lib/server/auth/client-address';
import { config } from '$lib/server/config';
import { closeDb, getDb } from '$lib/server/db';
import {
	asUnavailable,
	DATABASE_DOWN_MESSAGE,
	databaseDownResponse,
	isDatabaseUnavailable
} from '$lib/server/database-down';
import { jobs, stopJobs } from '$lib/server/jobs/boss';
import { configureMapIndex, loadAll as loadMapIndex } from '$lib/server/map-index/store';
import { workGridQueue } from '$lib/server/jobs/grid-queue';
import { startEmbargoRelease } from '$lib/server/jobs/embargo-release';
import { startHousekeeping } from '$lib/server/jobs/housekeeping';
import { startImportWorker } from '$lib/server/jobs/import-queue';
import { startWorkers } from '$lib/server/jobs/start-workers';
import { closeMailer, sendMail, startMailWorker } from '$lib/server/mail';
import { runtimeCspSources } from '$lib/server/csp-sources';
import { nulRefusal } from '$lib/server/nul-guard';
import { crossOriginRefusal } from '$lib/server/origin-check';
import { withSecurityHeaders } from '$lib/server/security-headers';
import { viewerFor } from '$lib/server/session-viewer';
import { authenticateKey } from '$lib/server/api/key-auth';
import { apiPreflight, isApiPath, withApiCors } from '$lib/server/api/cors';

/** Fail at boot, naming the variable, rather than on the first request. */
export const init: ServerInit = async () => {
	config();
	if (!building) {
		// The map's in-memory site index loads in the background (SQL answers until then); on its
		// own, so a failure here blocks nothing else.
		configureMapIndex({ maxSites: config().THERMALITH_MAP_INDEX_MAX_SITES });
		loadMapIndex(getDb()).catch((err) => console.warn('map index not loaded:', err.message));
	}
	if (!building && config().THERMALITH_WORKERS === 'on') {
		// Queued jobs (mail, the hourly housekeeping, embargo release, grids and imports; the import
		// worker first resumes or ends imports left running) are taken by this process. Each worker
		// starts on its own (one failing start keeps none of the others back) and a failure is
		// logged by name; a queue that is not reachable yet is retried by pg-boss once it is, and
		// must not keep the app from starting.
		const boss = () => jobs(config().DATABASE_URL);
		const origin = config().ORIGIN ?? 'http://127.0.0.1:3000';
		void startWorkers({
			mail: () => startMailWorker(),
			housekeeping: async () => startHousekeeping(await boss(), getDb()),
			grids: async () => workGridQueue(await boss(), getDb()),
			'embargo release': async () => startEmbargoRelease(await boss(), getDb(), sendMail, origin),
			imports: async () => startImportWorker(await boss(), getDb())
		});
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

/** /api/v1 may be called from scripts on other origins, without cookies (api/cors.ts). */
const apiCors: Handle = async ({ event, resolve }) => {
	if (!isApiPath(event.url.pathname)) return resolve(event);
	if (event.request.method === 'OPTIONS') return apiPreflight();
	return withApiCors(await resolve(event));
};

/** PostgreSQL unreachable: 503 with Retry-After instead of a 500 (database-down.ts says why). */
const databaseDown: Handle = async ({ event, resolve }) => {
	try {
		const response = await resolve(event);
		return event.locals.databaseDown && response.status >= 500 ? asUnavailable(response) : response;
	} catch (err) {
		if (!isDatabaseUnavailable(err)) throw err;
		console.error(`database unreachable: ${event.request.method} ${event.url.pathname}`);
		return databaseDownResponse(event.url.pathname);
	}
};

/**
 * Before any work: state-changing requests with cookies must come from this site's pages, and
 * no address may carry a NUL character.
 */
const requestGuards: Handle = async ({ event, resolve }) =>
	crossOriginRefusal(event.request, event.url.origin) ?? nulRefusal(event.url) ?? resolve(event);

const session: Handle = async ({ event, resolve }) => {
	stampClientAddress(event);
	event.locals.apiKey = null;
	// An API key (on /api/v1 and /ogc only) stands for its owner instead of the session cookie.
	const keyed = building ? { kind: 'none' as const } : await authenticateKey(getDb(), event);
	if (keyed.kind === 'refused') return keyed.response;
	if (keyed.kind === 'key') {
		event.locals.user = keyed.key.owner;
		event.locals.session = null;
		event.locals.apiKey = { id: keyed.key.id, scopes: keyed.key.scopes };
		event.locals.viewer = await viewerFor(getDb(), keyed.key.owner);
		return resolve(event);
	}
	const current = building ? null : await auth().api.getSession({ headers: event.request.headers });
	event.locals.user = current?.user ?? null;
	event.locals.session = current?.session ?? null;
	event.locals.viewer = await viewerFor(getDb(), event.locals.user);
	return svelteKitHandler({ event, resolve, auth: auth(), building });
};

export const handle: Handle = sequence(
	securityHeaders,
	apiCors,
	databaseDown,
	requestGuards,
	session
);

/** Unexpected errors: log them with an id the user can quote; show nothing internal. */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = crypto.randomUUID();
	if (isDatabaseUnavailable(error)) {
		// The databaseDown handle turns this answer into a 503.
		event.locals.databaseDown = true;
		console.error(
			`[error ${errorId}] database unreachable: ${event.request.method} ${event.url.pathname}`
		);
		return { message: DATABASE_DOWN_MESSAGE, errorId };
	}
	if (status !== 404) {
		console.error(`[error ${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	}
	return {
		message: status === 404 ? 'Page not found' : `Something went wrong on our side (${message}).`,
		errorId
	};
};
