/**
 * The object store stops answering while a file is being uploaded. The embedded store's process
 * is frozen (SIGSTOP) halfway through the upload: its port still accepts connections, nothing
 * answers, which is the hardest case (a store that is gone refuses at once). The upload must end
 * with a clear error (the client's request and connection timeouts, storage-client.ts; without
 * them it never ends), leave no file row behind, and the same file must upload completely once
 * the store answers again.
 */
import fs from 'node:fs';
import path from 'node:path';
import { createHash } from 'node:crypto';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testEnv } from './env';
import { createDraftDataset } from './fixtures';
import { type Client, DEMO_PASSWORD, signIn } from './http';

let contributor: Client;
let datasetId: string;
const sql = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });

/** The embedded store's process, as `npm test` recorded it. */
function storePid(): number {
	const record = path.resolve('storage/test/run/service-s3.json');
	return JSON.parse(fs.readFileSync(record, 'utf8')).pid;
}

const thaw = () => {
	try {
		process.kill(storePid(), 'SIGCONT');
	} catch {
		// already running or gone; nothing to undo
	}
};

async function fileRows(id: string) {
	return (await sql`SELECT id, status FROM attachment WHERE dataset_id = ${id}`).map((r) => ({
		id: r.id as string,
		status: r.status as string
	}));
}

async function announce(fileName: string, sizeBytes: number) {
	const start = await contributor.json('/api/v1/attachments', { datasetId, fileName, sizeBytes });
	expect(start.status).toBe(201);
	return (await start.json()) as { id: string; uploadUrl: string };
}

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `Store down ${Date.now()}`);
});

afterAll(async () => {
	thaw();
	await sql.end();
});

describe('object store down during an upload', () => {
	it('ends with a clear error, keeps no row, and the retry stores the file', async () => {
		const lines = ['depth_m,temperature_c'];
		for (let i = 0; i < 8000; i++) lines.push(`${i * 0.5},${(10 + i * 0.025).toFixed(3)}`);
		const bytes = Buffer.from(lines.join('\n') + '\n');
		const half = Math.floor(bytes.length / 2);
		const { id, uploadUrl } = await announce('well-log.csv', bytes.length);

		// Send the first half, freeze the store, then send the rest.
		let sendRest!: () => void;
		const restWanted = new Promise<void>((r) => (sendRest = r));
		const body = new ReadableStream<Uint8Array>({
			async start(controller) {
				controller.enqueue(new Uint8Array(bytes.subarray(0, half)));
				await restWanted;
				controller.enqueue(new Uint8Array(bytes.subarray(half)));
				controller.close();
			}
		});
		const answer = contributor.putStream(uploadUrl, body);
		process.kill(storePid(), 'SIGSTOP');
		sendRest();

		const put = await answer;
		expect(put.status).toBe(503);
		expect((await put.json()).error.message).toMatch(/file store could not be reached.*not kept/i);
		// No row: neither the pending one nor a ready one.
		expect(await fileRows(datasetId)).toEqual([]);
		// The upload address of the failed attempt is gone too: the browser announces again.
		thaw();
		expect((await contributor.put(uploadUrl, bytes)).status).toBe(404);
		expect(id).toBeTruthy();

		// The store answers again: the same file uploads completely and reads back intact.
		const retry = await announce('well-log.csv', bytes.length);
		const stored = await contributor.put(retry.uploadUrl, bytes);
		expect(stored.status).toBe(200);
		const sha256 = createHash('sha256').update(bytes).digest('hex');
		expect((await stored.json()).sha256).toBe(sha256);
		expect(await fileRows(datasetId)).toEqual([{ id: retry.id, status: 'ready' }]);
		const download = await contributor.get(`/api/v1/attachments/${retry.id}/download`);
		expect(download.status).toBe(200);
		expect(Buffer.from(await download.arrayBuffer()).equals(bytes)).toBe(true);
	}, 240_000);
});
