import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashKey } from '../../src/lib/server/api/key-secret';
import { USER_RATE_RULES } from '../../src/lib/server/auth/rate-rules';
import { createDb } from '../../src/lib/server/db/client';
import { apiKey, auditEvent } from '../../src/lib/server/db/schema';
import { KeyClient, keyFor } from './api-key-client';
import { createOgcFixture, type OgcFixture } from './ogc-fixture';
import { Client, DEMO_PASSWORD, signIn } from './http';
import { testEnv } from './env';

/*
 * Personal API keys (src/lib/server/api/key-auth.ts): shown once, hashed at rest, scopes, expiry,
 * revocation, the per-key rate limit, and a key seeing what its owner sees and no more.
 */

const MEMBER = 'viewer@korvald-survey.example';
const OUTSIDER = 'owner@lindmark-thermics.example';
const KEY_PATTERN = /thl_[A-Za-z0-9_-]{43}/;

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let fixture: OgcFixture;
let member: Client;

beforeAll(async () => {
	fixture = await createOgcFixture();
	member = await signIn(MEMBER, DEMO_PASSWORD);
});

afterAll(async () => {
	await fixture.close();
	await sql.end();
});

const errorCode = async (res: Response) =>
	((await res.json()) as { error: { code: string } }).error.code;

describe('API keys on the account page', () => {
	it('shows a new key once, stores only its hash, and revokes it', async () => {
		const created = await member.post('/account?/createKey', {
			keyName: 'script at home',
			access: 'read',
			lifetimeDays: '30'
		});
		expect(created.status).toBe(200);
		const key = (await created.text()).match(KEY_PATTERN)?.[0];
		expect(key).toBeDefined();
		const [row] = await db
			.select()
			.from(apiKey)
			.where(eq(apiKey.keyHash, hashKey(key!)));
		expect(row.prefix).toBe(key!.slice(0, 12));
		expect(row.scopes).toEqual(['read']);
		expect(JSON.stringify(row)).not.toContain(key!);
		const audit = await db.select().from(auditEvent).where(eq(auditEvent.action, 'api_key.create'));
		const created_ = audit.find((a) => (a.details as { keyId?: string }).keyId === row.id);
		expect(created_?.actorEmail).toBe(MEMBER);
		expect(JSON.stringify(audit)).not.toContain(key!);
		const days = (row.expiresAt!.getTime() - Date.now()) / 86_400_000;
		expect(days).toBeGreaterThan(29.9);
		expect(days).toBeLessThanOrEqual(30);

		const page = await (await member.get('/account')).text();
		expect(page).not.toContain(key!);
		expect(page).toContain(row.prefix);

		const script = new KeyClient(key!);
		expect((await script.fetch('/api/v1/datasets')).status).toBe(200);
		const [used] = await db.select().from(apiKey).where(eq(apiKey.id, row.id));
		expect(used.lastUsedAt).not.toBeNull();

		await member.post('/account?/revokeKey', { keyId: row.id });
		const refused = await script.fetch('/api/v1/datasets');
		expect(refused.status).toBe(401);
		expect(await errorCode(refused)).toBe('invalid_api_key');
	});

	it("cannot revoke another account's key", async () => {
		const other = await keyFor(db, OUTSIDER);
		const res = await member.post('/account?/revokeKey', { keyId: other.id });
		expect(res.status).toBe(404);
		expect((await new KeyClient(other.key).fetch('/api/v1/datasets')).status).toBe(200);
	});
});

describe('API key checks', () => {
	it('refuses unknown and expired keys with 401, in either header', async () => {
		const expired = await keyFor(db, MEMBER, ['read'], new Date(Date.now() - 1000));
		for (const header of ['authorization', 'x-api-key'] as const) {
			for (const key of [expired.key, 'thl_not-a-key']) {
				const res = await new KeyClient(key, header).fetch('/api/v1/sites?limit=1');
				expect(res.status).toBe(401);
				expect(await errorCode(res)).toBe('invalid_api_key');
			}
		}
		// The same keys on /ogc.
		expect((await new KeyClient(expired.key).fetch('/ogc/collections')).status).toBe(401);
	});

	it('a read key cannot write; a write key can; both may compute', async () => {
		const read = new KeyClient((await keyFor(db, MEMBER, ['read'])).key);
		const write = new KeyClient((await keyFor(db, MEMBER, ['read', 'write'])).key, 'x-api-key');
		const announce = { datasetId: fixture.draft.dataset, fileName: 'notes.txt', sizeBytes: 10 };
		const refused = await read.fetch('/api/v1/attachments', { method: 'POST', body: announce });
		expect(refused.status).toBe(403);
		expect(await errorCode(refused)).toBe('insufficient_scope');
		// The write key gets past the scope check to the access layer: a viewer may not upload.
		const passed = await write.fetch('/api/v1/attachments', { method: 'POST', body: announce });
		expect(passed.status).toBe(403);
		expect(await passed.text()).not.toContain('insufficient_scope');
		const log = {
			depthM: [0, 100, 200, 300],
			temperatureC: [10, 13, 16, 19],
			conductivity: [{ topM: 0, bottomM: 300, conductivityWmK: 2 }],
			method: 'interval'
		};
		const computed = await read.fetch('/api/v1/compute/heat-flow', { method: 'POST', body: log });
		expect(computed.status).toBe(200);
		// 30 K/km × 2 W/m/K = 60 mW/m² (q = k dT/dz; common practice, no source).
		expect((await computed.json()).heatFlowMWm2).toBeCloseTo(60, 6);
	});

	it('answers 429 with Retry-After past the key rate, and counts each key alone', async () => {
		const limited = await keyFor(db, MEMBER);
		await db.update(apiKey).set({ ratePerMinute: 3 }).where(eq(apiKey.id, limited.id));
		const script = new KeyClient(limited.key);
		for (let i = 0; i < 3; i++)
			expect((await script.fetch('/api/v1/organisations')).status).toBe(200);
		const over = await script.fetch('/api/v1/organisations');
		expect(over.status).toBe(429);
		expect(await errorCode(over)).toBe('rate_limited');
		const retry = Number(over.headers.get('retry-after'));
		expect(Number.isInteger(retry) && retry >= 1 && retry <= 60).toBe(true);
		const other = new KeyClient((await keyFor(db, MEMBER)).key);
		expect((await other.fetch('/api/v1/organisations')).status).toBe(200);
	});

	it('limits computations per caller, signed out by client address (429 + Retry-After)', async () => {
		const caller = new Client();
		const log = {
			depthM: [0, 100, 200],
			temperatureC: [10, 13, 16],
			conductivity: [{ topM: 0, bottomM: 200, conductivityWmK: 2 }],
			method: 'interval'
		};
		const statuses: number[] = [];
		for (let i = 0; i < USER_RATE_RULES.computation.max; i++)
			statuses.push((await caller.json('/api/v1/compute/heat-flow', log)).status);
		expect(statuses.every((s) => s === 200)).toBe(true);
		const over = await caller.json('/api/v1/compute/heat-flow', log);
		expect(over.status).toBe(429);
		expect(Number(over.headers.get('retry-after'))).toBeGreaterThanOrEqual(1);
		expect(await errorCode(over)).toBe('rate_limited');
		// Another address is counted alone.
		expect((await new Client().json('/api/v1/compute/heat-flow', log)).status).toBe(200);
	});

	it('is not honoured outside /api/v1 and /ogc (a page stays signed out)', async () => {
		const script = new KeyClient((await keyFor(db, MEMBER, ['read', 'write'])).key);
		const res = await script.fetch('/account', { headers: { accept: 'text/html' } });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/sign-in/);
	});
});

describe('a key sees what its owner sees', () => {
	it('lists the same datasets as the owner’s session, and an outsider’s key fewer', async () => {
		const ids = async (res: Response) =>
			((await res.json()).items as { id: string }[]).map((d) => d.id).sort();
		const memberKey = new KeyClient((await keyFor(db, MEMBER)).key);
		const outsiderKey = new KeyClient((await keyFor(db, OUTSIDER)).key);
		const viaKey = await ids(await memberKey.fetch('/api/v1/datasets?limit=1000'));
		const viaSession = await ids(
			await member.json('/api/v1/datasets?limit=1000', undefined, 'GET')
		);
		expect(viaKey).toEqual(viaSession);
		expect(viaKey).toContain(fixture.hidden.dataset);
		const outsider = await ids(await outsiderKey.fetch('/api/v1/datasets?limit=1000'));
		expect(outsider).not.toContain(fixture.hidden.dataset);
		expect(outsider).toContain(fixture.open.dataset);
		// /ogc too: the private dataset's sites are on the member's map only.
		const items = async (k: KeyClient) =>
			(
				(await (await k.fetch(`/ogc/collections/sites/items?bbox=140,70,141,71&limit=1000`)).json())
					.features as {
					id: string;
				}[]
			).map((f) => f.id);
		expect(await items(memberKey)).toContain(fixture.hidden.sites[0]);
		expect(await items(outsiderKey)).not.toContain(fixture.hidden.sites[0]);
	});

	it('a script pages through every site it may see, each once, as many as the map shows', async () => {
		const script = new KeyClient((await keyFor(db, MEMBER)).key);
		const seen: string[] = [];
		let next: string | null = null;
		let pages = 0;
		do {
			const query = new URLSearchParams({ limit: '7', f: 'json', bbox: '140,70,141,71' });
			if (next) query.set('cursor', next);
			const res = await script.fetch(`/api/v1/sites?${query}`);
			expect(res.status).toBe(200);
			const body = (await res.json()) as { items: { id: string }[]; next: string | null };
			seen.push(...body.items.map((s) => s.id));
			next = body.next;
			pages++;
		} while (next !== null && pages < 1000);
		expect(new Set(seen).size).toBe(seen.length);
		// The map (the owner's browser session) for the same box.
		const map = await member.json('/api/v1/sites.geojson?bbox=140,70,141,71', undefined, 'GET');
		const onMap = ((await map.json()).features as { id: string }[]).map((f) => f.id);
		expect(seen.sort()).toEqual(onMap.sort());
		expect(pages).toBeGreaterThan(3);
		expect(seen).toEqual(expect.arrayContaining([...fixture.hidden.sites, ...fixture.draft.sites]));
	});
});
