/**
 * A grid worker process for tests/integration/grid-worker-killed.spec.ts: the product's grid
 * worker (workGridQueue) on a pg-boss schema and queue of the test's own, until the test kills it.
 * Usage: DATABASE_URL=… node --import tsx grid-worker.ts <pg-boss schema> <queue>
 */
import { createDb } from '../../../src/lib/server/db/client';
import { createBoss } from '../../../src/lib/server/jobs/boss';
import { workGridQueue } from '../../../src/lib/server/jobs/grid-queue';

const [schema, queue] = process.argv.slice(2);
const { db } = createDb(process.env.DATABASE_URL!, { max: 2 });
const boss = createBoss(process.env.DATABASE_URL!, schema);
await boss.start();
await workGridQueue(boss, db, queue);
console.log('working');
