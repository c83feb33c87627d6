import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyMigrations } from '../../scripts/migrate.js';
import { testEnv } from './env';

// A throw-away database of its own, so this test sees migrations applied to a truly empty one.
const name = `thermalith_migrate_${process.pid}_${Date.now()}`;
let admin: postgres.Sql;
let url: string;

beforeAll(async () => {
	const base = new URL(testEnv.databaseUrl());
	url = Object.assign(new URL(base), { pathname: `/${name}` }).toString();
	admin = postgres(Object.assign(new URL(base), { pathname: '/postgres' }).toString(), { max: 1 });
	await admin.unsafe(`CREATE DATABASE "${name}"`);
});

afterAll(async () => {
	await admin.unsafe(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
	await admin.end();
});

describe('migrations', () => {
	it('apply to an empty database, create PostGIS and the tables, and re-apply as a no-op', async () => {
		await applyMigrations(url);
		const sql = postgres(url, { max: 1, onnotice: () => {} });
		try {
			const [ext] = await sql`SELECT extversion FROM pg_extension WHERE extname = 'postgis'`;
			expect(ext?.extversion).toMatch(/^3\./);
			const tables =
				await sql`SELECT table_name FROM information_schema.tables WHERE table_schema = 'public'`;
			expect(tables.map((t) => t.table_name)).toEqual(
				expect.arrayContaining(['organisation', 'dataset', 'site'])
			);
			const [{ n: before }] =
				await sql`SELECT count(*)::int AS n FROM drizzle.__drizzle_migrations`;
			expect(before).toBeGreaterThanOrEqual(2);

			await applyMigrations(url);
			const [{ n: after }] = await sql`SELECT count(*)::int AS n FROM drizzle.__drizzle_migrations`;
			expect(after).toBe(before);
		} finally {
			await sql.end();
		}
	});
});
