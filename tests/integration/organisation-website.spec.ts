import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { organisation } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { type Client, DEMO_PASSWORD, signIn } from './http';

// Stored XSS through an organisation's website: the rule must hold on better-auth's own endpoints
// (not only the product's form), and the page must never render a non-http(s) address as a link.
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const EVIL = 'javascript:alert(document.cookie)//';
let owner: Client;
let org: { id: string; website: string | null };

beforeAll(async () => {
	owner = await signIn('owner@skarnholt.example', DEMO_PASSWORD);
	[org] = await db
		.select({ id: organisation.id, website: organisation.website })
		.from(organisation)
		.where(eq(organisation.slug, 'skarnholt'));
});
afterAll(async () => {
	await db.update(organisation).set({ website: org.website }).where(eq(organisation.id, org.id));
	await sql.end();
});

describe('organisation website', () => {
	it('is refused with a clear 400 by /api/auth/organization/create', async () => {
		const slug = `xss-${Date.now()}`;
		const res = await owner.api('/organization/create', { name: 'Evil Org', slug, website: EVIL });
		expect(res.status).toBe(400);
		expect((await res.json()).message).toMatch(/https:\/\//);
		const rows = await db.select().from(organisation).where(eq(organisation.slug, slug));
		expect(rows).toEqual([]);
	});

	it('is refused with a clear 400 by /api/auth/organization/update, for website and logo', async () => {
		for (const data of [{ website: EVIL }, { website: ' data:text/html,x' }, { logo: EVIL }]) {
			const res = await owner.api('/organization/update', { organizationId: org.id, data });
			expect(res.status).toBe(400);
			expect((await res.json()).code).toBe('INVALID_WEB_ADDRESS');
		}
		const [after] = await db.select().from(organisation).where(eq(organisation.id, org.id));
		expect(after.website).toBe(org.website);
		expect(after.logo).not.toBe(EVIL);
	});

	it('accepts an https address through the same endpoint', async () => {
		const res = await owner.api('/organization/update', {
			organizationId: org.id,
			data: { website: 'https://skarnholt.example/about' }
		});
		expect(res.status).toBe(200);
	});

	it('is never rendered as a link when an older row holds a javascript: address', async () => {
		await db.update(organisation).set({ website: EVIL }).where(eq(organisation.id, org.id));
		const html = await (await owner.get('/organisations/skarnholt')).text();
		expect(html).toContain('<h1');
		expect(html).not.toMatch(/href="\s*javascript:/i);
		await db
			.update(organisation)
			.set({ website: 'https://skarnholt.example/' })
			.where(eq(organisation.id, org.id));
		const ok = await (await owner.get('/organisations/skarnholt')).text();
		expect(ok).toContain('href="https://skarnholt.example/"');
	});
});
