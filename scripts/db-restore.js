// @ts-check
/**
 * `npm run db:restore -- FOLDER`: put a backup made by `npm run db:backup` back into the local
 * data (storage/local, or THERMALITH_STORAGE_DIR). Refused while `npm start` or another run holds
 * that folder. Order, so a bad backup destroys nothing: check the backup's files against its
 * manifest; then recreate the database and pg_restore into it; replace the object store's files
 * (by a rename, see replaceFolder); finally count rows and hash objects again and compare with the
 * manifest. Any difference fails the command with the list of differences.
 */
import fs from 'node:fs';
import path from 'node:path';
import { resolveConfig } from './lib/config.js';
import { fatal, ok, step } from './lib/log.js';
import { orchestrate } from './lib/orchestrator.js';
import { PG_BIN, ensureDatabase } from './lib/postgres.js';
import { capture } from './lib/proc.js';
import { claimRun } from './lib/runstate.js';

await orchestrate(async () => {
	const { countRows, differences, hashTree, readManifest, replaceFolder, sha256File } =
		await import('./lib/backup.js');
	const argument = process.argv.slice(2).find((a) => !a.startsWith('-'));
	if (!argument)
		fatal('name the backup folder: npm run db:restore -- storage/backups/thermalith-…');
	const folder = path.resolve(argument);
	const config = resolveConfig('start');
	if (!config.embedded.postgres) {
		fatal('DATABASE_URL points at an external database: restore it with pg_restore yourself');
	}

	let manifest;
	try {
		manifest = readManifest(folder);
	} catch (err) {
		fatal(/** @type {Error} */ (err).message);
	}
	step(`checking ${folder} against its manifest`);
	const dumpFile = path.join(folder, 'database.dump');
	if (!fs.existsSync(dumpFile)) fatal(`${dumpFile} is missing`);
	const damaged = [];
	if ((await sha256File(dumpFile)) !== manifest.dumpSha256) damaged.push('database.dump');
	if (manifest.objects) {
		damaged.push(
			...differences('object', manifest.objects, await hashTree(path.join(folder, 's3')))
		);
	}
	if (damaged.length)
		fatal(`the backup is damaged; nothing was changed:\n  ${damaged.join('\n  ')}`);

	await claimRun(config.storageDir, 'npm run db:restore');
	const { startEmbeddedServices } = await import('./lib/services.js');
	await startEmbeddedServices(config, { only: ['postgres'] });

	const { host, ports, database } = config;
	step(`recreating database ${database} and restoring the dump`);
	ensureDatabase({ host, port: ports.postgres, database, recreate: true });
	const restore = capture(path.join(PG_BIN, 'pg_restore'), [
		'--exit-on-error',
		'--no-owner',
		'-d',
		config.appEnv.DATABASE_URL,
		dumpFile
	]);
	if (restore.code !== 0) fatal(`pg_restore failed:\n${restore.stderr}`);

	if (manifest.objects) {
		step('replacing the object store files');
		replaceFolder(path.join(folder, 's3'), path.join(config.storageDir, 's3'));
	}

	step('verifying the restored data against the manifest');
	const problems = differences(
		'row count of',
		manifest.tables,
		await countRows(config.appEnv.DATABASE_URL)
	);
	if (manifest.objects) {
		problems.push(
			...differences('object', manifest.objects, await hashTree(path.join(config.storageDir, 's3')))
		);
	}
	if (problems.length)
		fatal(`the restored data differs from the backup:\n  ${problems.join('\n  ')}`);
	const rows = Object.values(manifest.tables).reduce((a, b) => a + b, 0);
	ok(
		`restored and verified: ${Object.keys(manifest.tables).length} tables, ${rows} rows` +
			(manifest.objects ? `, ${Object.keys(manifest.objects).length} object files` : '')
	);
	return 0;
});
