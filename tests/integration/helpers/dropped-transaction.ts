/**
 * Run as its own process by postgres-driver-dropped-connection.spec.ts, so that a driver crash ends
 * this process and not the test run. A transaction's server session is ended while its query
 * runs (pg_terminate_backend, as a database restart does); the driver then sends ROLLBACK on a
 * connection that is already gone. Prints one JSON line: how the transaction ended, any
 * uncaught exception, and how queries fared afterwards on every pooled connection.
 */
import postgres from 'postgres';

const url = process.argv[2];
const uncaught: string[] = [];
process.on('uncaughtException', (err) => uncaught.push(`${err.message} ${err.stack ?? ''}`));

// A short connect timeout: a connection that cannot open again shows up as a failed query.
const sql = postgres(url, { max: 2, connect_timeout: 5, onnotice: () => {} });
const killer = postgres(url, { max: 1, onnotice: () => {} });

let pid: number | null = null;
const transaction = sql
	.begin(async (tx) => {
		pid = (await tx`SELECT pg_backend_pid() AS pid`)[0].pid as number;
		await tx`SELECT pg_sleep(5)`;
	})
	.then(
		() => 'committed',
		(err: { code?: string }) => err.code ?? 'error'
	);
while (pid === null) await new Promise((r) => setTimeout(r, 20));
await killer`SELECT pg_terminate_backend(${pid})`;
const ended = await transaction;
// Let any write the driver queued after the close run (the crash came from such a write).
await new Promise((r) => setTimeout(r, 200));

const after = await Promise.allSettled([1, 2, 3, 4].map((n) => sql`SELECT ${n}::int AS n`));
console.log(
	JSON.stringify({
		ended,
		uncaught,
		after: after.map((r) =>
			r.status === 'fulfilled' ? 'ok' : ((r.reason as { code?: string }).code ?? 'error')
		)
	})
);
await sql.end({ timeout: 1 });
await killer.end({ timeout: 1 });
process.exit(0);
