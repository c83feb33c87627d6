/**
 * Finding 12: an announced file whose bytes never arrive must not stay forever. The hourly
 * housekeeping job forgets pending files older than a day and leaves everything else alone.
 */
import { eq, inArray } from 'drizzle-orm';
import postgres from 'postgres';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { attachment, dataset } from '../../src/lib/server/db/schema';
import { PENDING_UPLOAD_TTL_HOURS, runHousekeeping } from '../../src/lib/server/jobs/housekeeping';
import { SCHEDULES } from '../../src/lib/server/jobs/queues';
import { testEnv } from './env';

const { db, client } = createDb(testEnv.databaseUrl(), { max: 2 });
afterAll(async () => {
	await client.end();
});

const HOUR_MS = 3600 * 1000;

describe('housekeeping', () => {
	it('forgets pending uploads older than a day, keeps newer ones and every ready file', async () => {
		const [d] = await db.select({ id: dataset.id }).from(dataset).limit(1);
		const now = new Date();
		const ageOf = (hours: number) => new Date(now.getTime() - hours * HOUR_MS);
		const key = (name: string) => `housekeeping-test/${crypto.randomUUID()}/${name}`;
		const rows = await db
			.insert(attachment)
			.values([
				{
					datasetId: d.id,
					objectKey: key('stale'),
					fileName: 'stale.pdf',
					status: 'pending',
					uploadedAt: ageOf(PENDING_UPLOAD_TTL_HOURS + 1)
				},
				{
					datasetId: d.id,
					objectKey: key('fresh'),
					fileName: 'fresh.pdf',
					status: 'pending',
					uploadedAt: ageOf(PENDING_UPLOAD_TTL_HOURS - 1)
				},
				{
					datasetId: d.id,
					objectKey: key('old-ready'),
					fileName: 'ready.pdf',
					status: 'ready',
					uploadedAt: ageOf(24 * 30)
				}
			])
			.returning({ id: attachment.id, fileName: attachment.fileName });
		try {
			const done = await runHousekeeping(db, now);
			expect(done.expiredUploads).toBeGreaterThanOrEqual(1);
			const left = await db
				.select({ fileName: attachment.fileName })
				.from(attachment)
				.where(
					inArray(
						attachment.id,
						rows.map((r) => r.id)
					)
				);
			expect(left.map((r) => r.fileName).sort()).toEqual(['fresh.pdf', 'ready.pdf']);
		} finally {
			for (const r of rows) await db.delete(attachment).where(eq(attachment.id, r.id));
		}
	});

	it('is scheduled on the job queue by the running app', async () => {
		const sql = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
		try {
			await expect
				.poll(
					async () =>
						(await sql`SELECT cron FROM pgboss.schedule WHERE name = 'housekeeping'`).map(
							(r) => r.cron
						),
					{ timeout: 30_000 }
				)
				.toEqual([SCHEDULES.housekeeping]);
		} finally {
			await sql.end();
		}
	});
});
