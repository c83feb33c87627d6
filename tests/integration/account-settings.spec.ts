import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { session, user } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, linkIn, signIn, waitForMail } from './http';

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
afterAll(async () => {
	await sql.end();
});

async function verifiedAccount(prefix: string) {
	const email = `${prefix}-${Date.now()}@example.test`;
	const password = 'settings-password-1';
	expect(
		(await new Client().post('/sign-up', { name: 'Set Tings', email, password, confirm: password }))
			.status
	).toBe(303);
	await db.update(user).set({ emailVerified: true }).where(eq(user.email, email));
	return { email, password };
}

describe('account settings', () => {
	it('moves the e-mail address only after the old address approves and the new one confirms', async () => {
		const { email, password } = await verifiedAccount('change');
		const client = await signIn(email, password);
		const newEmail = `moved-${Date.now()}@example.test`;
		const addressOf = async (address: string) =>
			(await db.select({ id: user.id }).from(user).where(eq(user.email, address))).length;
		expect((await client.post('/account?/email', { email: newEmail })).status).toBe(200);
		expect(await addressOf(email)).toBe(1);
		// Step 1: the current address approves the move.
		const approval = await waitForMail(email, 'Approve the change');
		expect(approval.text).toContain(newEmail);
		const approve = linkIn(approval.text);
		// The link is used once, then the page shows the outcome on a fresh request.
		const used = await client.get(approve.pathname + approve.search);
		expect(used.status).toBe(303);
		expect(used.headers.get('location')).toBe('/verify-email?done=approved');
		const approved = await client.get('/verify-email?done=approved');
		expect(approved.status).toBe(200);
		expect(await approved.text()).toContain('Change approved');
		expect(await addressOf(email)).toBe(1);
		// Step 2: the new address confirms it is reachable; only now does the account move.
		const confirm = await waitForMail(newEmail, 'Confirm your e-mail address');
		const link = linkIn(confirm.text);
		const confirmed = await client.get(link.pathname + link.search);
		expect(confirmed.status).toBe(303);
		expect(confirmed.headers.get('location')).toBe('/verify-email?done=verified');
		expect(await addressOf(email)).toBe(0);
		expect(await addressOf(newEmail)).toBe(1);
	});

	it('lists sessions and signs another browser out', async () => {
		const { email, password } = await verifiedAccount('sessions');
		const laptop = await signIn(email, password);
		const phone = await signIn(email, password);
		const [me] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
		// Sign-up does not sign in (it must not tell a new address from a known one), so there are
		// two sessions; the phone's is the newest.
		const sessions = await db
			.select({ id: session.id, createdAt: session.createdAt })
			.from(session)
			.where(eq(session.userId, me.id));
		expect(sessions).toHaveLength(2);
		const phoneSession = [...sessions].sort(
			(a, b) => b.createdAt.getTime() - a.createdAt.getTime()
		)[0];
		const page = await (await laptop.get('/account')).text();
		// Every session but the laptop's own has a sign-out button; the laptop's says "this browser".
		expect(sessions.filter((s) => page.includes(`name="sessionId" value="${s.id}"`))).toHaveLength(
			1
		);
		expect(page).toContain('this browser');
		expect((await laptop.post('/account?/revoke', { sessionId: phoneSession.id })).status).toBe(
			200
		);
		expect((await phone.get('/account')).status).toBe(303);
		expect((await laptop.get('/account')).status).toBe(200);
	});

	it('changes the password with the current one, and refuses a wrong current one', async () => {
		const { email, password } = await verifiedAccount('password');
		const client = await signIn(email, password);
		const attempt = (currentPassword: string) =>
			client.post('/account?/password', {
				currentPassword,
				password: 'the-new-password-2',
				confirm: 'the-new-password-2'
			});
		expect((await attempt('not-my-password')).status).toBe(400);
		const right = await attempt(password);
		expect(right.status).toBe(303);
		expect(right.headers.get('location')).toBe('/account?password=changed');
		expect(await (await client.get('/account?password=changed')).text()).toContain(
			'Password changed'
		);
		await signIn(email, 'the-new-password-2');
	});
});
