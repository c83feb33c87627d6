import { cp, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyMigrations } from '../../scripts/migrate.js';
import { testEnv } from './env';

// A throw-away database of its own, so this test sees migrations applied to a truly empty one.
const name = `thermalith_migrate_${process.pid}_${Date.now()}`;
const legacyName = `${name}_legacy`;
let admin: postgres.Sql;
let url: string;
let legacyUrl: string;

beforeAll(async () => {
	const base = new URL(testEnv.databaseUrl());
	url = Object.assign(new URL(base), { pathname: `/${name}` }).toString();
	admin = postgres(Object.assign(new URL(base), { pathname: '/postgres' }).toString(), { max: 1 });
	await admin.unsafe(`CREATE DATABASE "${name}"`);
	legacyUrl = Object.assign(new URL(base), { pathname: `/${legacyName}` }).toString();
	await admin.unsafe(`CREATE DATABASE "${legacyName}"`);
});

afterAll(async () => {
	await admin.unsafe(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
	await admin.unsafe(`DROP DATABASE IF EXISTS "${legacyName}" WITH (FORCE)`);
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

	it('turn stored quality text into the quality_class enum, refusing unknown values whole', async () => {
		// The migrations up to 0005, when quality_class was still text.
		const folder = await mkdtemp(path.join(tmpdir(), 'thermalith-migrations-'));
		const sql = postgres(legacyUrl, { max: 1, onnotice: () => {} });
		try {
			await cp(fileURLToPath(new URL('../../drizzle', import.meta.url)), folder, {
				recursive: true
			});
			const journalPath = path.join(folder, 'meta', '_journal.json');
			const journal = JSON.parse(await readFile(journalPath, 'utf8'));
			journal.entries = journal.entries.filter(
				(e: { tag: string }) => e.tag < '0006_quality_class_enum'
			);
			await writeFile(journalPath, JSON.stringify(journal));
			await migrate(drizzle(sql), { migrationsFolder: folder });

			await sql`INSERT INTO organisation (id, name, slug) VALUES ('o', 'Org', 'o')`;
			const [{ id }] = await sql`INSERT INTO dataset (organisation_id, title, licence)
				VALUES ('o', 'Old', 'CC0-1.0') RETURNING id`;
			await sql`INSERT INTO site (dataset_id, code, location, quality_class) VALUES
				(${id}, 'A', ST_SetSRID(ST_MakePoint(1, 2), 4326), 'constrained'),
				(${id}, 'B', ST_SetSRID(ST_MakePoint(1, 2), 4326), NULL),
				(${id}, 'C', ST_SetSRID(ST_MakePoint(1, 2), 4326), 'grade A')`;

			const refusal = await applyMigrations(legacyUrl).then(
				() => null,
				(e: Error & { cause?: Error }) => e.cause?.message ?? e.message
			);
			expect(refusal).toMatch(/not quality classes: 'grade A'/);
			const [{ type }] = await sql`SELECT data_type AS type FROM information_schema.columns
				WHERE table_name = 'site' AND column_name = 'quality_class'`;
			expect(type).toBe('text');

			await sql`UPDATE site SET quality_class = 'indicative' WHERE code = 'C'`;
			await applyMigrations(legacyUrl);
			const rows =
				await sql`SELECT code, quality_class::text AS q, pg_typeof(quality_class)::text AS t
				FROM site ORDER BY code`;
			expect(rows.map((r) => [r.code, r.q, r.t])).toEqual([
				['A', 'constrained', 'quality_class'],
				['B', null, 'quality_class'],
				['C', 'indicative', 'quality_class']
			]);
		} finally {
			await sql.end();
			await rm(folder, { recursive: true, force: true });
		}
	});
});
