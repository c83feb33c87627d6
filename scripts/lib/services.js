// @ts-check
/** Bring up the embedded services a profile needs: PostgreSQL + PostGIS, the S3 fake, the mail catcher. */
import fs from 'node:fs';
import path from 'node:path';
import { PORT_VARIABLES, ROOT } from './config.js';
import { fatal, ok, step } from './log.js';
import { portProblem } from './ports.js';
import { ensureDatabase, ensurePostgresInstalled, startCluster } from './postgres.js';
import { onStop, startService, waitForPort } from './proc.js';

/** @typedef {ReturnType<typeof import('./config.js').resolveConfig>} Config */

const LABELS = {
	app: 'app',
	s3: 'S3 service',
	smtp: 'mail service (SMTP)',
	mailWeb: 'mail viewer'
};

/**
 * Before anything starts: every port this run will listen on (apart from PostgreSQL, which may be
 * ours already and is checked when it starts) must be free. All problems are reported at once.
 * @param {Config} config @param {(keyof typeof LABELS)[]} names
 */
export async function checkPortsFree(config, names) {
	const wanted = names.filter(
		(n) => n === 'app' || (n === 's3' ? config.embedded.s3 : config.embedded.mail)
	);
	const problems = [];
	for (const name of wanted) {
		const problem = await portProblem({
			name: LABELS[name],
			host: name === 'app' ? config.appEnv.HOST : config.host,
			port: config.ports[name],
			variable: PORT_VARIABLES[name]
		});
		if (problem) problems.push(problem);
	}
	if (problems.length) fatal(problems.join('\n'));
}

/**
 * @param {Config} config
 * @param {{ freshDatabase?: boolean, freshObjects?: boolean, only?: ('postgres' | 's3' | 'mail')[] }} [options]
 */
export async function startEmbeddedServices(config, options = {}) {
	const { host, ports, storageDir } = config;
	const wanted = options.only ?? ['postgres', 's3', 'mail'];
	if (!wanted.includes('postgres') && !wanted.includes('s3') && !wanted.includes('mail')) return;
	const embedded = {
		postgres: config.embedded.postgres && wanted.includes('postgres'),
		s3: config.embedded.s3 && wanted.includes('s3'),
		mail: config.embedded.mail && wanted.includes('mail')
	};
	fs.mkdirSync(storageDir, { recursive: true });

	if (embedded.postgres) {
		await ensurePostgresInstalled();
		const stop = await startCluster({
			dataDir: path.join(storageDir, 'postgres'),
			host,
			port: ports.postgres,
			fast: config.profile === 'test' || config.profile === 'bench'
		});
		onStop('PostgreSQL', stop);
		ensureDatabase({
			host,
			port: ports.postgres,
			database: config.database,
			recreate: options.freshDatabase
		});
	} else if (wanted.includes('postgres')) {
		ok('using the PostgreSQL at DATABASE_URL (embedded cluster not started)');
	}

	if (embedded.s3) {
		const dir = path.join(storageDir, 's3');
		if (options.freshObjects) fs.rmSync(dir, { recursive: true, force: true });
		// The keys go to the store through its environment (not its command line, which `ps` shows).
		const keys = {
			S3_ACCESS_KEY_ID: config.appEnv.S3_ACCESS_KEY_ID,
			S3_SECRET_ACCESS_KEY: config.appEnv.S3_SECRET_ACCESS_KEY,
			S3_REGION: config.appEnv.S3_REGION
		};
		await startNodeService(
			's3',
			ports.s3,
			host,
			[
				path.join(ROOT, 'scripts/services/s3-fake.js'),
				'--port',
				String(ports.s3),
				'--address',
				host,
				'--directory',
				dir,
				'--bucket',
				config.appEnv.S3_BUCKET
			],
			keys
		);
	} else if (wanted.includes('s3')) {
		ok(`using the object store at S3_ENDPOINT (embedded S3 fake not started)`);
	}

	if (embedded.mail) {
		const dir = path.join(storageDir, 'mail');
		if (options.freshObjects) fs.rmSync(dir, { recursive: true, force: true });
		await startNodeService('mail', ports.smtp, host, [
			path.join(ROOT, 'scripts/services/mail-catcher.js'),
			'--smtp-port',
			String(ports.smtp),
			'--web-port',
			String(ports.mailWeb),
			'--address',
			host,
			'--directory',
			dir
		]);
		await waitForPort(host, ports.mailWeb);
	} else if (wanted.includes('mail')) {
		ok('using the SMTP server from SMTP_URL / SMTP_HOST (embedded mail catcher not started)');
	}
}

/**
 * @param {string} name @param {number} port @param {string} host @param {string[]} args
 * @param {Record<string, string>} [env] added to this process's environment for the service
 */
async function startNodeService(name, port, host, args, env = {}) {
	step(`starting ${name} service on ${host}:${port}`);
	const child = startService(name, args, { ...process.env, ...env });
	const exited = new Promise((_, reject) =>
		child.once('exit', (code) => reject(new Error(`${name} service exited with code ${code}`)))
	);
	try {
		await Promise.race([waitForPort(host, port), exited]);
	} catch (err) {
		fatal(String(/** @type {Error} */ (err).message));
	}
}
