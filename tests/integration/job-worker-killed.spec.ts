/**
 * A queued job whose worker process dies mid-job (kill -9, an out-of-memory kill, a crashed
 * machine) is not lost and does not hang: once its expiry passes, pg-boss's maintenance puts it
 * back by the queue's retry policy and another worker completes it. Runs on a pg-boss schema of
 * its own with the product's mail queue policy, except for a 2 s expiry and 1 s retry delay so the
 * test does not wait minutes (the product's: see QUEUES in src/lib/server/jobs/queues.ts).
 */
import { spawn } from 'node:child_process';
import path from 'node:path';
import postgres from 'postgres';
import PgBoss from 'pg-boss';
import { afterAll, describe, expect, it } from 'vitest';
import { workMailQueue, type OutgoingMail } from '../../src/lib/server/jobs/mail-queue';
import { ensureQueues, QUEUES } from '../../src/lib/server/jobs/queues';
import { testEnv } from './env';

const schema = `pgboss_kill_${process.pid}`;
const queue = 'mail-worker-killed-test';
const bosses: PgBoss[] = [];

afterAll(async () => {
	for (const boss of bosses) await boss.stop({ graceful: false, timeout: 2000 });
	const sql = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
	await sql.unsafe(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
	await sql.end();
});

describe('a worker killed during a queued job', () => {
	it('leaves the job to be retried after its expiry, and another worker completes it', async () => {
		// The second worker runs maintenance every second (the product's default is 2 minutes).
		const boss = new PgBoss({
			connectionString: testEnv.databaseUrl(),
			schema,
			max: 2,
			maintenanceIntervalSeconds: 1
		});
		boss.on('error', (err) => console.error('job queue:', err));
		bosses.push(boss);
		await boss.start();
		await ensureQueues(boss, [
			{ ...QUEUES.mail, name: queue, expireInSeconds: 2, retryDelay: 1, retryBackoff: false }
		]);
		const message: OutgoingMail = {
			to: `killed-${Date.now()}@example.test`,
			subject: 'Invitation',
			text: 'Hello',
			html: '<p>Hello</p>'
		};
		const id = (await boss.send(queue, message))!;

		// `node --import tsx`, not the tsx command: that one runs the script in a child process of
		// its own, which a SIGKILL of the command would leave running.
		const child = spawn(
			process.execPath,
			[
				'--import',
				'tsx',
				path.resolve('tests/integration/helpers/hanging-mail-worker.ts'),
				schema,
				queue
			],
			{ env: { ...process.env }, stdio: ['ignore', 'pipe', 'pipe'] }
		);
		let out = '';
		child.stdout.on('data', (d) => (out += d));
		child.stderr.on('data', (d) => (out += d));
		const exited = new Promise((resolve) => child.once('exit', resolve));
		await expect
			.poll(() => out, { timeout: 60_000, interval: 100 })
			.toContain(`taken ${message.to}`);
		expect((await boss.getJobById(queue, id))?.state).toBe('active');
		child.kill('SIGKILL');
		await exited;

		const delivered: OutgoingMail[] = [];
		await workMailQueue(boss, async (m) => void delivered.push(m), queue);
		await expect
			.poll(async () => (await boss.getJobById(queue, id))?.state, {
				timeout: 60_000,
				interval: 200
			})
			.toBe('completed');
		expect(delivered).toEqual([message]);
		const job = await boss.getJobById(queue, id);
		// One failed attempt (the killed worker's, failed by timeout), then the successful one.
		expect(job?.retryCount).toBe(1);
	}, 120_000);
});
