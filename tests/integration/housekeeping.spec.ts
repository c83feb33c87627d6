/**
 * Finding 12: an announced file whose bytes never arrive must not stay forever. The hourly
 * housekeeping job forgets pending files older than a day and leaves everything else alone.
 */
import { eq, inArray } from 'drizzle-orm';
import postgres from 'postgres';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { attachment, dataset, importBatch } from '../../src/lib/server/db/schema';
import {
	DRAFT_IMPORT_TTL_DAYS,
	PENDING_UPLOAD_TTL_HOURS,
	runHousekeeping
} from '../../src/lib/server/jobs/housekeeping';
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

	it('forgets import drafts never committed within a week, and keeps newer drafts and every import', async () => {
		const [d] = await db.select({ id: dataset.id }).from(dataset).limit(1);
		const now = new Date();
		const daysAgo = (days: number) => new Date(now.getTime() - days * 24 * HOUR_MS);
		const batch = (fileName: string, status: 'draft' | 'done', createdAt: Date) => ({
			datasetId: d.id,
			fileName,
			fileSha256: 'h'.repeat(64),
			totalRows: 1,
			status,
			createdAt
		});
		const rows = await db
			.insert(importBatch)
			.values([
				batch('abandoned.csv', 'draft', daysAgo(DRAFT_IMPORT_TTL_DAYS + 1)),
				batch('recent.csv', 'draft', daysAgo(DRAFT_IMPORT_TTL_DAYS - 1)),
				batch('imported.csv', 'done', daysAgo(365))
			])
			.returning({ id: importBatch.id });
		try {
			const done = await runHousekeeping(db, now);
			expect(done.expiredImportDrafts).toBeGreaterThanOrEqual(1);
			const left = await db
				.select({ fileName: importBatch.fileName })
				.from(importBatch)
				.where(
					inArray(
						importBatch.id,
						rows.map((r) => r.id)
					)
				);
			expect(left.map((r) => r.fileName).sort()).toEqual(['imported.csv', 'recent.csv']);
		} finally {
			for (const r of rows) await db.delete(importBatch).where(eq(importBatch.id, r.id));
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
