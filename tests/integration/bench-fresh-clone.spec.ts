/**
 * `npm run bench` on a fresh clone: a copy of the working tree without .svelte-kit/ (what
 * `git clone` + `npm ci` gives), where `$lib` only resolves once the bench runner has run
 * `svelte-kit sync`. The runner's dry run loads every bench file and runs one tiny iteration; no
 * timings are checked here (speed lives in the benchmarks). The database benchmark gets a
 * throw-away database of its own in the test cluster.
 */
import { execFileSync, spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testEnv } from './env';

const ROOT = path.resolve(import.meta.dirname, '../..');
const name = `thermalith_benchdry_${process.pid}_${Date.now()}`;
let clone: string;
let admin: postgres.Sql;
let databaseUrl: string;

/** The files a clone of this working tree would have: tracked plus new, never ignored ones. */
function copyWorkingTree(to: string) {
	const listed = execFileSync('git', ['ls-files', '-z', '-co', '--exclude-standard'], {
		cwd: ROOT,
		encoding: 'utf8'
	});
	for (const file of listed.split('\0').filter(Boolean)) {
		const from = path.join(ROOT, file);
		if (!fs.existsSync(from)) continue; // deleted in the working tree
		fs.mkdirSync(path.dirname(path.join(to, file)), { recursive: true });
		fs.copyFileSync(from, path.join(to, file));
	}
	// "After npm ci": the installed packages, and a lock file no newer than them so the runner
	// does not start `npm ci` (which would write through this link into the real node_modules).
	fs.symlinkSync(path.join(ROOT, 'node_modules'), path.join(to, 'node_modules'), 'dir');
	const installed = fs.statSync(path.join(ROOT, 'node_modules/.package-lock.json'));
	fs.utimesSync(path.join(to, 'package-lock.json'), installed.atime, installed.mtime);
}

function runBench(args: string[], env: NodeJS.ProcessEnv) {
	return new Promise<{ code: number | null; output: string }>((resolve, reject) => {
		const child = spawn(process.execPath, ['scripts/bench.js', ...args], {
			cwd: clone,
			env,
			stdio: ['ignore', 'pipe', 'pipe']
		});
		let output = '';
		child.stdout.on('data', (d) => (output += d));
		child.stderr.on('data', (d) => (output += d));
		child.on('error', reject);
		child.on('close', (code) => resolve({ code, output }));
	});
}

beforeAll(async () => {
	clone = fs.mkdtempSync(path.join(os.tmpdir(), 'thermalith-fresh-clone-'));
	copyWorkingTree(clone);
	const base = new URL(testEnv.databaseUrl());
	databaseUrl = Object.assign(new URL(base), { pathname: `/${name}` }).toString();
	admin = postgres(Object.assign(new URL(base), { pathname: '/postgres' }).toString(), { max: 1 });
	await admin.unsafe(`CREATE DATABASE "${name}"`);
});

afterAll(async () => {
	await admin?.unsafe(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
	await admin?.end();
	if (clone) fs.rmSync(clone, { recursive: true, force: true });
});

describe('npm run bench on a fresh clone', () => {
	it('sets itself up and every bench file starts and reports its figures', async () => {
		expect(fs.existsSync(path.join(clone, '.svelte-kit'))).toBe(false);
		const benchFiles = fs
			.readdirSync(path.join(clone, 'bench'))
			.filter((f) => f.endsWith('.bench.ts'));
		expect(benchFiles.length).toBeGreaterThanOrEqual(4);

		const env: NodeJS.ProcessEnv = { ...process.env, DATABASE_URL: databaseUrl };
		delete env.THERMALITH_BENCH_FIGURES;
		delete env.BENCH_DRY_RUN;
		const { code, output } = await runBench(['--dry-run'], env);
		expect(output).not.toMatch(/Cannot find package '\$lib'/);
		expect(code, output).toBe(0);

		const report = JSON.parse(
			fs.readFileSync(path.join(clone, 'bench/results/dry-run.json'), 'utf8')
		);
		expect(report.dryRun).toBe(true);
		expect(report.files.map((f: { file: string }) => f.file).sort()).toEqual(benchFiles.sort());
		for (const file of report.files) {
			expect(file, file.reason).toMatchObject({ status: 'ran', exitCode: 0 });
			expect(file.figureIds.length).toBeGreaterThan(0);
		}
		expect(report.figures.map((f: { id: string }) => f.id)).toEqual(
			expect.arrayContaining([
				'thermal.monte-carlo-100m',
				'site-geotherm.panel',
				'geostats.kriging-24',
				'import.total'
			])
		);
		// The copy is no git checkout: the report says so instead of naming a commit.
		expect(report.commit).toMatchObject({ sha: null, reason: expect.stringMatching(/git/) });
		expect(report.machine.cores).toBeGreaterThan(0);
	}, 300_000);
});
