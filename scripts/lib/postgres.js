// @ts-check
/**
 * A private PostgreSQL 15 + PostGIS cluster under storage/, on loopback and a project port.
 * Debian's binaries are used directly; as root they run as the `postgres` user (initdb refuses root).
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { capture, run } from './proc.js';
import { fatal, ok, step, warn } from './log.js';
import { portProblem } from './ports.js';
import { forgetPostgres, recordPostgres } from './runstate.js';

export const PG_BIN = '/usr/lib/postgresql/15/bin';
const POSTGIS_CONTROL = '/usr/share/postgresql/15/extension/postgis.control';
const APT_PACKAGES = ['postgresql-15', 'postgresql-15-postgis-3'];

const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

/** Install PostgreSQL 15 and PostGIS when missing (as root), or stop with the command to run. */
export async function ensurePostgresInstalled() {
	const missing = !fs.existsSync(path.join(PG_BIN, 'initdb')) || !fs.existsSync(POSTGIS_CONTROL);
	if (!missing) return;
	const command = `apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y ${APT_PACKAGES.join(' ')}`;
	if (!isRoot()) {
		fatal(
			`PostgreSQL 15 with PostGIS is not installed. Run as root:\n\n  sudo sh -c '${command}'\n\nthen run this command again.`
		);
	}
	step(`installing ${APT_PACKAGES.join(', ')} with apt-get`);
	const code = await run('sh', ['-c', command], {
		env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
	});
	if (code !== 0) fatal(`apt-get failed (exit ${code}); see its output above`);
}

/**
 * Run a PostgreSQL binary, as the postgres user when we are root.
 * @param {string} bin @param {string[]} args
 */
function pgCommand(bin, args) {
	const full = path.join(PG_BIN, bin);
	return isRoot()
		? { cmd: 'runuser', args: ['-u', 'postgres', '--', full, ...args] }
		: { cmd: full, args };
}

/**
 * The first folder above `dir` that the postgres user cannot enter (no 'x' for others), or null.
 * @param {string} dir
 */
function blockingParent(dir) {
	let current = path.dirname(dir);
	while (current !== path.dirname(current)) {
		if (fs.existsSync(current) && (fs.statSync(current).mode & 0o001) === 0) return current;
		current = path.dirname(current);
	}
	return null;
}

/**
 * Where the cluster's files go. Normally `dataDir` (under storage/). As root, PostgreSQL runs as
 * the 'postgres' user, which cannot reach a project inside a private folder (a 0700 home, or the
 * folder `mktemp -d` makes for a clean-clone CI run); then the cluster lives in a folder of its own
 * under /var/tmp, named after the project path, and this says so. Folder modes are never changed.
 * @param {string} dataDir
 */
export function clusterDir(dataDir) {
	if (!isRoot()) return dataDir;
	const blocked = blockingParent(dataDir);
	if (!blocked) return dataDir;
	const id = crypto.createHash('sha256').update(dataDir).digest('hex').slice(0, 16);
	const fallback = path.join('/var/tmp/thermalith-postgres', id);
	warn(
		`the 'postgres' user cannot enter ${blocked}; the cluster for ${path.relative(process.cwd(), dataDir) || dataDir} lives in ${fallback} instead`
	);
	fs.mkdirSync(path.dirname(fallback), { recursive: true, mode: 0o755 });
	return fallback;
}

/**
 * Create (once) and start the cluster; returns a function that stops it.
 * @param {{ dataDir: string, port: number, host: string, fast?: boolean }} options
 */
export async function startCluster({ dataDir: wanted, port, host, fast = false }) {
	const dataDir = clusterDir(wanted);
	if (!fs.existsSync(path.join(dataDir, 'PG_VERSION'))) {
		step(`creating PostgreSQL cluster in ${path.relative(process.cwd(), dataDir)}`);
		fs.mkdirSync(dataDir, { recursive: true, mode: 0o700 });
		if (isRoot()) fs.chownSync(dataDir, ...postgresIds());
		const init = pgCommand('initdb', [
			'-D',
			dataDir,
			'-U',
			'postgres',
			'--auth=trust',
			'--encoding=UTF8',
			'--locale=C.UTF-8'
		]);
		const result = capture(init.cmd, init.args, { cwd: '/' });
		if (result.code !== 0) fatal(`initdb failed:\n${result.stdout}${result.stderr}`);
	}
	const settings = [
		`listen_addresses='${host}'`,
		`port=${port}`,
		`unix_socket_directories='${dataDir}'`,
		// Durability does not matter for a throw-away test cluster; speed does.
		...(fast ? ['fsync=off', 'synchronous_commit=off', 'full_page_writes=off'] : [])
	];
	fs.writeFileSync(path.join(dataDir, 'thermalith.conf'), settings.join('\n') + '\n');
	if (isRoot()) fs.chownSync(path.join(dataDir, 'thermalith.conf'), ...postgresIds());
	const mainConf = path.join(dataDir, 'postgresql.conf');
	const conf = fs.readFileSync(mainConf, 'utf8');
	if (!conf.includes("include_if_exists = 'thermalith.conf'")) {
		fs.appendFileSync(mainConf, "\ninclude_if_exists = 'thermalith.conf'\n");
	}

	const runningPort = clusterRunning(dataDir) ? clusterPort(dataDir) : null;
	if (runningPort !== null && runningPort !== port) {
		warn(`PostgreSQL of ${dataDir} is running on port ${runningPort}, not ${port}; restarting it`);
		stopCluster(dataDir);
	}
	if (runningPort === port) {
		ok(`PostgreSQL already running on ${host}:${port}; this run takes it over`);
	} else {
		const problem = await portProblem({
			name: 'PostgreSQL',
			host,
			port,
			variable: 'THERMALITH_POSTGRES_PORT'
		});
		if (problem) fatal(problem);
		const start = pgCommand('pg_ctl', [
			'-D',
			dataDir,
			'-w',
			'-t',
			'30',
			'-l',
			path.join(dataDir, 'server.log'),
			'start'
		]);
		const result = capture(start.cmd, start.args, { cwd: '/' });
		if (result.code !== 0) {
			const log = safeTail(path.join(dataDir, 'server.log'));
			fatal(
				`PostgreSQL did not start on ${host}:${port}:\n${result.stdout}${result.stderr}\n${log}`
			);
		}
		ok(`PostgreSQL started on ${host}:${port}`);
	}
	recordPostgres(dataDir, port);
	return async () => {
		stopCluster(dataDir);
		forgetPostgres();
		ok('PostgreSQL stopped');
	};
}

/** Is a postmaster running for this data folder? @param {string} dataDir */
export function clusterRunning(dataDir) {
	if (!fs.existsSync(path.join(dataDir, 'postmaster.pid'))) return false;
	const status = pgCommand('pg_ctl', ['-D', dataDir, 'status']);
	return capture(status.cmd, status.args, { cwd: '/' }).code === 0;
}

/** The port a running cluster listens on, from its postmaster.pid (4th line). @param {string} dataDir */
function clusterPort(dataDir) {
	try {
		const lines = fs.readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n');
		return Number(lines[3]);
	} catch {
		return null;
	}
}

/** Fast shutdown (open sessions are disconnected), waiting until it is down. @param {string} dataDir */
export function stopCluster(dataDir) {
	const stop = pgCommand('pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', '-t', '60', 'stop']);
	capture(stop.cmd, stop.args, { cwd: '/' });
}

/**
 * Create the database when it does not exist (optionally dropping it first).
 * @param {{ host: string, port: number, database: string, recreate?: boolean }} options
 */
export function ensureDatabase({ host, port, database, recreate = false }) {
	const psql = (/** @type {string} */ sql) =>
		capture(path.join(PG_BIN, 'psql'), [
			'-h',
			host,
			'-p',
			String(port),
			'-U',
			'postgres',
			'-d',
			'postgres',
			'-tAc',
			sql
		]);
	if (recreate) {
		const dropped = psql(`DROP DATABASE IF EXISTS "${database}" WITH (FORCE)`);
		if (dropped.code !== 0) fatal(`could not drop ${database}: ${dropped.stderr}`);
	}
	const exists = psql(`SELECT 1 FROM pg_database WHERE datname = '${database}'`);
	if (exists.code !== 0) fatal(`could not reach PostgreSQL: ${exists.stderr}`);
	if (exists.stdout.trim() !== '1') {
		const created = psql(`CREATE DATABASE "${database}"`);
		if (created.code !== 0) fatal(`could not create ${database}: ${created.stderr}`);
		ok(`database ${database} created`);
	}
}

/** @returns {[number, number]} */
function postgresIds() {
	const passwd = fs
		.readFileSync('/etc/passwd', 'utf8')
		.split('\n')
		.find((l) => l.startsWith('postgres:'));
	if (!passwd) fatal("the 'postgres' system user is missing; reinstall postgresql-15");
	const [, , uid, gid] = passwd.split(':');
	return [Number(uid), Number(gid)];
}

/** @param {string} file */
function safeTail(file) {
	try {
		return fs.readFileSync(file, 'utf8').split('\n').slice(-15).join('\n');
	} catch {
		return '';
	}
}
