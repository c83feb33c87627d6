import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { member, user, verification } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, linkIn, mailFor, ownAddress, signIn, waitForMail } from './http';

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
afterAll(async () => {
	await sql.end();
});

async function newAccount(prefix: string) {
	const email = `${prefix}-${Date.now()}@example.test`;
	const password = 'correct-horse-battery';
	const res = await new Client().post('/sign-up', {
		name: 'Test Person',
		email,
		password,
		confirm: password
	});
	expect(res.status).toBe(303);
	return { email, password };
}

const wrongPasswordPost = (email: string, i: number, from?: string) =>
	new Client({ from }).post('/sign-in', { email, password: `wrong-password-${i}` });

describe('abuse and edge cases', () => {
	it('counts concurrent wrong passwords: of 20 at once, at most 5 are checked', async () => {
		const { email, password } = await newAccount('concurrent');
		// From two addresses, so the per-address request limit (20 a minute) is not what stops them.
		const [a, b] = [ownAddress(), ownAddress()];
		const answers = await Promise.all(
			Array.from({ length: 20 }, (_, i) => wrongPasswordPost(email, i, i % 2 ? a : b))
		);
		const statuses = answers.map((r) => r.status);
		const checkedAtOnce = statuses.filter((s) => s === 401).length;
		expect(checkedAtOnce).toBeLessThanOrEqual(5);
		expect(statuses.filter((s) => s === 429).length).toBe(20 - checkedAtOnce);
		// Guessing on, one at a time: exactly five wrong passwords are ever checked in all.
		let checkedAfter = 0;
		for (let i = 20; i < 30; i++) {
			const status = (await wrongPasswordPost(email, i)).status;
			if (status === 429) break;
			expect(status).toBe(401);
			checkedAfter += 1;
		}
		expect(checkedAtOnce + checkedAfter).toBe(5);
		expect((await new Client().post('/sign-in', { email, password })).status).toBe(429);
	});

	it('limits sign-in attempts per client address through the form, whatever the address', async () => {
		const from = ownAddress();
		const statuses: number[] = [];
		for (let i = 0; i < 21; i++) {
			// A different unknown address each time: the per-address lockout never applies.
			const res = await wrongPasswordPost(`nobody-${i}-${Date.now()}@example.test`, i, from);
			statuses.push(res.status);
		}
		expect(statuses.slice(0, 20).every((s) => s === 401)).toBe(true);
		expect(statuses[20]).toBe(429);
		// Another client address is not affected.
		expect((await wrongPasswordPost(`nobody-else-${Date.now()}@example.test`, 0)).status).toBe(401);
	});

	it('keys the auth API limit on the connection, not on a client-set X-Forwarded-For', async () => {
		const client = new Client();
		const statuses: number[] = [];
		for (let i = 0; i < 21; i++) {
			const res = await client.api(
				'/sign-in/email',
				{ email: `spoof-${i}-${Date.now()}@example.test`, password: 'wrong-password-x' },
				{ 'x-forwarded-for': `198.51.100.${i + 1}` }
			);
			statuses.push(res.status);
		}
		expect(statuses.slice(0, 20)).not.toContain(429);
		expect(statuses[20]).toBe(429);
	});

	it('answers sign-up for an existing address exactly as for a new one, and tells its owner by mail', async () => {
		const { email } = await newAccount('existing');
		const fresh = `fresh-${Date.now()}@example.test`;
		const post = (address: string) =>
			new Client().post('/sign-up', {
				name: 'Someone Else',
				email: address,
				password: 'another-long-password',
				confirm: 'another-long-password'
			});
		const [again, newOne] = await Promise.all([post(email), post(fresh)]);
		expect(again.status).toBe(newOne.status);
		expect(again.headers.get('location')).toBe(`/verify-email?sent=${encodeURIComponent(email)}`);
		expect(newOne.headers.get('location')).toBe(`/verify-email?sent=${encodeURIComponent(fresh)}`);
		const note = await waitForMail(email, 'You already have a Thermalith account');
		expect(note.text).toContain('/forgot-password');
	});

	it('limits reset mails per client address through the form', async () => {
		const { email } = await newAccount('reset-flood');
		const client = new Client();
		const statuses: number[] = [];
		for (let i = 0; i < 6; i++)
			statuses.push((await client.post('/forgot-password', { email })).status);
		expect(statuses.slice(0, 5)).toEqual([200, 200, 200, 200, 200]);
		expect(statuses[5]).toBe(429);
		await waitForMail(email, 'Reset your password', 5);
		expect(
			(await mailFor(email)).filter((m) => m.subject.startsWith('Reset your password'))
		).toHaveLength(5);
	});

	it('retires an older reset link once a newer one was used', async () => {
		const { email } = await newAccount('two-links');
		expect((await new Client().post('/forgot-password', { email })).status).toBe(200);
		const older = linkIn((await waitForMail(email, 'Reset your password', 1)).text);
		expect((await new Client().post('/forgot-password', { email })).status).toBe(200);
		const newer = linkIn((await waitForMail(email, 'Reset your password', 2)).text);
		const reset = (token: string, password: string) =>
			new Client().post('/reset-password', { token, password, confirm: password });
		expect((await reset(newer.searchParams.get('token')!, 'newest-password-1')).status).toBe(303);
		expect((await reset(older.searchParams.get('token')!, 'attacker-password-2')).status).toBe(400);
		await signIn(email, 'newest-password-1');
	});

	it('locks an address after five wrong passwords, even for the right one', async () => {
		const { email, password } = await newAccount('lockout');
		for (let i = 0; i < 5; i++) {
			const res = await new Client().post('/sign-in', { email, password: `wrong-password-${i}` });
			expect(res.status).toBe(401);
		}
		const locked = await new Client().post('/sign-in', { email, password });
		expect(locked.status).toBe(429);
		expect(await locked.text()).toContain('Too many failed sign-ins');
	});

	it('refuses a reset link the second time, and an expired one', async () => {
		const { email } = await newAccount('reset');
		expect((await new Client().post('/forgot-password', { email })).status).toBe(200);
		const mail = await waitForMail(email, 'Reset your password');
		const token = linkIn(mail.text).searchParams.get('token')!;
		const first = await new Client().post('/reset-password', {
			token,
			password: 'brand-new-password',
			confirm: 'brand-new-password'
		});
		expect(first.status).toBe(303);
		expect(first.headers.get('location')).toBe('/sign-in?reset=1');
		await signIn(email, 'brand-new-password');
		const again = await new Client().post('/reset-password', {
			token,
			password: 'another-password-2',
			confirm: 'another-password-2'
		});
		expect(again.status).toBe(400);

		expect((await new Client().post('/forgot-password', { email })).status).toBe(200);
		const latest = await waitForMail(email, 'Reset your password', 2);
		const token2 = linkIn(latest.text).searchParams.get('token')!;
		await db
			.update(verification)
			.set({ expiresAt: new Date(Date.now() - 1000) })
			.where(eq(verification.identifier, `reset-password:${token2}`));
		const expired = await new Client().post('/reset-password', {
			token: token2,
			password: 'another-password-3',
			confirm: 'another-password-3'
		});
		expect(expired.status).toBe(400);
	});

	it('does not let a contributor promote themself, by form or by the auth API', async () => {
		const contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
		const [me] = await db
			.select({ id: member.id, role: member.role })
			.from(member)
			.innerJoin(user, eq(member.userId, user.id))
			.where(eq(user.email, 'contributor@korvald-survey.example'));
		const byForm = await contributor.post('/organisations/korvald-survey/settings?/changeRole', {
			memberId: me.id,
			role: 'owner'
		});
		expect(byForm.status).toBe(403);
		const byApi = await contributor.api('/organization/update-member-role', {
			memberId: me.id,
			role: 'owner',
			organizationId: 'org-korvald-survey'
		});
		expect(byApi.status).toBe(403);
		const [after] = await db.select({ role: member.role }).from(member).where(eq(member.id, me.id));
		expect(after.role).toBe('contributor');
	});

	it('does not let the only owner leave', async () => {
		const owner = await signIn('owner@skarnholt.example', DEMO_PASSWORD);
		const res = await owner.post('/organisations/skarnholt/settings?/leave', {});
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('only owner');
	});

	it('refuses impersonation even to a platform administrator', async () => {
		const admin = await signIn('admin@thermalith.example', DEMO_PASSWORD);
		const [target] = await db
			.select({ id: user.id })
			.from(user)
			.where(eq(user.email, 'viewer@korvald-survey.example'));
		const res = await admin.api('/admin/impersonate-user', { userId: target.id });
		expect(res.status).toBe(403);
	});
});
