/**
 * `npm run db:backup` and `npm run db:restore` as a user runs them, in a throw-away storage folder
 * on ports of their own: back up the data of a running `npm start` (demo data plus objects put
 * into its store), damage the database and the objects, restore, and compare row counts and object
 * checksums with what was there before. A restore is refused while `npm start` runs, and a damaged
 * backup is refused before anything is changed.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import postgres from 'postgres';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { launchScript, stopScripts, until } from './helpers/script-runs';

const ROOT = path.resolve('.');
// Ports of their own: 70 above this test run's, clear of the other profiles' blocks and of the
// orchestration tests (50 above: their `npm start` and test services).
const OFFSET = Number(process.env.THERMALITH_PORT_OFFSET ?? 0) + 70;
const PORTS = { app: 3000 + OFFSET, postgres: 54330 + OFFSET, s3: 54331 + OFFSET };
const root = path.join(ROOT, 'storage', 'test', `backup-${process.pid}`);
const storage = path.join(root, 'local');
const databaseUrl = `postgres://postgres@127.0.0.1:${PORTS.postgres}/thermalith`;

const launch = (script: string, args: string[] = []) =>
	launchScript(script, args, { offset: OFFSET, storage });

/** Run a script to its end: its exit code and output. */
async function complete(script: string, args: string[] = []) {
	const run = launch(script, args);
	const code = await run.exited;
	return { code, output: run.output() };
}

/** SHA-256 of every file of the object store, computed here rather than by the scripts. */
function objectChecksums(dir: string): Record<string, string> {
	const out: Record<string, string> = {};
	for (const f of (fs.readdirSync(dir, { recursive: true }) as string[]).sort()) {
		const file = path.join(dir, f);
		if (fs.statSync(file).isFile()) {
			out[f.split(path.sep).join('/')] = crypto
				.createHash('sha256')
				.update(fs.readFileSync(file))
				.digest('hex');
		}
	}
	return out;
}

async function rowCounts(): Promise<Record<string, number>> {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	try {
		const counts: Record<string, number> = {};
		for (const table of ['site', 'dataset', 'user', 'organization', 'measurement']) {
			const exists = await sql`SELECT to_regclass(${`public."${table}"`}) AS t`;
			if (!exists[0].t) continue;
			const [row] = await sql`SELECT count(*)::int AS n FROM ${sql(table)}`;
			counts[table] = row.n;
		}
		return counts;
	} finally {
		await sql.end();
	}
}

afterEach(stopScripts);

afterAll(() => fs.rmSync(root, { recursive: true, force: true }));

describe('db:backup and db:restore', () => {
	it('round-trip: damaged rows and objects come back exactly; refused while npm start runs', async () => {
		const app = launch('scripts/start.js');
		await until('npm start to serve', () => app.output().includes('Thermalith is running'));

		const keys = JSON.parse(fs.readFileSync(path.join(storage, 's3-keys.json'), 'utf8'));
		const s3 = new S3Client({
			endpoint: `http://127.0.0.1:${PORTS.s3}`,
			region: 'us-east-1',
			forcePathStyle: true,
			credentials: { accessKeyId: keys.accessKeyId, secretAccessKey: keys.secretAccessKey }
		});
		for (const [key, body] of [
			['attachments/a/log.las', crypto.randomBytes(50_000)],
			['attachments/b/photo.png', crypto.randomBytes(2_000)]
		] as const) {
			await s3.send(new PutObjectCommand({ Bucket: 'thermalith', Key: key, Body: body }));
		}
		s3.destroy();
		const countsBefore = await rowCounts();
		expect(countsBefore.site).toBeGreaterThan(0);
		const objectsDir = path.join(storage, 's3');
		const objectsBefore = objectChecksums(objectsDir);
		expect(Object.keys(objectsBefore).some((k) => k.includes('log.las'))).toBe(true);

		const backup = path.join(root, 'backups', 'one');
		const made = await complete('scripts/db-backup.js', [backup]);
		expect(made.output).toContain('backing up from its services');
		expect(made.code).toBe(0);
		const manifest = JSON.parse(fs.readFileSync(path.join(backup, 'manifest.json'), 'utf8'));
		expect(manifest.objects).toEqual(objectsBefore);
		expect(manifest.tables['public.site']).toBe(countsBefore.site);

		// Damage: rows gone, one object overwritten, one deleted.
		const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
		await sql`TRUNCATE site, dataset CASCADE`;
		await sql.end();
		const las = Object.keys(objectsBefore).find(
			(k) => k.includes('log.las') && !k.includes('metadata')
		)!;
		const png = Object.keys(objectsBefore).find(
			(k) => k.includes('photo.png') && !k.includes('metadata')
		)!;
		fs.writeFileSync(path.join(objectsDir, las), 'not the log any more');
		fs.rmSync(path.join(objectsDir, png));
		expect((await rowCounts()).site).toBe(0);

		const refused = await complete('scripts/db-restore.js', [backup]);
		expect(refused.code).toBe(1);
		expect(refused.output).toMatch(/another `npm start` \(pid \d+\) is running/);

		app.child.kill('SIGINT');
		expect(await app.exited).toBe(0);

		const restored = await complete('scripts/db-restore.js', [backup]);
		expect(restored.output).toContain('restored and verified');
		expect(restored.code).toBe(0);
		expect(objectChecksums(objectsDir)).toEqual(objectsBefore);

		// An independent look at the restored database, with the cluster started by a cold backup.
		const again = path.join(root, 'backups', 'two');
		const second = await complete('scripts/db-backup.js', [again]);
		expect(second.code).toBe(0);
		const secondManifest = JSON.parse(fs.readFileSync(path.join(again, 'manifest.json'), 'utf8'));
		expect(secondManifest.tables).toEqual(manifest.tables);
		expect(secondManifest.objects).toEqual(objectsBefore);
	}, 600_000);

	it('refuses a damaged backup before changing anything', async () => {
		const backup = path.join(root, 'backups', 'one');
		const damaged = path.join(root, 'backups', 'damaged');
		fs.cpSync(backup, damaged, { recursive: true });
		const manifest = JSON.parse(fs.readFileSync(path.join(damaged, 'manifest.json'), 'utf8'));
		const las = Object.keys(manifest.objects).find((k: string) => k.includes('log.las'))!;
		fs.appendFileSync(path.join(damaged, 's3', las), 'x');
		const before = objectChecksums(path.join(storage, 's3'));

		const result = await complete('scripts/db-restore.js', [damaged]);
		expect(result.code).toBe(1);
		expect(result.output).toContain('the backup is damaged; nothing was changed');
		expect(result.output).toContain(`object ${las}`);
		expect(objectChecksums(path.join(storage, 's3'))).toEqual(before);
	}, 120_000);
});
