// @ts-check
/**
 * Keeps one core busy until stopped: `npm test -- --cpu-burn` starts one per core so the suite
 * runs on a loaded machine, where a test that waits for time instead of for a state fails.
 */
for (;;) {
	// A tight loop with no I/O; SIGTERM ends the process (default handler).
	Math.sqrt(Math.random());
}
