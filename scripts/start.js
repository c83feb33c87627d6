// @ts-check
/**
 * `npm start` (built app) and `npm run dev` (Vite dev server): install what is missing, start the
 * embedded services, migrate, seed the demo scenario into an empty database, run the app.
 * Any failure or signal stops what was started (scripts/lib/orchestrator.js).
 * Only Node built-ins are imported statically: node_modules may not exist yet.
 */
import path from 'node:path';
import { ensureNodeModules } from './lib/deps.js';
import { ROOT, resolveConfig } from './lib/config.js';
import { ok, step } from './lib/log.js';
import { orchestrate } from './lib/orchestrator.js';
import { claimRun } from './lib/runstate.js';

const dev = process.argv.includes('--dev');

await orchestrate(
	async () => {
		await ensureNodeModules();
		const { validateEnvironment } = await import('./lib/validate-env.js');
		const config = resolveConfig(dev ? 'dev' : 'start');
		validateEnvironment(config.appEnv);
		await claimRun(config.storageDir, dev ? 'npm run dev' : 'npm start');

		const { checkPortsFree, startEmbeddedServices } = await import('./lib/services.js');
		const { applyMigrations } = await import('./migrate.js');
		const { seedDemoData } = await import('./lib/seed-runner.js');
		const { START_BUILD_DIR, buildApp, startBuiltApp, startDevServer } =
			await import('./lib/app.js');

		await checkPortsFree(config, ['app', 's3', 'smtp', 'mailWeb']);
		await startEmbeddedServices(config);
		step('applying database migrations');
		await applyMigrations(config.appEnv.DATABASE_URL);
		await seedDemoData({ ...config.appEnv, THERMALITH_SEED: 'if-empty' });
		if (dev) {
			await startDevServer(config.appEnv);
		} else {
			await buildApp(START_BUILD_DIR, config.appEnv);
			await startBuiltApp(START_BUILD_DIR, config.appEnv);
		}
		printSummary(config);
		return 'serve';
	},
	{ signalExitCode: 0 }
);

/** @param {ReturnType<typeof resolveConfig>} config */
function printSummary({ ports, host, embedded, appEnv, storageDir }) {
	const data = path.relative(ROOT, storageDir) || storageDir;
	console.log('');
	ok(`Thermalith is running at ${appEnv.ORIGIN}`);
	console.log(
		`  PostgreSQL   ${embedded.postgres ? `${host}:${ports.postgres} (embedded, data in ${data}/postgres)` : 'external (DATABASE_URL)'}`
	);
	console.log(
		`  S3 store     ${embedded.s3 ? `${appEnv.S3_ENDPOINT} (embedded s3rver, bucket ${appEnv.S3_BUCKET})` : appEnv.S3_ENDPOINT}`
	);
	console.log(
		`  SMTP         ${embedded.mail ? `${appEnv.SMTP_URL} (embedded mail catcher)` : 'external (SMTP_URL / SMTP_HOST)'}`
	);
	if (embedded.mail) console.log(`  Caught mail  ${appEnv.MAIL_VIEWER_URL}`);
	if (appEnv.HOST === '127.0.0.1') {
		console.log(
			'  Only this machine can open it; for other computers set HOST=0.0.0.0 and ORIGIN (see README).'
		);
	}
	console.log(
		'  Demo accounts are printed above (and listed in the README); press Ctrl-C to stop everything.'
	);
}
