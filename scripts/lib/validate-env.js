// @ts-check
/**
 * Check the environment handed to the app before anything starts, with a message that names the
 * variable and says what to set. The app checks the same variables again when it boots
 * (src/lib/server/config.ts), because in production it is started without this script.
 */
import { fatal } from './log.js';

/** @param {Record<string, string>} env */
export function validateEnvironment(env) {
	const problems = [];
	const url = (/** @type {string} */ name, /** @type {string[]} */ protocols) => {
		const value = env[name];
		if (value === undefined) return;
		try {
			const parsed = new URL(value);
			if (!protocols.includes(parsed.protocol)) {
				problems.push(`${name}=${value} must start with ${protocols.join(' or ')}//`);
			}
		} catch {
			problems.push(`${name}=${value} is not a URL (example: ${protocols[0]}//host:port)`);
		}
	};
	url('DATABASE_URL', ['postgres:', 'postgresql:']);
	url('S3_ENDPOINT', ['http:', 'https:']);
	url('SMTP_URL', ['smtp:', 'smtps:']);
	url('ORIGIN', ['http:', 'https:']);
	url('PUBLIC_TILE_URL', ['http:', 'https:']);
	for (const name of ['PORT', 'SMTP_PORT']) {
		const value = env[name];
		if (
			value !== undefined &&
			!(Number.isInteger(Number(value)) && Number(value) > 0 && Number(value) < 65536)
		) {
			problems.push(`${name}=${value} must be a port number between 1 and 65535`);
		}
	}
	for (const name of ['S3_BUCKET', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY', 'S3_REGION']) {
		if (!env[name])
			problems.push(
				`${name} is empty; set it to your object store's ${name.slice(3).toLowerCase().replaceAll('_', ' ')}`
			);
	}
	if ((env.BETTER_AUTH_SECRET ?? '').length < 32) {
		problems.push(
			'BETTER_AUTH_SECRET must be at least 32 characters (generate one with: openssl rand -base64 32)'
		);
	}
	if (problems.length) fatal(`the environment is not usable:\n  - ${problems.join('\n  - ')}`);
}
