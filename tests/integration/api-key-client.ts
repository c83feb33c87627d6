import { eq } from 'drizzle-orm';
import { Agent, fetch as undiciFetch } from 'undici';
import type { Db } from '../../src/lib/server/db/client';
import { user } from '../../src/lib/server/db/schema';
import { createApiKey } from '../../src/lib/server/repositories/api-keys';
import { testEnv } from './env';
import { ownAddress } from './http';

/** A script with an API key: no cookies, the key in a header, from a loopback address of its own. */
export class KeyClient {
	private readonly dispatcher = new Agent({ localAddress: ownAddress() });

	constructor(
		readonly key: string,
		private readonly header: 'authorization' | 'x-api-key' = 'authorization'
	) {}

	private auth(): Record<string, string> {
		return this.header === 'authorization'
			? { authorization: `Bearer ${this.key}` }
			: { 'x-api-key': this.key };
	}

	fetch(
		pathOrUrl: string,
		init: { method?: string; body?: unknown; headers?: Record<string, string> } = {}
	) {
		const url = new URL(pathOrUrl, testEnv.appUrl());
		return undiciFetch(url, {
			method: init.method ?? 'GET',
			headers: {
				accept: 'application/json',
				...(init.body === undefined ? {} : { 'content-type': 'application/json' }),
				...this.auth(),
				...init.headers
			},
			body: init.body === undefined ? undefined : JSON.stringify(init.body),
			redirect: 'manual',
			dispatcher: this.dispatcher
		}) as unknown as Promise<Response>;
	}
}

/** A key for the account with this e-mail address, made through the repository the account page uses. */
export async function keyFor(
	db: Db,
	email: string,
	scopes: ('read' | 'write')[] = ['read'],
	expiresAt: Date | null = null
) {
	const [owner] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
	const viewer = { userId: owner.id, emailVerified: true, roles: {}, isPlatformAdmin: false };
	return createApiKey(db, viewer, { name: `test ${scopes.join('+')}`, scopes, expiresAt });
}
