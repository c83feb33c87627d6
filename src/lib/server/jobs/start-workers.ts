/** Starts one kind of job worker (it may first wait for the job queue to be reachable). */
export type WorkerStarter = () => Promise<unknown>;

/**
 * Start every worker on its own, so one that fails (its queue, its schedule, a query at start)
 * neither stops nor delays the others; each failure is logged with the worker's name. Resolves,
 * never rejects, once every start has ended, with the names of those that failed.
 */
export async function startWorkers(
	starters: Record<string, WorkerStarter>,
	warn: (message: string) => void = console.warn
): Promise<string[]> {
	const names = Object.keys(starters);
	const outcomes = await Promise.allSettled(names.map((name) => starters[name]()));
	const failed: string[] = [];
	outcomes.forEach((outcome, i) => {
		if (outcome.status === 'fulfilled') return;
		failed.push(names[i]);
		const reason = outcome.reason as { message?: string } | undefined;
		warn(`job worker "${names[i]}" not started: ${reason?.message ?? String(outcome.reason)}`);
	});
	return failed;
}
