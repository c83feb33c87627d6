import { Agent, fetch as undiciFetch } from 'undici';
import { testEnv } from './env';

/**
 * Every loopback address (127.0.0.0/8) is this machine, so each test client can connect from one of
 * its own, as different people's browsers do. Per-address limits (sign-in, sign-up, reset mails)
 * then count each client alone, and a test that exhausts a limit does not block the next one.
 * A random start keeps two test files apart.
 */
let nextAddress = Math.floor(Math.random() * 2 ** 22);
export function ownAddress(): string {
	const n = nextAddress++;
	return `127.${1 + ((n >> 16) % 200)}.${(n >> 8) & 255}.${2 + ((n & 255) % 252)}`;
}

/**
 * A minimal browser stand-in for form posts: keeps cookies, sends the Origin header SvelteKit's
 * CSRF check wants, and never follows redirects so tests can assert them. It connects from a
 * loopback address of its own (or `from`), as a browser on another computer would.
 */
export class Client {
	private cookies = new Map<string, string>();
	private readonly dispatcher: Agent;

	readonly address: string;

	constructor(options: { from?: string } = {}) {
		this.address = options.from ?? ownAddress();
		this.dispatcher = new Agent({ localAddress: this.address });
	}

	private fetch(url: string, init: RequestInit): Promise<Response> {
		return undiciFetch(url, {
			...(init as Parameters<typeof undiciFetch>[1]),
			dispatcher: this.dispatcher
		}) as unknown as Promise<Response>;
	}

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

	async get(path: string, method: 'GET' | 'HEAD' = 'GET'): Promise<Response> {
		const res = await this.fetch(testEnv.appUrl() + path, {
			method,
			headers: { cookie: this.cookieHeader(), accept: 'text/html' },
			redirect: 'manual'
		});
		this.remember(res);
		return res;
	}

	/** POST a form to a page action (`?/name`) or default action, as a browser without JavaScript. */
	async post(path: string, fields: Record<string, string>): Promise<Response> {
		const res = await this.fetch(testEnv.appUrl() + path, {
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
	async api(
		path: string,
		body: unknown,
		extraHeaders: Record<string, string> = {}
	): Promise<Response> {
		const res = await this.fetch(`${testEnv.appUrl()}/api/auth${path}`, {
			method: 'POST',
			headers: {
				...extraHeaders,
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
		const res = await this.fetch(testEnv.appUrl() + path, {
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

	/** PUT raw bytes to an app route with this client's session, as the browser's upload does. */
	async put(path: string, bytes: Uint8Array): Promise<Response> {
		const res = await this.fetch(testEnv.appUrl() + path, {
			method: 'PUT',
			headers: {
				'content-type': 'application/octet-stream',
				origin: testEnv.appUrl(),
				cookie: this.cookieHeader()
			},
			body: new Uint8Array(bytes),
			redirect: 'manual'
		});
		this.remember(res);
		return res;
	}

	/** PUT a body that is still being produced (a slow upload), with this client's session. */
	async putStream(path: string, body: ReadableStream<Uint8Array>): Promise<Response> {
		const res = await this.fetch(testEnv.appUrl() + path, {
			method: 'PUT',
			headers: {
				'content-type': 'application/octet-stream',
				origin: testEnv.appUrl(),
				cookie: this.cookieHeader()
			},
			body,
			duplex: 'half',
			redirect: 'manual'
		} as RequestInit);
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

/**
 * Wait for the `nth` message (1 = the first) to an address whose subject starts with a prefix;
 * mail is sent after the answer, in the background. The test's own timeout bounds the wait.
 */
export async function waitForMail(address: string, subjectStartsWith: string, nth = 1) {
	const deadline = Date.now() + 120_000;
	while (Date.now() < deadline) {
		const found = (await mailFor(address)).filter((m) => m.subject.startsWith(subjectStartsWith));
		// mailFor lists newest first.
		if (found.length >= nth) return found[found.length - nth];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no "${subjectStartsWith}" mail no. ${nth} for ${address}`);
}

/** The first link to the app in a plain-text message. */
export function linkIn(text: string): URL {
	const match = text.match(/https?:\/\/\S+/);
	if (!match) throw new Error(`no link in message: ${text}`);
	return new URL(match[0]);
}

export const DEMO_PASSWORD = 'korvald-demo-2026';
