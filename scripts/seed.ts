/**
 * Seed the invented demo scenario (scripts/demo/scenario.ts) into DATABASE_URL when the database
 * holds no organisation yet. Run by `npm start`, `npm run dev` and `npm test`; safe to run again.
 */
import { count } from 'drizzle-orm';
import { createDb } from '../src/lib/server/db/client';
import { dataset, organisation, site } from '../src/lib/server/db/schema';
import { datasets, demoSites, organisations } from './demo/scenario';

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('DATABASE_URL is not set');
	process.exit(1);
}
const { db, client } = createDb(url, { max: 1 });
try {
	const [{ n }] = await db.select({ n: count() }).from(organisation);
	if (n > 0) {
		console.log('demo data: database already has organisations, nothing seeded');
	} else {
		await db.transaction(async (tx) => {
			await tx.insert(organisation).values(organisations);
			await tx.insert(dataset).values(datasets.map(({ key: _key, ...d }) => d));
			const ids = Object.fromEntries(datasets.map((d) => [d.key, d.id as string]));
			await tx.insert(site).values(demoSites(ids));
		});
		console.log(
			`demo data: seeded ${organisations.length} organisations, ${datasets.length} datasets`
		);
	}
} finally {
	await client.end();
}
