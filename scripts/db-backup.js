// @ts-check
/**
 * `npm run db:backup [-- FOLDER]`: a backup of the local data of `npm start` (storage/local, or
 * THERMALITH_STORAGE_DIR): pg_dump -Fc of the database, a copy of the embedded object store's
 * files and a manifest (row counts, SHA-256 of every object); see scripts/lib/backup.js.
 * While `npm start` runs it backs up from the running services; otherwise it starts the
 * PostgreSQL cluster for the time of the dump and stops it again. The folder appears complete or
 * not at all (written under a temporary name, then renamed).
 */
import fs from 'node:fs';
import path from 'node:path';
import { resolveConfig } from './lib/config.js';
import { fatal, ok, step, warn } from './lib/log.js';
import { orchestrate } from './lib/orchestrator.js';
import { PG_BIN } from './lib/postgres.js';
import { capture } from './lib/proc.js';
import { activeRun, claimRun } from './lib/runstate.js';

await orchestrate(async () => {
	const { MANIFEST_VERSION, countRows, hashTree, sha256File } = await import('./lib/backup.js');
	const config = resolveConfig('start');
	const stamp = new Date().toISOString().replace(/[:.]/g, '-');
	const argument = process.argv.slice(2).find((a) => !a.startsWith('-'));
	const target = path.resolve(
		argument ?? path.join(path.dirname(config.storageDir), 'backups', `thermalith-${stamp}`)
	);
	if (fs.existsSync(target)) fatal(`${target} exists already; name a new folder`);

	const running = activeRun(config.storageDir);
	if (running) {
		ok(`\`${running.label}\` (pid ${running.pid}) is running: backing up from its services`);
	} else {
		await claimRun(config.storageDir, 'npm run db:backup');
		const { startEmbeddedServices } = await import('./lib/services.js');
		await startEmbeddedServices(config, { only: ['postgres'] });
	}

	const partial = `${target}.partial-${process.pid}`;
	fs.rmSync(partial, { recursive: true, force: true });
	fs.mkdirSync(partial, { recursive: true });
	try {
		const url = config.appEnv.DATABASE_URL;
		step(`dumping ${config.database} with pg_dump`);
		const dumpFile = path.join(partial, 'database.dump');
		const dump = capture(path.join(PG_BIN, 'pg_dump'), ['-Fc', '-f', dumpFile, '-d', url]);
		if (dump.code !== 0) fatal(`pg_dump failed:\n${dump.stderr}`);
		const tables = await countRows(url);

		/** @type {Record<string, string> | null} */
		let objects = null;
		if (config.embedded.s3) {
			step('copying the object store files');
			const source = path.join(config.storageDir, 's3');
			if (fs.existsSync(source)) fs.cpSync(source, path.join(partial, 's3'), { recursive: true });
			else fs.mkdirSync(path.join(partial, 's3'));
			// The checksums are of the copy, which is what a restore brings back.
			objects = await hashTree(path.join(partial, 's3'));
		} else {
			warn('S3_ENDPOINT points at an external store: back up its objects with its own tools');
		}
		const manifest = {
			version: MANIFEST_VERSION,
			createdAt: new Date().toISOString(),
			database: config.database,
			dumpSha256: await sha256File(dumpFile),
			tables,
			objects
		};
		fs.writeFileSync(path.join(partial, 'manifest.json'), JSON.stringify(manifest, null, '\t'));
		fs.mkdirSync(path.dirname(target), { recursive: true });
		fs.renameSync(partial, target);
		const rows = Object.values(tables).reduce((a, b) => a + b, 0);
		ok(
			`backup written to ${target}: ${Object.keys(tables).length} tables, ${rows} rows` +
				(objects ? `, ${Object.keys(objects).length} object files` : '')
		);
		if (running) {
			warn(
				'taken while the app ran: an upload finished during the copy may be missing from it; stop `npm start` first for an exact pair'
			);
		}
		return 0;
	} finally {
		fs.rmSync(partial, { recursive: true, force: true });
	}
});
