import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { member, user, verification } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, linkIn, mailFor, signIn } from './http';

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

describe('abuse and edge cases', () => {
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
		const [mail] = (await mailFor(email)).filter((m) =>
			m.subject.startsWith('Reset your password')
		);
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
		const latest = (await mailFor(email)).filter((m) =>
			m.subject.startsWith('Reset your password')
		)[0];
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
