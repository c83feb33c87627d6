// @ts-check
/**
 * The slow tier (`npm run test:slow`): test files that stop or freeze a service the other tests
 * share, or drive the product's own scripts end to end (each starts a whole stack of its own), or
 * wait for a queue's timers. `npm test` runs everything else; CI (`.ci/run`) runs both in one go
 * (`npm test -- --all`). Naming a file on the command line runs it whatever its tier.
 */
export const SLOW_TESTS = [
	// Fault tests: stop PostgreSQL, freeze the object store, kill a worker mid-job.
	'tests/integration/postgres-stop-during-import.spec.ts',
	'tests/integration/object-store-down.spec.ts',
	'tests/integration/job-worker-killed.spec.ts',
	// Whole runs of npm start, the test services, backups and the bench runner on a fresh clone.
	'tests/integration/orchestration.spec.ts',
	'tests/integration/backup-restore.spec.ts',
	'tests/integration/bench-fresh-clone.spec.ts'
];
