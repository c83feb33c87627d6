import net from 'node:net';
import { HeadBucketCommand } from '@aws-sdk/client-s3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createS3Client, STORE_TIMEOUTS } from './storage-client';

// A "store" that accepts connections and never answers, as a frozen or overloaded one does.
const held: net.Socket[] = [];
const silent = net.createServer((socket) => held.push(socket));
let endpoint: string;

beforeAll(async () => {
	await new Promise<void>((r) => silent.listen(0, '127.0.0.1', r));
	endpoint = `http://127.0.0.1:${(silent.address() as net.AddressInfo).port}`;
});
afterAll(async () => {
	for (const s of held) s.destroy();
	await new Promise((r) => silent.close(r));
});

const settings = () => ({
	endpoint,
	region: 'us-east-1',
	accessKeyId: 'test',
	secretAccessKey: 'test',
	forcePathStyle: true
});

describe('createS3Client', () => {
	it('gives up on a store that never answers (request timeout), after the set attempts', async () => {
		const client = createS3Client(settings(), {
			connectionTimeout: 500,
			requestTimeout: 300,
			maxAttempts: 2
		});
		const err = await client.send(new HeadBucketCommand({ Bucket: 'b' })).catch((e) => e);
		expect(err).toMatchObject({ name: 'TimeoutError' });
		expect(err.$metadata.attempts).toBe(2);
		client.destroy();
	});

	it('has finite timeouts by default (the SDK has none)', async () => {
		expect(STORE_TIMEOUTS.connectionTimeout).toBeGreaterThan(0);
		expect(STORE_TIMEOUTS.requestTimeout).toBeGreaterThan(0);
		const client = createS3Client(settings());
		expect(await client.config.maxAttempts()).toBe(STORE_TIMEOUTS.maxAttempts);
		client.destroy();
	});
});
