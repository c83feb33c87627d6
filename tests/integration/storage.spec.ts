import { createHash, createHmac, randomBytes, type Hash, type Hmac } from 'node:crypto';
import os from 'node:os';
import net from 'node:net';
import {
	DeleteObjectCommand,
	GetObjectCommand,
	ListObjectsV2Command,
	PutObjectCommand
} from '@aws-sdk/client-s3';
import { SignatureV4 } from '@smithy/signature-v4';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createS3Client } from '../../src/lib/server/storage-client';
import { testEnv } from './env';

/*
 * The embedded object store serves only requests signed with this checkout's key pair. Browsers
 * never reach it (the app streams files), so everything anonymous, presigned or wrongly signed
 * is refused.
 */

const settings = testEnv.s3();
const s3 = createS3Client(settings);
const endpoint = settings.endpoint.replace(/\/$/, '');
const key = `it/${Date.now()}-${randomBytes(4).toString('hex')}/private report.pdf`;
const objectUrl = `${endpoint}/${settings.bucket}/${key.split('/').map(encodeURIComponent).join('/')}`;
const secretBytes = randomBytes(5000);

const bytesOf = (d: string | ArrayBuffer | ArrayBufferView) =>
	typeof d === 'string'
		? Buffer.from(d)
		: ArrayBuffer.isView(d)
			? Buffer.from(d.buffer, d.byteOffset, d.byteLength)
			: Buffer.from(d);

/** A node:crypto hash (an HMAC when given a key) in the shape the AWS signer expects. */
class Sha256 {
	private hash: Hash | Hmac;
	constructor(secret?: string | ArrayBuffer | ArrayBufferView) {
		this.hash = secret ? createHmac('sha256', bytesOf(secret)) : createHash('sha256');
	}
	update(data: string | ArrayBuffer | ArrayBufferView) {
		this.hash.update(bytesOf(data));
	}
	async digest() {
		return new Uint8Array(this.hash.digest());
	}
	reset() {}
}

function signerWith(accessKeyId: string, secretAccessKey: string) {
	return new SignatureV4({
		credentials: { accessKeyId, secretAccessKey },
		region: settings.region,
		service: 's3',
		sha256: Sha256,
		uriEscapePath: false
	});
}

/** Sign a request to the store as the AWS SDK would, and send it with fetch. */
async function signedFetch(
	signer: SignatureV4,
	method: string,
	url: string,
	signedBody: Buffer,
	sentBody: Buffer = signedBody
) {
	const u = new URL(url);
	const signed = await signer.sign({
		method,
		protocol: u.protocol,
		hostname: u.hostname,
		port: Number(u.port),
		path: u.pathname,
		query: Object.fromEntries(u.searchParams),
		headers: {
			host: u.host,
			'x-amz-content-sha256': createHash('sha256').update(signedBody).digest('hex')
		}
	});
	return fetch(url, {
		method,
		headers: signed.headers,
		body: method === 'GET' || method === 'HEAD' ? undefined : new Uint8Array(sentBody)
	});
}

beforeAll(async () => {
	await s3.send(new PutObjectCommand({ Bucket: settings.bucket, Key: key, Body: secretBytes }));
});
afterAll(async () => {
	await s3.send(new DeleteObjectCommand({ Bucket: settings.bucket, Key: key })).catch(() => {});
});

async function storedBytes() {
	const res = await s3.send(new GetObjectCommand({ Bucket: settings.bucket, Key: key }));
	return Buffer.from(await res.Body!.transformToByteArray());
}

describe('embedded object store', () => {
	it('serves the app’s SDK client, signed with the configured keys', async () => {
		expect((await storedBytes()).equals(secretBytes)).toBe(true);
		const listed = await s3.send(
			new ListObjectsV2Command({ Bucket: settings.bucket, Prefix: key.split('/')[0] + '/' })
		);
		expect(listed.Contents?.map((c) => c.Key)).toContain(key);
		// The well-known pair of the S3 fake library is not the configured one.
		expect(settings.accessKeyId).not.toBe('S3RVER');
	});

	it('refuses anonymous listing, reading and writing', async () => {
		const list = await fetch(`${endpoint}/${settings.bucket}/`);
		expect(list.status).toBe(403);
		expect(await list.text()).not.toContain('private report');
		expect((await fetch(`${endpoint}/`)).status).toBe(403);

		expect((await fetch(objectUrl)).status).toBe(403);
		expect((await fetch(objectUrl, { method: 'HEAD' })).status).toBe(403);

		const put = await fetch(objectUrl, { method: 'PUT', body: '<script>alert(1)</script>' });
		expect(put.status).toBe(403);
		const del = await fetch(objectUrl, { method: 'DELETE' });
		expect(del.status).toBe(403);
		// A browser form upload (POST policy) and a CORS preflight get nothing either.
		const form = new FormData();
		form.set('key', key);
		form.set('file', new Blob(['<html>']));
		expect(
			(await fetch(`${endpoint}/${settings.bucket}`, { method: 'POST', body: form })).status
		).toBe(403);
		const preflight = await fetch(objectUrl, {
			method: 'OPTIONS',
			headers: { origin: 'http://evil.example', 'access-control-request-method': 'PUT' }
		});
		expect(preflight.headers.get('access-control-allow-origin')).toBeNull();

		expect((await storedBytes()).equals(secretBytes)).toBe(true);
	});

	it('refuses bogus, wrong-key, well-known-key and presigned signatures', async () => {
		const now = new Date().toISOString().replace(/[-:]|\.\d{3}/g, '');
		const bogus = await fetch(objectUrl, {
			headers: {
				'x-amz-date': now,
				'x-amz-content-sha256': 'UNSIGNED-PAYLOAD',
				authorization: `AWS4-HMAC-SHA256 Credential=${settings.accessKeyId}/${now.slice(0, 8)}/${settings.region}/s3/aws4_request, SignedHeaders=host;x-amz-content-sha256;x-amz-date, Signature=${'0'.repeat(64)}`
			}
		});
		expect(bogus.status).toBe(403);
		expect(await bogus.text()).toContain('SignatureDoesNotMatch');

		// Signature V2 with the library's built-in key (which it would check) is not accepted either.
		const v2 = await fetch(objectUrl, {
			headers: { date: new Date().toUTCString(), authorization: 'AWS S3RVER:bm90LWEtc2lnbmF0dXJl' }
		});
		expect(v2.status).toBe(403);

		const wrongSecret = createS3Client({ ...settings, secretAccessKey: 'not-the-secret' });
		await expect(
			wrongSecret.send(new GetObjectCommand({ Bucket: settings.bucket, Key: key }))
		).rejects.toMatchObject({ name: 'SignatureDoesNotMatch' });
		const wellKnown = createS3Client({
			...settings,
			accessKeyId: 'S3RVER',
			secretAccessKey: 'S3RVER'
		});
		await expect(
			wellKnown.send(
				new PutObjectCommand({ Bucket: settings.bucket, Key: key, Body: Buffer.from('x') })
			)
		).rejects.toMatchObject({ $metadata: { httpStatusCode: 403 } });

		// Presigned URLs are refused, even one signed correctly with the configured keys.
		const u = new URL(objectUrl);
		const presigned = await signerWith(settings.accessKeyId, settings.secretAccessKey).presign(
			{
				method: 'GET',
				protocol: u.protocol,
				hostname: u.hostname,
				port: Number(u.port),
				path: u.pathname,
				headers: { host: u.host }
			},
			{ expiresIn: 60 }
		);
		const query = new URLSearchParams(presigned.query as Record<string, string>);
		const res = await fetch(`${objectUrl}?${query}`);
		expect(res.status).toBe(403);
		expect(Buffer.from(await res.arrayBuffer()).includes(secretBytes.subarray(0, 64))).toBe(false);
		expect((await storedBytes()).equals(secretBytes)).toBe(true);
	});

	it('checks the body against the signed SHA-256, so a signed request cannot carry other bytes', async () => {
		const signer = signerWith(settings.accessKeyId, settings.secretAccessKey);
		const honest = randomBytes(300);
		const swapped = Buffer.from('<html><script>alert(document.cookie)</script></html>');
		const res = await signedFetch(signer, 'PUT', objectUrl, honest, swapped);
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('XAmzContentSHA256Mismatch');
		expect((await storedBytes()).equals(secretBytes)).toBe(true);

		// The same request with the bytes it signed goes through: the check is not a blanket refusal.
		const otherKey = `${key}.copy`;
		const ok = await signedFetch(signer, 'PUT', `${objectUrl}.copy`, honest);
		expect(ok.status).toBe(200);
		const got = await s3.send(new GetObjectCommand({ Bucket: settings.bucket, Key: otherKey }));
		expect(Buffer.from(await got.Body!.transformToByteArray()).equals(honest)).toBe(true);
		await s3.send(new DeleteObjectCommand({ Bucket: settings.bucket, Key: otherKey }));
	});

	const outward = Object.values(os.networkInterfaces())
		.flat()
		.find((a) => a && a.family === 'IPv4' && !a.internal)?.address;
	it.skipIf(!outward)('listens on the loopback interface only', async () => {
		const port = Number(new URL(endpoint).port);
		const reachable = await new Promise<boolean>((resolve) => {
			const socket = net.connect({ host: outward!, port });
			socket.once('connect', () => {
				socket.destroy();
				resolve(true);
			});
			socket.once('error', () => resolve(false));
		});
		expect(reachable).toBe(false);
		expect(new URL(endpoint).hostname).toBe('127.0.0.1');
	});
});
