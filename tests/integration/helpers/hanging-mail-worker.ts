/**
 * A worker process for tests/integration/job-worker-killed.spec.ts: it works a mail queue with the
 * product's worker (workMailQueue), says "taken <job data>" when it has a message, and then never
 * finishes delivering it (a mail server that does not answer), until the test kills it.
 * Usage: DATABASE_URL=… tsx hanging-mail-worker.ts <pg-boss schema> <queue>
 */
import { createBoss } from '../../../src/lib/server/jobs/boss';
import { workMailQueue } from '../../../src/lib/server/jobs/mail-queue';

const [schema, queue] = process.argv.slice(2);
const boss = createBoss(process.env.DATABASE_URL!, schema);
await boss.start();
await workMailQueue(
	boss,
	(message) => {
		console.log(`taken ${message.to}`);
		return new Promise<void>(() => {});
	},
	queue
);
console.log('working');
