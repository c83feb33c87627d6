import { env } from '$env/dynamic/private';
import { parseEnv, type AppEnv } from './env-schema.js';

let cached: AppEnv | undefined;

/** The validated environment (parsed on first use; the server hook calls this at boot). */
export function config(): AppEnv {
	cached ??= parseEnv(env);
	return cached;
}
