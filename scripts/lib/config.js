// @ts-check
/**
 * Which services to run and with what settings, for the `dev`, `start` and `test` profiles.
 * A variable already set in the environment wins; when it points at an external service
 * (DATABASE_URL, S3_ENDPOINT, SMTP_URL/SMTP_HOST), the embedded one is not started.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** Default ports per profile: one block for development, another for tests, so both can run at once. */
const PORTS = {
	app: { dev: 5173, start: 3000, test: 3311, bench: 3321 },
	postgres: { dev: 54330, start: 54330, test: 54340, bench: 54350 },
	s3: { dev: 54331, start: 54331, test: 54341, bench: 54351 },
	smtp: { dev: 54332, start: 54332, test: 54342, bench: 54352 },
	mailWeb: { dev: 54333, start: 54333, test: 54343, bench: 54353 }
};

/**
 * The variable that moves each embedded service's port (and `PORT` for the app). Setting
 * THERMALITH_PORT_OFFSET shifts every default at once, so a second checkout can run beside the first.
 */
export const PORT_VARIABLES = {
	app: 'PORT',
	postgres: 'THERMALITH_POSTGRES_PORT',
	s3: 'THERMALITH_S3_PORT',
	smtp: 'THERMALITH_SMTP_PORT',
	mailWeb: 'THERMALITH_MAIL_WEB_PORT'
};

/** @typedef {'dev' | 'start' | 'test' | 'bench'} Profile */

/**
 * @param {Profile} profile
 * @param {NodeJS.ProcessEnv} [env]
 */
export function resolveConfig(profile, env = process.env) {
	// THERMALITH_STORAGE_DIR puts a run's data elsewhere (the orchestration tests use throw-away ones).
	const storageDir = env.THERMALITH_STORAGE_DIR
		? path.resolve(env.THERMALITH_STORAGE_DIR)
		: path.join(ROOT, 'storage', profile === 'dev' || profile === 'start' ? 'local' : profile);
	const host = '127.0.0.1';
	const offset = Number(env.THERMALITH_PORT_OFFSET ?? 0);
	if (!Number.isInteger(offset) || offset < 0 || offset > 10000) {
		throw new Error(
			`THERMALITH_PORT_OFFSET=${env.THERMALITH_PORT_OFFSET} must be a whole number from 0 to 10000`
		);
	}
	/** @param {keyof typeof PORTS} name */
	const port = (name) => {
		const variable = PORT_VARIABLES[name];
		const value = env[variable];
		if (value === undefined || value === '') return PORTS[name][profile] + offset;
		const n = Number(value);
		if (!Number.isInteger(n) || n < 1 || n > 65535) {
			throw new Error(`${variable}=${value} must be a port number between 1 and 65535`);
		}
		return n;
	};

	const appPort = port('app');
	const embedded = {
		postgres: !env.DATABASE_URL,
		s3: !env.S3_ENDPOINT,
		mail: !env.SMTP_URL && !env.SMTP_HOST
	};
	const database =
		profile === 'dev' || profile === 'start' ? 'thermalith' : `thermalith_${profile}`;

	/** @type {Record<string, string>} */
	const appEnv = {
		NODE_ENV: profile === 'dev' ? 'development' : profile === 'start' ? 'production' : 'test',
		THERMALITH_PROFILE: profile,
		HOST: env.HOST ?? host,
		PORT: String(appPort),
		ORIGIN: env.ORIGIN ?? `http://${host}:${appPort}`,
		DATABASE_URL: env.DATABASE_URL ?? `postgres://postgres@${host}:${port('postgres')}/${database}`,
		S3_ENDPOINT: env.S3_ENDPOINT ?? `http://${host}:${port('s3')}`,
		S3_BUCKET: env.S3_BUCKET ?? 'thermalith',
		S3_REGION: env.S3_REGION ?? 'us-east-1',
		S3_FORCE_PATH_STYLE: env.S3_FORCE_PATH_STYLE ?? 'true',
		MAIL_FROM: env.MAIL_FROM ?? 'Thermalith <no-reply@thermalith.local>',
		BETTER_AUTH_SECRET: env.BETTER_AUTH_SECRET ?? localSecret(storageDir),
		BODY_SIZE_LIMIT: env.BODY_SIZE_LIMIT ?? '60M'
	};
	// The embedded store checks every signature against a key pair made once per checkout (like
	// the auth secret), never a well-known one; an external store needs its own keys set.
	const s3Keys = embedded.s3 ? localS3Keys(storageDir) : undefined;
	const s3KeyId = env.S3_ACCESS_KEY_ID ?? s3Keys?.accessKeyId;
	const s3Secret = env.S3_SECRET_ACCESS_KEY ?? s3Keys?.secretAccessKey;
	if (s3KeyId !== undefined) appEnv.S3_ACCESS_KEY_ID = s3KeyId;
	if (s3Secret !== undefined) appEnv.S3_SECRET_ACCESS_KEY = s3Secret;
	if (embedded.mail) {
		appEnv.SMTP_URL = `smtp://${host}:${port('smtp')}`;
		appEnv.MAIL_VIEWER_URL = `http://${host}:${port('mailWeb')}`;
	}
	for (const name of [
		'SMTP_URL',
		'SMTP_HOST',
		'SMTP_PORT',
		'SMTP_USER',
		'SMTP_PASSWORD',
		'SMTP_SECURE',
		'PUBLIC_TILE_URL',
		'PUBLIC_TILE_ATTRIBUTION',
		'MAIL_VIEWER_URL'
	]) {
		if (env[name] !== undefined) appEnv[name] = /** @type {string} */ (env[name]);
	}

	return {
		profile,
		host,
		storageDir,
		embedded,
		database,
		ports: {
			app: appPort,
			postgres: port('postgres'),
			s3: port('s3'),
			smtp: port('smtp'),
			mailWeb: port('mailWeb')
		},
		appEnv
	};
}

/**
 * A per-checkout auth secret for local use, kept under storage/ so sessions survive restarts.
 * Production sets BETTER_AUTH_SECRET itself; the app refuses to start there without it.
 * @param {string} storageDir
 */
function localSecret(storageDir) {
	const file = path.join(storageDir, 'auth-secret');
	if (fs.existsSync(file)) return fs.readFileSync(file, 'utf8').trim();
	fs.mkdirSync(storageDir, { recursive: true });
	const secret = crypto.randomBytes(32).toString('base64url');
	fs.writeFileSync(file, secret + '\n', { mode: 0o600 });
	return secret;
}

/**
 * The embedded object store's key pair, made once per storage folder and kept there (mode 0600),
 * so the app, the store and the tests of one checkout share it and nobody else knows it.
 * @param {string} storageDir
 * @returns {{ accessKeyId: string, secretAccessKey: string }}
 */
function localS3Keys(storageDir) {
	const file = path.join(storageDir, 's3-keys.json');
	if (fs.existsSync(file)) return JSON.parse(fs.readFileSync(file, 'utf8'));
	fs.mkdirSync(storageDir, { recursive: true });
	const keys = {
		accessKeyId: `TL${crypto.randomBytes(9).toString('hex').toUpperCase()}`,
		secretAccessKey: crypto.randomBytes(30).toString('base64url')
	};
	// Written to a temporary name and renamed, so a second process never reads half a file.
	const tmp = `${file}.${process.pid}.tmp`;
	fs.writeFileSync(tmp, JSON.stringify(keys) + '\n', { mode: 0o600 });
	fs.renameSync(tmp, file);
	return keys;
}
