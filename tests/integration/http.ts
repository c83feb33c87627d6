import { testEnv } from './env';

/**
 * A minimal browser stand-in for form posts: keeps cookies, sends the Origin header SvelteKit's
 * CSRF check wants, and never follows redirects so tests can assert them.
 */
export class Client {
	private cookies = new Map<string, string>();

	private cookieHeader() {
		return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	}

	private remember(res: Response) {
		for (const line of res.headers.getSetCookie()) {
			const [pair, ...attrs] = line.split(';');
			const eq = pair.indexOf('=');
			const name = pair.slice(0, eq).trim();
			const value = pair.slice(eq + 1).trim();
			const expired = attrs.some((a) => /max-age=0\b/i.test(a.trim()));
			if (expired || value === '') this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}

	async get(path: string): Promise<Response> {
		const res = await fetch(testEnv.appUrl() + path, {
			headers: { cookie: this.cookieHeader(), accept: 'text/html' },
			redirect: 'manual'
		});
		this.remember(res);
		return res;
	}

	/** POST a form to a page action (`?/name`) or default action, as a browser without JavaScript. */
	async post(path: string, fields: Record<string, string>): Promise<Response> {
		const res = await fetch(testEnv.appUrl() + path, {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				origin: testEnv.appUrl(),
				cookie: this.cookieHeader(),
				// Without it SvelteKit answers a form post with its JSON envelope (status 200).
				accept: 'text/html'
			},
			body: new URLSearchParams(fields).toString(),
			redirect: 'manual'
		});
		this.remember(res);
		return res;
	}

	/** POST JSON to a better-auth endpoint under /api/auth, as its browser client would. */
	async api(path: string, body: unknown): Promise<Response> {
		const res = await fetch(`${testEnv.appUrl()}/api/auth${path}`, {
			method: 'POST',
			headers: {
				'content-type': 'application/json',
				origin: testEnv.appUrl(),
				cookie: this.cookieHeader(),
				// Without it SvelteKit answers a form post with its JSON envelope (status 200).
				accept: 'text/html'
			},
			body: JSON.stringify(body),
			redirect: 'manual'
		});
		this.remember(res);
		return res;
	}

	/** Send JSON to an app API route with this client's session (`headers` override, e.g. origin). */
	async json(
		path: string,
		body?: unknown,
		method = 'POST',
		headers: Record<string, string> = {}
	): Promise<Response> {
		const res = await fetch(testEnv.appUrl() + path, {
			method,
			headers: {
				'content-type': 'application/json',
				origin: testEnv.appUrl(),
				cookie: this.cookieHeader(),
				...headers
			},
			body: body === undefined ? undefined : JSON.stringify(body),
			redirect: 'manual'
		});
		this.remember(res);
		return res;
	}

	get signedIn() {
		return [...this.cookies.keys()].some((k) => k.includes('session_token'));
	}
}

/** Sign in through the sign-in form; throws unless it redirects with a session cookie. */
export async function signIn(email: string, password: string): Promise<Client> {
	const client = new Client();
	const res = await client.post('/sign-in', { email, password });
	if (res.status !== 303 || !client.signedIn) {
		throw new Error(
			`sign-in as ${email} failed with ${res.status}: ${(await res.text()).slice(0, 200)}`
		);
	}
	return client;
}

/** Messages the mail catcher holds for an address, newest first. */
export async function mailFor(
	address: string
): Promise<{ subject: string; text: string; html: string }[]> {
	const res = await fetch(
		`${testEnv.mailViewerUrl()}/api/messages?to=${encodeURIComponent(address)}`
	);
	return res.json();
}

/** Wait (up to 10 s) for a message to an address whose subject starts with a prefix; some are sent in the background. */
export async function waitForMail(address: string, subjectStartsWith: string) {
	for (let i = 0; i < 50; i++) {
		const found = (await mailFor(address)).find((m) => m.subject.startsWith(subjectStartsWith));
		if (found) return found;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`no "${subjectStartsWith}" mail for ${address}`);
}

/** The first link to the app in a plain-text message. */
export function linkIn(text: string): URL {
	const match = text.match(/https?:\/\/\S+/);
	if (!match) throw new Error(`no link in message: ${text}`);
	return new URL(match[0]);
}

export const DEMO_PASSWORD = 'korvald-demo-2026';
