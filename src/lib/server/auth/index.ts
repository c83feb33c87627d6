import { getRequestEvent } from '$app/server';
import { sveltekitCookies } from 'better-auth/svelte-kit';
import { config } from '../config';
import { getDb } from '../db';
import { sendMail } from '../mail';
import { createAuth, type Auth } from './create-auth';

let instance: Auth | undefined;

/** The app's better-auth instance (created on first use from the validated environment). */
export function auth(): Auth {
	if (instance) return instance;
	const c = config();
	instance = createAuth({
		db: getDb(),
		secret: c.BETTER_AUTH_SECRET,
		baseURL: c.ORIGIN ?? 'http://127.0.0.1:3000',
		production: c.THERMALITH_PROFILE === 'production' || c.THERMALITH_PROFILE === 'start',
		send: (to, mail) => sendMail({ to, ...mail }),
		// Lets form actions that call auth.api.* set the session cookie on SvelteKit's response.
		extraPlugins: [sveltekitCookies(getRequestEvent)]
	});
	return instance;
}
