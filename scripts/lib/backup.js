// @ts-check
/**
 * What `npm run db:backup` writes and `npm run db:restore` checks. A backup is a folder:
 *   database.dump   pg_dump custom format (-Fc) of the app's database
 *   s3/             a copy of the embedded object store's files (storage/<profile>/s3)
 *   manifest.json   row count of every table, SHA-256 of the dump and of every object file
 * The manifest is what makes a restore checkable: before anything is replaced the backup's own
 * files must match it, and afterwards the restored database and objects must match it again.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import postgres from 'postgres';

export const MANIFEST_VERSION = 1;

/**
 * @typedef {{
 *   version: number,
 *   createdAt: string,
 *   database: string,
 *   dumpSha256: string,
 *   tables: Record<string, number>,
 *   objects: Record<string, string> | null
 * }} Manifest
 */

/** @param {string} file @returns {Promise<string>} */
export function sha256File(file) {
	return new Promise((resolve, reject) => {
		const hash = crypto.createHash('sha256');
		fs.createReadStream(file)
			.on('data', (chunk) => hash.update(chunk))
			.on('error', reject)
			.on('end', () => resolve(hash.digest('hex')));
	});
}

/**
 * SHA-256 of every file under `dir`, keyed by its path relative to `dir` (always with `/`).
 * @param {string} dir @returns {Promise<Record<string, string>>}
 */
export async function hashTree(dir) {
	/** @type {Record<string, string>} */
	const out = {};
	if (!fs.existsSync(dir)) return out;
	const files = /** @type {string[]} */ (fs.readdirSync(dir, { recursive: true }))
		.filter((f) => fs.statSync(path.join(dir, f)).isFile())
		.sort();
	for (const f of files) out[f.split(path.sep).join('/')] = await sha256File(path.join(dir, f));
	return out;
}

/**
 * Exact row count of every ordinary table outside PostgreSQL's own schemas (partitions are
 * counted as themselves, so a partitioned table's rows are counted once).
 * @param {string} databaseUrl @returns {Promise<Record<string, number>>}
 */
export async function countRows(databaseUrl) {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	try {
		const tables = await sql`
			SELECT n.nspname AS schema, c.relname AS name
			FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
			WHERE c.relkind = 'r'
			  AND n.nspname NOT IN ('pg_catalog', 'information_schema')
			  AND n.nspname NOT LIKE 'pg_toast%'
			ORDER BY 1, 2`;
		/** @type {Record<string, number>} */
		const counts = {};
		for (const { schema, name } of tables) {
			const [row] = await sql`SELECT count(*)::bigint AS n FROM ${sql(schema)}.${sql(name)}`;
			counts[`${schema}.${name}`] = Number(row.n);
		}
		return counts;
	} finally {
		await sql.end();
	}
}

/**
 * Differences between what a manifest promises and what was found, in words (empty when equal).
 * @param {string} what e.g. "row count" @param {Record<string, string | number>} expected
 * @param {Record<string, string | number>} actual
 */
export function differences(what, expected, actual) {
	const problems = [];
	for (const [key, value] of Object.entries(expected)) {
		if (!(key in actual)) problems.push(`${what} ${key}: missing`);
		else if (actual[key] !== value)
			problems.push(`${what} ${key}: expected ${value}, found ${actual[key]}`);
	}
	for (const key of Object.keys(actual)) {
		if (!(key in expected)) problems.push(`${what} ${key}: not in the backup`);
	}
	return problems;
}

/** @param {string} folder @returns {Manifest} */
export function readManifest(folder) {
	const file = path.join(folder, 'manifest.json');
	if (!fs.existsSync(file)) throw new Error(`${folder} holds no manifest.json: not a backup`);
	/** @type {Manifest} */
	const manifest = JSON.parse(fs.readFileSync(file, 'utf8'));
	if (manifest.version !== MANIFEST_VERSION) {
		throw new Error(
			`${file} has version ${manifest.version}; this version reads ${MANIFEST_VERSION}`
		);
	}
	return manifest;
}

/**
 * Copy a folder to `target` through a temporary sibling and a rename, so `target` is either the
 * old folder or a complete new copy, never half of one.
 * @param {string} source @param {string} target
 */
export function replaceFolder(source, target) {
	const tmp = `${target}.restoring-${process.pid}`;
	const old = `${target}.old-${process.pid}`;
	fs.rmSync(tmp, { recursive: true, force: true });
	if (fs.existsSync(source)) fs.cpSync(source, tmp, { recursive: true });
	else fs.mkdirSync(tmp, { recursive: true });
	if (fs.existsSync(target)) fs.renameSync(target, old);
	fs.renameSync(tmp, target);
	fs.rmSync(old, { recursive: true, force: true });
}
