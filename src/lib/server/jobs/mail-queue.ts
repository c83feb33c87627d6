import type PgBoss from 'pg-boss';
import { QUEUES } from './queues';

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html: string;
}

/** Queue a message; the action that sends it completes whether or not the mail server is up. */
export async function enqueueMail(boss: PgBoss, message: OutgoingMail): Promise<void> {
	await boss.send(QUEUES.mail.name, message);
}

/**
 * Deliver queued messages one at a time. A delivery that throws (server down, refused) leaves the
 * job to pg-boss, which retries it by the queue's policy.
 */
export function workMailQueue(
	boss: PgBoss,
	deliver: (message: OutgoingMail) => Promise<void>,
	queue: string = QUEUES.mail.name
): Promise<string> {
	return boss.work<OutgoingMail>(
		queue,
		{ batchSize: 1, pollingIntervalSeconds: 1 },
		async ([job]) => {
			await deliver(job.data);
		}
	);
}
