import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { member, user } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * Role × action over every organisation and admin endpoint, through HTTP as a browser would post
 * the forms. Expected codes: 200 allowed, 303→/sign-in for anonymous pages, 401 anonymous
 * actions, 403 signed in without the right, 404 unknown organisation.
 */
type Actor =
	| 'anonymous'
	| 'unverified'
	| 'viewer'
	| 'contributor'
	| 'curator'
	| 'owner'
	| 'otherOwner'
	| 'admin';
const ACCOUNTS: Record<Exclude<Actor, 'anonymous' | 'unverified'>, string> = {
	viewer: 'viewer@korvald-survey.example',
	contributor: 'contributor@korvald-survey.example',
	curator: 'curator@korvald-survey.example',
	owner: 'owner@korvald-survey.example',
	otherOwner: 'owner@lindmark-thermics.example',
	admin: 'admin@thermalith.example'
};
const ORG = '/organisations/korvald-survey/settings';
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const clients = {} as Record<Actor, Client>;
let viewerMemberId = '';
// Suspending signs a user out everywhere, so the admin rows act on a bystander, not an actor.
const bystanderId = randomUUID();

beforeAll(async () => {
	clients.anonymous = new Client();
	const unverified = new Client();
	const email = `unverified-${Date.now()}@example.test`;
	const res = await unverified.post('/sign-up', {
		name: 'Una Verified',
		email,
		password: 'a-long-password-1',
		confirm: 'a-long-password-1'
	});
	expect(res.status).toBe(303);
	clients.unverified = await signIn(email, 'a-long-password-1');
	for (const [actor, address] of Object.entries(ACCOUNTS))
		clients[actor as Actor] = await signIn(address, DEMO_PASSWORD);
	const [viewer] = await db
		.select({ id: member.id })
		.from(member)
		.innerJoin(user, eq(member.userId, user.id))
		.where(eq(user.email, ACCOUNTS.viewer));
	viewerMemberId = viewer.id;
	await db
		.insert(user)
		.values({ id: bystanderId, name: 'Bystander', email: `${bystanderId}@example.test` });
});

afterAll(async () => {
	await sql.end();
});

const ONLY_OWNER = {
	anonymous: 401,
	unverified: 403,
	viewer: 403,
	contributor: 403,
	curator: 403,
	owner: 200,
	otherOwner: 403,
	admin: 403
} as const;
const ONLY_ADMIN = {
	anonymous: 401,
	unverified: 403,
	viewer: 403,
	contributor: 403,
	curator: 403,
	owner: 403,
	otherOwner: 403,
	admin: 200
} as const;
const actors = Object.keys(ONLY_OWNER) as Actor[];

/** A throw-away member the 'remove' row can delete (only the owner's attempt succeeds). */
async function throwAwayMember(): Promise<string> {
	const id = randomUUID();
	const userId = randomUUID();
	await db.insert(user).values({ id: userId, name: 'Throw Away', email: `${userId}@example.test` });
	await db
		.insert(member)
		.values({ id, organizationId: 'org-korvald-survey', userId, role: 'viewer' });
	return id;
}

describe.each([
	{
		name: 'invite a member',
		path: `${ORG}?/invite`,
		fields: () => ({ email: `new-${randomUUID()}@example.test`, role: 'viewer' }),
		expected: ONLY_OWNER
	},
	{
		name: 'change a role',
		path: `${ORG}?/changeRole`,
		fields: () => ({ memberId: viewerMemberId, role: 'viewer' }),
		expected: ONLY_OWNER
	},
	{
		name: 'edit organisation details',
		path: `${ORG}?/update`,
		fields: () => ({
			name: 'Korvald Geological Survey',
			slug: 'korvald-survey',
			country: 'Korvald (invented)',
			website: 'https://korvald-survey.example',
			description: 'Edited by the test.'
		}),
		expected: ONLY_OWNER
	},
	{
		name: 'remove a member',
		path: `${ORG}?/remove`,
		fields: async () => ({ memberId: await throwAwayMember() }),
		expected: ONLY_OWNER
	},
	{
		name: 'suspend a user (admin)',
		path: '/admin?/suspend',
		fields: () => ({ userId: bystanderId }),
		expected: ONLY_ADMIN
	},
	{
		name: 'restore a user (admin)',
		path: '/admin?/restore',
		fields: () => ({ userId: bystanderId }),
		expected: ONLY_ADMIN
	}
])('$name', ({ path, fields, expected }) => {
	it.each(actors)('as %s', async (actor) => {
		const res = await clients[actor].post(path, await fields());
		expect(res.status).toBe(expected[actor]);
	});
});

describe('pages', () => {
	const MEMBERS = {
		anonymous: 303,
		unverified: 403,
		viewer: 200,
		contributor: 200,
		curator: 200,
		owner: 200,
		otherOwner: 403,
		admin: 403
	} as const;
	const ADMIN_PAGE = { ...ONLY_ADMIN, anonymous: 303 } as const;
	it.each(actors)('organisation settings as %s', async (actor) => {
		const res = await clients[actor].get(ORG);
		expect(res.status).toBe(MEMBERS[actor]);
		if (res.status === 303) expect(res.headers.get('location')).toMatch(/^\/sign-in\?next=/);
	});
	it.each(actors)('admin page as %s', async (actor) => {
		expect((await clients[actor].get('/admin')).status).toBe(ADMIN_PAGE[actor]);
	});
	it('answers 404 for an organisation that does not exist', async () => {
		expect((await clients.owner.get('/organisations/no-such-org/settings')).status).toBe(404);
		expect(
			(
				await clients.owner.post('/organisations/no-such-org/settings?/invite', {
					email: 'a@b.test',
					role: 'viewer'
				})
			).status
		).toBe(404);
	});
});
