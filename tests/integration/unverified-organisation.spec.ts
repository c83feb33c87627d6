import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { invitation, member, organisation, user } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { type Client, DEMO_PASSWORD, mailFor, signIn } from './http';

// Finding 14: an account whose e-mail address is not confirmed must not create an organisation
// nor send invitation mails in an organisation's name, on better-auth's own endpoints and
// through the product's forms. A demo owner is made unconfirmed for the time of this file.
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const EMAIL = 'owner@lindmark-thermics.example';
let owner: Client;
let userId: string;
let org: { id: string; slug: string };

async function setConfirmed(value: boolean) {
	await db.update(user).set({ emailVerified: value }).where(eq(user.id, userId));
}

beforeAll(async () => {
	[{ id: userId }] = await db.select({ id: user.id }).from(user).where(eq(user.email, EMAIL));
	[org] = await db
		.select({ id: organisation.id, slug: organisation.slug })
		.from(member)
		.innerJoin(organisation, eq(organisation.id, member.organizationId))
		.where(and(eq(member.userId, userId), eq(member.role, 'owner')))
		.limit(1);
	owner = await signIn(EMAIL, DEMO_PASSWORD);
	await setConfirmed(false);
});
afterAll(async () => {
	await setConfirmed(true);
	await sql.end();
});

const invitationsTo = (email: string) =>
	db.select().from(invitation).where(eq(invitation.email, email));

describe('an unconfirmed account', () => {
	it('cannot create an organisation through /api/auth/organization/create', async () => {
		const slug = `unconfirmed-${Date.now()}`;
		const res = await owner.api('/organization/create', { name: 'Anyone Ltd', slug });
		expect(res.status).toBe(403);
		expect(await db.select().from(organisation).where(eq(organisation.slug, slug))).toEqual([]);
	});

	it('is told so by the create form, before and after submitting', async () => {
		const page = await (await owner.get('/organisations/new')).text();
		expect(page).toContain('Confirm your e-mail address before you create an organisation.');
		const slug = `unconfirmed-form-${Date.now()}`;
		const res = await owner.post('/organisations/new', { name: 'Anyone Ltd', slug });
		expect(res.status).toBe(403);
		expect(await res.text()).toContain(
			'Confirm your e-mail address before you create an organisation.'
		);
		expect(await db.select().from(organisation).where(eq(organisation.slug, slug))).toEqual([]);
	});

	it('cannot send invitations, neither through the API nor the settings form', async () => {
		const viaApi = `unconfirmed-api-${Date.now()}@example.org`;
		const res = await owner.api('/organization/invite-member', {
			organizationId: org.id,
			email: viaApi,
			role: 'viewer'
		});
		expect(res.status).toBe(403);
		expect((await res.json()).code).toBe('EMAIL_NOT_CONFIRMED');

		const viaForm = `unconfirmed-form-${Date.now()}@example.org`;
		const form = await owner.post(`/organisations/${org.slug}/settings?/invite`, {
			email: viaForm,
			role: 'viewer'
		});
		expect(form.status).toBe(403);
		expect(await form.text()).toContain('Confirm your e-mail address before you invite people.');

		for (const address of [viaApi, viaForm]) {
			expect(await invitationsTo(address)).toEqual([]);
			expect(await mailFor(address)).toEqual([]);
		}
	});

	it('may do both once the address is confirmed', async () => {
		await setConfirmed(true);
		try {
			const address = `confirmed-${Date.now()}@example.org`;
			const res = await owner.api('/organization/invite-member', {
				organizationId: org.id,
				email: address,
				role: 'viewer'
			});
			expect(res.status).toBe(200);
			expect(await invitationsTo(address)).toHaveLength(1);
			await db.delete(invitation).where(eq(invitation.email, address));
		} finally {
			await setConfirmed(false);
		}
	});
});
