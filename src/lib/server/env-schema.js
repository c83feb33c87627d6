import { z } from 'zod';

// @ts-check
/**
 * The app's environment: one schema for the app (validated at boot by src/lib/server/config.ts)
 * and the orchestration scripts (scripts/lib/validate-env.js, before anything starts). Plain
 * JavaScript with JSDoc, free of SvelteKit imports, so `node scripts/…` can import it as it is.
 */
/** @param {string[]} protocols */
const url = (protocols) =>
	z
		.string()
		.url({ message: 'must be a URL' })
		.refine((v) => protocols.includes(new URL(v).protocol), {
			message: `must start with ${protocols.join(' or ')}//`
		});

/**
 * Threads one grid job computes IDW on (src/lib/server/grids/idw-threads.ts); 1 = none, unset =
 * min(2, cores). Exported alone because the grid worker script reads just this variable.
 */
export const gridThreadsSchema = z.coerce.number().int().min(1).max(64).optional();

export const envSchema = z
	.object({
		DATABASE_URL: url(['postgres:', 'postgresql:']),
		S3_ENDPOINT: url(['http:', 'https:']),
		S3_BUCKET: z.string().min(3),
		S3_REGION: z.string().min(1).default('us-east-1'),
		S3_ACCESS_KEY_ID: z.string().min(1),
		S3_SECRET_ACCESS_KEY: z.string().min(1),
		S3_FORCE_PATH_STYLE: z.enum(['true', 'false']).default('true'),
		SMTP_URL: url(['smtp:', 'smtps:']).optional(),
		SMTP_HOST: z.string().min(1).optional(),
		SMTP_PORT: z.coerce.number().int().min(1).max(65535).optional(),
		SMTP_USER: z.string().optional(),
		SMTP_PASSWORD: z.string().optional(),
		SMTP_SECURE: z.enum(['true', 'false']).optional(),
		MAIL_FROM: z.string().min(3).default('Thermalith <no-reply@thermalith.local>'),
		MAIL_VIEWER_URL: url(['http:', 'https:']).optional(),
		ORIGIN: url(['http:', 'https:']).optional(),
		PORT: z.coerce
			.number({ message: 'must be a port number between 1 and 65535' })
			.int()
			.min(1)
			.max(65535)
			.optional(),
		PUBLIC_TILE_URL: url(['http:', 'https:']).optional(),
		BETTER_AUTH_SECRET: z.string().min(32, { message: 'must be at least 32 characters' }),
		ATTACHMENT_MAX_BYTES: z.coerce
			.number()
			.int()
			.min(1024)
			.default(50 * 1024 * 1024),
		// "off" on web servers when separate worker instances take the queued jobs (see README).
		THERMALITH_WORKERS: z.enum(['on', 'off']).default('on'),
		// Most sites the map's in-memory index holds per process (41 bytes each); 0 turns it off.
		THERMALITH_MAP_INDEX_MAX_SITES: z.coerce.number().int().min(0).default(5_000_000),
		THERMALITH_GRID_THREADS: gridThreadsSchema,
		THERMALITH_PROFILE: z
			.enum(['dev', 'start', 'test', 'bench', 'production'])
			.default('production')
	})
	.refine((e) => e.SMTP_URL || e.SMTP_HOST, {
		message: 'set SMTP_URL (smtp://host:port) or SMTP_HOST and SMTP_PORT',
		path: ['SMTP_URL']
	});

/** @typedef {z.infer<typeof envSchema>} AppEnv */

/**
 * Every problem of an environment, one line each naming the variable; empty when it is usable.
 * @param {Record<string, string | undefined>} source
 * @returns {string[]}
 */
export function envProblems(source) {
	const result = envSchema.safeParse(source);
	if (result.success) return [];
	return result.error.issues.map((issue) => {
		const name = issue.path.join('.') || 'environment';
		return `${name}: ${issue.code === 'invalid_type' ? 'is not set' : issue.message}`;
	});
}

/**
 * Parse the environment or throw one error that lists every bad variable by name.
 * @param {Record<string, string | undefined>} source
 * @returns {AppEnv}
 */
export function parseEnv(source) {
	const problems = envProblems(source);
	if (problems.length) {
		throw new Error(
			`Thermalith cannot start; fix these environment variables:\n${problems.map((p) => `  - ${p}`).join('\n')}`
		);
	}
	return envSchema.parse(source);
}
