// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
		}
		interface Locals {
			viewer: import('$lib/server/access').Viewer;
			user: import('$lib/server/auth/create-auth').Auth['$Infer']['Session']['user'] | null;
			session: import('$lib/server/auth/create-auth').Auth['$Infer']['Session']['session'] | null;
			/** Set by handleError when PostgreSQL was unreachable; the response becomes a 503. */
			databaseDown?: boolean;
			/** The API key a request came with (then `session` is null), or null. */
			apiKey: { id: string; scopes: string[] } | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
