/**
 * Mail goes through the job queue: with the mail server down the sender's action completes, the
 * message waits in PostgreSQL and is delivered once the server answers again. Runs on a pg-boss
 * schema of its own, so the app's own worker never takes these jobs.
 */
import postgres from 'postgres';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBoss } from '../../src/lib/server/jobs/boss';
import {
	enqueueMail,
	workMailQueue,
	type OutgoingMail
} from '../../src/lib/server/jobs/mail-queue';
import { ensureQueues } from '../../src/lib/server/jobs/queues';
import { testEnv } from './env';

const schema = `pgboss_test_${process.pid}`;
const queue = 'mail-retry-test';
let boss: PgBoss;

beforeAll(async () => {
	boss = createBoss(testEnv.databaseUrl(), schema);
	await boss.start();
	// The app's policy, with a one-second delay so the test does not wait minutes.
	await ensureQueues(boss, [{ name: queue, retryLimit: 5, retryDelay: 1, retryBackoff: false }]);
});

afterAll(async () => {
	await boss?.stop({ graceful: false, timeout: 2000 });
	const sql = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
	await sql.unsafe(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
	await sql.end();
});

describe('mail on the job queue', () => {
	it('queues at once while the server is down, and delivers after it comes back', async () => {
		let serverUp = false;
		let attempts = 0;
		const delivered: OutgoingMail[] = [];
		await workMailQueue(
			boss,
			async (message) => {
				attempts += 1;
				if (!serverUp) throw new Error('connect ECONNREFUSED 127.0.0.1:25 (mail server down)');
				delivered.push(message);
			},
			queue
		);
		const message = {
			to: 'someone@example.test',
			subject: 'Your dataset was published',
			text: 'Hello',
			html: '<p>Hello</p>'
		};
		// The sending side only writes a job: it cannot fail because the mail server is down.
		const id = await boss.send(queue, message);
		await expect.poll(() => attempts, { timeout: 60_000, interval: 100 }).toBeGreaterThanOrEqual(2);
		expect(delivered).toEqual([]);

		serverUp = true;
		await expect.poll(() => delivered.length, { timeout: 60_000, interval: 100 }).toBe(1);
		expect(delivered[0]).toEqual(message);
		// The job is done: delivered once, not once per attempt.
		await expect
			.poll(async () => (await boss.getJobById(queue, id!))?.state, { timeout: 30_000 })
			.toBe('completed');
		expect(delivered).toHaveLength(1);
	});

	it('enqueueMail writes a job on the mail queue', async () => {
		await ensureQueues(boss);
		await enqueueMail(boss, { to: 'a@example.test', subject: 's', text: 't', html: '<p>t</p>' });
		const [job] = await boss.fetch<OutgoingMail>('mail');
		expect(job.data.to).toBe('a@example.test');
	});
});
