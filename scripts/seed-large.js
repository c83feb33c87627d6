// @ts-check
/**
 * `npm run seed:large -- --sites 1000000`: seed the large invented scenario (scripts/lib/large-seed.js)
 * into the database of `npm start` (DATABASE_URL, or the embedded cluster of storage/local, which
 * must be running: start `npm start` first). `npm run seed:large -- --remove` removes it again.
 * The seed is one transaction: it is there completely or not at all.
 */
import { resolveConfig } from './lib/config.js';
import { ok, step } from './lib/log.js';

const USAGE = `usage: npm run seed:large -- [--sites N | --remove]

  --sites N   seed N invented petroleum-well sites (default 1000000, at most 5000000)
  --remove    remove the large demo organisation and everything in it`;

const argv = process.argv.slice(2);
let sites = 1_000_000;
let remove = false;
for (let i = 0; i < argv.length; i++) {
	const a = argv[i];
	if (a === '--remove') remove = true;
	else if (a === '--sites') {
		const n = Number(argv[++i]);
		if (!Number.isInteger(n) || n < 1 || n > 5_000_000) {
			console.error(`--sites needs a whole number from 1 to 5000000\n\n${USAGE}`);
			process.exit(2);
		}
		sites = n;
	} else {
		console.error(`${a === '--help' || a === '-h' ? '' : `unknown option ${a}\n\n`}${USAGE}`);
		process.exit(a === '--help' || a === '-h' ? 0 : 2);
	}
}

const url = resolveConfig('start').appEnv.DATABASE_URL;
const { default: postgres } = await import('postgres');
const { removeLarge, seedLarge } = await import('./lib/large-seed.js');
const sql = postgres(url, { max: 1, onnotice: () => {} });
try {
	await sql`SELECT 1`.catch((err) => {
		throw new Error(
			`cannot reach the database (${err.message}); start \`npm start\` first or set DATABASE_URL`
		);
	});
	const started = Date.now();
	if (remove) {
		step('removing the large demo');
		const n = await removeLarge(sql);
		ok(`removed ${n} sites of the large demo in ${((Date.now() - started) / 1000).toFixed(1)} s`);
	} else {
		step(`seeding ${sites} invented petroleum-well sites`);
		await seedLarge(sql, sites, (m) => console.log(`  ${m}`));
		ok(`seeded ${sites} sites in ${((Date.now() - started) / 1000).toFixed(1)} s`);
	}
} catch (err) {
	console.error(`✗ ${/** @type {Error} */ (err).message}`);
	process.exitCode = 1;
} finally {
	await sql.end({ timeout: 5 });
}
