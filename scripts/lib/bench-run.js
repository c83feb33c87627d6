// @ts-check
/**
 * What `npm run bench` does around the bench files: the set-up a fresh clone lacks
 * (`svelte-kit sync`, which writes the `$lib` alias into .svelte-kit/tsconfig.json for tsx),
 * running one bench file and collecting its figures and failure reason, and recording the machine
 * and commit a run belongs to.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseFigureLines } from './bench-report.js';

/** A bench that takes longer than this is stopped and counted as failed. */
const FILE_TIMEOUT_MS = 30 * 60_000;

/**
 * Generate .svelte-kit/ (tsconfig with the `$lib` paths). A fresh clone has none, and without it
 * every bench importing `$lib` fails with "Cannot find package '$lib'".
 * @param {string} root
 * @returns {{ ok: true } | { ok: false, reason: string }}
 */
export function syncSvelteKit(root) {
	const result = spawnSync(
		process.execPath,
		[path.join(root, 'node_modules/@sveltejs/kit/svelte-kit.js'), 'sync'],
		{ cwd: root, encoding: 'utf8' }
	);
	if (result.status === 0) return { ok: true };
	const output = `${result.stdout ?? ''}${result.stderr ?? ''}`.trim();
	return {
		ok: false,
		reason: `svelte-kit sync failed (exit ${result.status}): ${output || result.error?.message}`
	};
}

/**
 * Run one bench file through tsx, its output shown as it comes, and collect what it reported.
 * @param {{ root: string, file: string, env: NodeJS.ProcessEnv, timeoutMs?: number }} options
 * @returns {Promise<import('./bench-report.js').FileRun>}
 */
export async function runBenchFile({ root, file, env, timeoutMs = FILE_TIMEOUT_MS }) {
	const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thermalith-bench-'));
	const figuresFile = path.join(dir, 'figures.jsonl');
	fs.writeFileSync(figuresFile, '');
	const t0 = performance.now();
	let stderr = '';
	let timedOut = false;
	const exit = await new Promise((resolve) => {
		const child = spawn(
			process.execPath,
			[path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'bench', file)],
			{
				cwd: root,
				env: { ...env, THERMALITH_BENCH_FIGURES: figuresFile },
				stdio: ['ignore', 'inherit', 'pipe']
			}
		);
		const timer = setTimeout(() => {
			timedOut = true;
			child.kill('SIGKILL');
		}, timeoutMs);
		child.stderr?.on('data', (d) => {
			process.stderr.write(d);
			// Only the tail is needed for the reason; keep memory bounded.
			stderr = (stderr + d.toString()).slice(-20_000);
		});
		child.on('error', (err) => {
			clearTimeout(timer);
			resolve({ code: null, error: err.message });
		});
		child.on('close', (code, signal) => {
			clearTimeout(timer);
			resolve({ code, signal });
		});
	});
	const seconds = (performance.now() - t0) / 1000;
	const parsed = parseFigureLines(fs.readFileSync(figuresFile, 'utf8'));
	fs.rmSync(dir, { recursive: true, force: true });
	const { code, signal, error } =
		/** @type {{ code: number | null, signal?: string, error?: string }} */ (exit);
	let reason;
	if (timedOut) reason = `stopped after ${Math.round(timeoutMs / 60_000)} min without finishing`;
	else if (error) reason = `could not start tsx: ${error}`;
	else if (code !== 0) reason = failureReason(stderr) ?? `exited with ${signal ?? `code ${code}`}`;
	else if (parsed.error) reason = parsed.error;
	return { file, exitCode: code, seconds, ...(reason ? { reason } : {}), figures: parsed.figures };
}

/**
 * The line of a failed bench's stderr that says what went wrong: the first error message
 * ("Error [ERR_MODULE_NOT_FOUND]: Cannot find package '$lib' …"), else the last line.
 * @param {string} stderr
 */
export function failureReason(stderr) {
	const lines = stderr
		.split('\n')
		.map((l) => l.trim())
		.filter(Boolean);
	const error = lines.find((l) => /^[A-Za-z]*Error\b.*:/.test(l) && !l.startsWith('at '));
	return error ?? lines.filter((l) => !/^Node\.js v/.test(l)).at(-1) ?? null;
}

/** @returns {import('./bench-report.js').Machine} */
export function machineInfo() {
	const cpus = os.cpus();
	const load = os.loadavg().map((l) => Number(l.toFixed(2)));
	return {
		cores: cpus.length,
		cpuModel: (cpus[0]?.model ?? 'unknown CPU').replace(/\s+/g, ' ').trim(),
		node: process.version,
		platform: `${os.platform()} ${os.release()}`,
		loadAverageStart: load,
		loadAverageEnd: load
	};
}

/**
 * The commit the run measured, and whether tracked files differed from it.
 * @param {string} root
 * @returns {import('./bench-report.js').Commit}
 */
export function gitCommit(root) {
	const head = spawnSync('git', ['rev-parse', 'HEAD'], { cwd: root, encoding: 'utf8' });
	if (head.status !== 0) {
		return { sha: null, dirty: false, reason: 'not a git checkout (or git is not installed)' };
	}
	const status = spawnSync('git', ['status', '--porcelain', '--untracked-files=no'], {
		cwd: root,
		encoding: 'utf8'
	});
	return { sha: head.stdout.trim(), dirty: status.stdout.trim() !== '' };
}

/**
 * Write a file so a reader never sees half of it: a temporary file beside it, then rename.
 * @param {string} file @param {string} text
 */
export function writeFileAtomic(file, text) {
	fs.mkdirSync(path.dirname(file), { recursive: true });
	const tmp = `${file}.${process.pid}.tmp`;
	try {
		fs.writeFileSync(tmp, text);
		fs.renameSync(tmp, file);
	} catch (err) {
		fs.rmSync(tmp, { force: true });
		throw err;
	}
}
