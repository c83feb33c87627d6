/**
 * The orchestrators as a user runs them: `npm start` (scripts/start.js) and the test services
 * (scripts/test.js --services-only), each in a throw-away storage folder on ports of their own.
 * They must never leave a service running that blocks the next run: not after a fatal error, a
 * signal, a service that dies, nor a SIGKILL of the orchestrator (and of its watcher).
 */
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { clusterDir } from '../../scripts/lib/postgres.js';
import { launchScript, stopScripts, until } from './helpers/script-runs';

const ROOT = path.resolve('.');
// Ports of their own: 50 above this test run's, clear of the other profiles' blocks.
const OFFSET = Number(process.env.THERMALITH_PORT_OFFSET ?? 0) + 50;
const START_PORTS = { app: 3000, postgres: 54330, s3: 54331, smtp: 54332, mailWeb: 54333 };
const TEST_PORTS = { app: 3311, postgres: 54340, s3: 54341, smtp: 54342, mailWeb: 54343 };
const shifted = (ports: Record<string, number>) =>
	Object.fromEntries(Object.entries(ports).map(([k, v]) => [k, v + OFFSET]));
const storageRoot = path.join(ROOT, 'storage', 'test', `orchestration-${process.pid}`);

const launch = (script: string, args: string[], storage: string) =>
	launchScript(script, args, { offset: OFFSET, storage });

function listening(port: number): Promise<boolean> {
	return new Promise((resolve) => {
		const s = net.connect({ host: '127.0.0.1', port });
		s.once('connect', () => {
			s.destroy();
			resolve(true);
		});
		s.once('error', () => resolve(false));
	});
}

async function anyListening(ports: Record<string, number>) {
	for (const [name, port] of Object.entries(ports)) if (await listening(port)) return name;
	return null;
}

function alive(pid: number) {
	try {
		process.kill(pid, 0);
		return true;
	} catch {
		return false;
	}
}

function record(storage: string, name: string): { pid: number } {
	return JSON.parse(fs.readFileSync(path.join(storage, 'run', `${name}.json`), 'utf8'));
}

async function healthy(port: number) {
	try {
		const res = await fetch(`http://127.0.0.1:${port}/api/health`);
		return res.ok;
	} catch {
		return false;
	}
}

afterEach(stopScripts);

afterAll(() => {
	// As root in a private checkout the clusters live under /var/tmp (clusterDir): remove those too.
	for (const profile of ['start', 'test']) {
		const cluster = clusterDir(path.join(storageRoot, profile, 'postgres'));
		if (!cluster.startsWith(storageRoot)) fs.rmSync(cluster, { recursive: true, force: true });
	}
	fs.rmSync(storageRoot, { recursive: true, force: true });
});

describe('npm start', () => {
	const storage = path.join(storageRoot, 'start');
	const ports = shifted(START_PORTS);

	it('refuses a port held by another program, naming it and the variable, and leaves nothing running', async () => {
		const squatter = net.createServer().listen(ports.smtp, '127.0.0.1');
		await new Promise((r) => squatter.once('listening', r));
		try {
			const run = launch('scripts/start.js', [], storage);
			expect(await run.exited).toBe(1);
			const out = run.output();
			expect(out).toContain(`port 127.0.0.1:${ports.smtp} for the mail service (SMTP)`);
			expect(out).toContain(`process ${process.pid}`);
			expect(out).toContain('THERMALITH_SMTP_PORT');
			const { smtp: _held, ...others } = ports;
			expect(await anyListening(others)).toBeNull();
		} finally {
			squatter.close();
		}
	}, 120_000);

	it('after kill -9 its watcher stops everything, and the next start serves the app', async () => {
		const first = launch('scripts/start.js', [], storage);
		await until('the first start to serve', () => first.output().includes('Thermalith is running'));
		expect(await healthy(ports.app)).toBe(true);
		const s3 = record(storage, 'service-s3').pid;
		first.child.kill('SIGKILL');
		await until('the watcher to stop the services', async () => !(await anyListening(ports)));
		expect(alive(s3)).toBe(false);

		const second = launch('scripts/start.js', [], storage);
		await until('the second start to serve', () =>
			second.output().includes('Thermalith is running')
		);
		expect(await healthy(ports.app)).toBe(true);
		second.child.kill('SIGINT');
		expect(await second.exited).toBe(0);
		expect(second.output()).toContain('everything this run started is stopped');
		expect(await anyListening(ports)).toBeNull();
	}, 600_000);

	it('when the run and its watcher are both killed, the next start stops the leftovers and serves', async () => {
		const first = launch('scripts/start.js', [], storage);
		await until('the first start to serve', () => first.output().includes('Thermalith is running'));
		const reaper = record(storage, 'reaper').pid;
		const app = record(storage, 'service-app').pid;
		process.kill(reaper, 'SIGKILL');
		first.child.kill('SIGKILL');
		await first.exited;
		expect(alive(app)).toBe(true); // the leftover that used to block the next run

		const second = launch('scripts/start.js', [], storage);
		await until('the second start to serve', () =>
			second.output().includes('Thermalith is running')
		);
		expect(second.output()).toMatch(/ended without cleaning up: stopped the app service/);
		expect(alive(app)).toBe(false);
		expect(await healthy(ports.app)).toBe(true);
		second.child.kill('SIGTERM');
		expect(await second.exited).toBe(0);
		expect(await anyListening(ports)).toBeNull();
	}, 600_000);

	it('a service that dies stops the whole run', async () => {
		const run = launch('scripts/start.js', [], storage);
		await until('start to serve', () => run.output().includes('Thermalith is running'));
		process.kill(record(storage, 'service-s3').pid, 'SIGKILL');
		expect(await run.exited).toBe(1);
		expect(run.output()).toContain('the s3 service stopped on its own');
		expect(await anyListening(ports)).toBeNull();
	}, 600_000);
});

describe("npm test's services", () => {
	const storage = path.join(storageRoot, 'test');
	const ports = shifted(TEST_PORTS);

	it('recover after kill -9 of the run and its watcher, and stop cleanly on Ctrl-C', async () => {
		const first = launch('scripts/test.js', ['--services-only'], storage);
		await until('the test services', () => first.output().includes('test services are up'));
		process.kill(record(storage, 'reaper').pid, 'SIGKILL');
		first.child.kill('SIGKILL');
		await first.exited;
		expect(await listening(ports.s3)).toBe(true);

		const second = launch('scripts/test.js', ['--services-only'], storage);
		await until('the test services again', () => second.output().includes('test services are up'));
		expect(second.output()).toContain('ended without cleaning up');
		expect(await healthy(ports.app)).toBe(true);
		second.child.kill('SIGINT');
		await second.exited;
		expect(await anyListening(ports)).toBeNull();
	}, 600_000);
});
