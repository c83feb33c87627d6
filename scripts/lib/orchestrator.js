// @ts-check
/**
 * The one exit path of every orchestrator (start, dev, test, bench): whatever ends the run (its
 * own result, an error, a fatal message, Ctrl-C, SIGTERM, a closed terminal, a service that dies)
 * stops what the run started, in reverse order, says so, and removes the run's records.
 * A SIGKILL cannot be caught: the run's watcher (reaper.js) and the next run handle that.
 */
import { FatalError, failure } from './log.js';
import { stopAll, whenServiceDies } from './proc.js';
import { releaseRun } from './runstate.js';

/** @type {Promise<void> | null} */
let shuttingDown = null;

/** @param {number} code */
function shutdown(code) {
	shuttingDown ??= (async () => {
		try {
			await stopAll();
			releaseRun();
		} catch (err) {
			console.error(err);
		}
		process.exit(code);
	})();
	return shuttingDown;
}

/**
 * Run an orchestrator's main function. It resolves with an exit code (the run is over) or with
 * 'serve' (keep running until a signal).
 * @param {() => Promise<number | 'serve'>} main
 * @param {{ signalExitCode?: number }} [options] exit code after Ctrl-C/SIGTERM (0 for `npm start`)
 */
export async function orchestrate(main, { signalExitCode = 1 } = {}) {
	for (const signal of /** @type {const} */ (['SIGINT', 'SIGTERM', 'SIGHUP'])) {
		process.on(signal, () => {
			console.log(`\nreceived ${signal}`);
			void shutdown(signalExitCode);
		});
	}
	/** @param {unknown} err */
	const crash = (err) => {
		if (err instanceof FatalError) failure(err.message);
		else console.error(err);
		void shutdown(1);
	};
	process.on('uncaughtException', crash);
	process.on('unhandledRejection', crash);
	whenServiceDies((name, code) => {
		failure(`the ${name} service stopped on its own (exit code ${code}); stopping the run`);
		void shutdown(1);
	});
	try {
		const result = await main();
		if (result !== 'serve') await shutdown(result);
	} catch (err) {
		crash(err);
	}
}
