/**
 * A worker process for tests/integration/import-worker-killed.spec.ts: it works an import queue
 * with the product's worker (workImportQueue), says "written <n>" after the first chunk of sites
 * has been inserted inside the import's transaction, and then never goes on, until the test
 * kills it.
 * Usage: DATABASE_URL=… node --import tsx hanging-import-worker.ts <pg-boss schema> <queue>
 */
import { createDb } from '../../../src/lib/server/db/client';
import { createBoss } from '../../../src/lib/server/jobs/boss';
import { workImportQueue } from '../../../src/lib/server/jobs/import-queue';

const [schema, queue] = process.argv.slice(2);
const boss = createBoss(process.env.DATABASE_URL!, schema);
await boss.start();
const { db } = createDb(process.env.DATABASE_URL!, { max: 2 });
await workImportQueue(boss, db, {
	queue,
	afterChunk: async (done) => {
		console.log(`written ${done}`);
		await new Promise<void>(() => {});
	}
});
console.log('working');
