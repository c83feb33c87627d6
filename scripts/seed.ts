/**
 * Seed the invented demo scenario (scripts/demo/) into DATABASE_URL: organisations, datasets and
 * sites when there is no organisation yet, demo accounts when there is no user yet. Run by
 * `npm start`, `npm run dev` and `npm test`; safe to run again.
 */
import { randomUUID } from 'node:crypto';
import { count, eq } from 'drizzle-orm';
import { createAuth } from '../src/lib/server/auth/create-auth';
import { createDb } from '../src/lib/server/db/client';
import { dataset, member, organisation, site, user } from '../src/lib/server/db/schema';
import { DEMO_PASSWORD, people } from './demo/people';
import { datasets, demoSites, organisations } from './demo/scenario';

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('DATABASE_URL is not set');
	process.exit(1);
}
const { db, client } = createDb(url, { max: 2 });
try {
	const [{ n: orgCount }] = await db.select({ n: count() }).from(organisation);
	if (orgCount > 0) {
		console.log('demo data: organisations exist already, scenario not seeded again');
	} else {
		await db.transaction(async (tx) => {
			await tx.insert(organisation).values(organisations);
			await tx.insert(dataset).values(datasets.map(({ key: _key, ...d }) => d));
			const ids = Object.fromEntries(datasets.map((d) => [d.key, d.id as string]));
			await tx.insert(site).values(demoSites(ids));
		});
		console.log(
			`demo data: seeded ${organisations.length} organisations and ${datasets.length} datasets`
		);
	}

	const [{ n: userCount }] = await db.select({ n: count() }).from(user);
	if (userCount === 0) {
		// Accounts go through better-auth so passwords are hashed exactly as at sign-up; the
		// confirmation mail is skipped because the addresses are invented.
		const auth = createAuth({
			db,
			secret: process.env.BETTER_AUTH_SECRET ?? 'seed-only-secret-seed-only-secret',
			baseURL: process.env.ORIGIN ?? 'http://127.0.0.1:3000',
			production: false,
			send: async () => {}
		});
		for (const p of people) {
			const { user: created } = await auth.api.signUpEmail({
				body: { name: p.name, email: p.email, password: DEMO_PASSWORD }
			});
			await db
				.update(user)
				.set({ emailVerified: true, role: p.platformRole })
				.where(eq(user.id, created.id));
			if (p.organisationId && p.role) {
				await db.insert(member).values({
					id: randomUUID(),
					organizationId: p.organisationId,
					userId: created.id,
					role: p.role
				});
			}
		}
		console.log(`demo data: seeded ${people.length} demo accounts`);
	}
	if (process.env.THERMALITH_PROFILE !== 'production') {
		console.log(`demo accounts (password "${DEMO_PASSWORD}"):`);
		for (const p of people) {
			console.log(
				`  ${p.email.padEnd(36)} ${p.role ? `${p.role} of ${p.organisationId}` : 'platform administrator'}`
			);
		}
	}
} finally {
	await client.end();
}
