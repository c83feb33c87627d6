import { createHash } from 'node:crypto';
import { HeadObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { attachment } from '../../src/lib/server/db/schema';
import { createS3Client } from '../../src/lib/server/storage-client';
import { testEnv } from './env';
import { createDraftDataset } from './fixtures';
import { Client, DEMO_PASSWORD, signIn } from './http';

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const s3 = createS3Client(testEnv.s3());
let contributor: Client;
let datasetId: string;

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	datasetId = await createDraftDataset(contributor, `Files test ${Date.now()}`);
});
afterAll(async () => {
	await sql.end();
});

const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** Announce a file; returns its id and the upload URL the browser is given. */
async function announce(fileName: string, sizeBytes: number) {
	const start = await contributor.json('/api/v1/attachments', { datasetId, fileName, sizeBytes });
	expect(start.status).toBe(201);
	return (await start.json()) as { id: string; uploadUrl: string };
}

/** Announce, then PUT the bytes to the upload URL (as the browser does). */
async function upload(fileName: string, bytes: Buffer) {
	const { id, uploadUrl } = await announce(fileName, bytes.length);
	return { id, uploadUrl, put: await contributor.put(uploadUrl, bytes) };
}

async function pngOf(colour: string) {
	return sharp({ create: { width: 900, height: 600, channels: 3, background: colour } })
		.png()
		.toBuffer();
}

describe('attachments', () => {
	it('round trip through the app: announce, PUT, check, thumbnail, download, delete', async () => {
		const png = await pngOf('#904217');
		// The browser claims nothing about the type; the name even says .dat — the bytes decide.
		const { id, uploadUrl, put } = await upload('core-box-3.dat', png);
		// The browser is sent to the app's own origin, never to the object store.
		expect(uploadUrl).toBe(`/api/v1/attachments/${id}/content`);
		expect(new URL(uploadUrl, testEnv.appUrl()).origin).toBe(new URL(testEnv.appUrl()).origin);
		expect(put.status).toBe(200);
		const body = await put.json();
		expect(body).toMatchObject({
			contentType: 'image/png',
			sizeBytes: png.length,
			hasThumbnail: true
		});
		expect(body.sha256).toBe(sha256(png));

		const [row] = await db.select().from(attachment).where(eq(attachment.id, id));
		expect(row.status).toBe('ready');
		const head = await s3.send(
			new HeadObjectCommand({ Bucket: testEnv.s3().bucket, Key: row.objectKey })
		);
		expect(head.ContentLength).toBe(png.length);

		// The app serves the bytes itself, with the sniffed type, as a download.
		const download = await contributor.get(`/api/v1/attachments/${id}/download`);
		expect(download.status).toBe(200);
		expect(download.headers.get('content-type')).toBe('image/png');
		expect(download.headers.get('x-content-type-options')).toBe('nosniff');
		expect(download.headers.get('content-disposition')).toBe(
			"attachment; filename*=UTF-8''core-box-3.dat"
		);
		expect(download.headers.get('location')).toBeNull();
		expect(Buffer.from(await download.arrayBuffer()).equals(png)).toBe(true);

		const headOnly = await contributor.get(`/api/v1/attachments/${id}/download`, 'HEAD');
		expect(headOnly.status).toBe(200);
		expect(headOnly.headers.get('content-length')).toBe(String(png.length));

		const thumbRes = await contributor.get(`/api/v1/attachments/${id}/thumbnail`);
		expect(thumbRes.status).toBe(200);
		expect(thumbRes.headers.get('content-type')).toBe('image/webp');
		const meta = await sharp(Buffer.from(await thumbRes.arrayBuffer())).metadata();
		expect(meta.format).toBe('webp');
		expect(Math.max(meta.width!, meta.height!)).toBe(320);

		// The dataset is private: anonymous visitors and other organisations get 404, not bytes.
		const anonymous = new Client();
		expect((await anonymous.get(`/api/v1/attachments/${id}/download`)).status).toBe(404);
		expect((await anonymous.get(`/api/v1/attachments/${id}/thumbnail`)).status).toBe(404);
		expect((await anonymous.get(`/api/v1/attachments/${id}/download`, 'HEAD')).status).toBe(404);
		const other = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
		const otherDownload = await other.get(`/api/v1/attachments/${id}/download`);
		expect(otherDownload.status).toBe(404);
		expect(Buffer.from(await otherDownload.arrayBuffer()).includes(png.subarray(0, 64))).toBe(
			false
		);
		expect((await other.get(`/api/v1/attachments/${id}/thumbnail`)).status).toBe(404);

		expect((await contributor.json(`/api/v1/attachments/${id}`, undefined, 'DELETE')).status).toBe(
			204
		);
		await expect(
			s3.send(new HeadObjectCommand({ Bucket: testEnv.s3().bucket, Key: row.objectKey }))
		).rejects.toThrow();
		expect(await db.select().from(attachment).where(eq(attachment.id, id))).toEqual([]);
	});

	it('never lets a checked file be replaced: later uploads are refused, the bytes stay', async () => {
		const png = await pngOf('#2f5d8a');
		const { id, uploadUrl, put } = await upload('core-photo.png', png);
		expect(put.status).toBe(200);
		const [before] = await db.select().from(attachment).where(eq(attachment.id, id));

		// HTML of exactly the same size, sent to the same upload URL after the check.
		const html = Buffer.alloc(png.length, ' ');
		html.write('<html><script>alert(document.cookie)</script></html>');
		const again = await contributor.put(uploadUrl, html);
		expect(again.status).toBe(409);
		expect((await again.json()).error.message).toContain('cannot be replaced');

		const [after] = await db.select().from(attachment).where(eq(attachment.id, id));
		expect(after).toEqual(before);
		expect(after.sha256).toBe(sha256(png));
		const served = await contributor.get(`/api/v1/attachments/${id}/download`);
		expect(served.headers.get('content-type')).toBe('image/png');
		expect(sha256(Buffer.from(await served.arrayBuffer()))).toBe(sha256(png));
	});

	it('stops a download whose stored bytes no longer match the checked SHA-256', async () => {
		const csv = Buffer.from('depth_m;temperature_c\n10;8.1\n20;8.4\n');
		const { id, put } = await upload('log.csv', csv);
		expect(put.status).toBe(200);
		const [row] = await db.select().from(attachment).where(eq(attachment.id, id));
		// Someone with the store's keys swaps the object behind the app's back (same size).
		const swapped = Buffer.from(csv.toString().replace('8.1', '9.9'));
		await s3.send(
			new PutObjectCommand({ Bucket: testEnv.s3().bucket, Key: row.objectKey, Body: swapped })
		);
		// The connection breaks (before or after the headers, by size): never a complete file.
		const read = contributor
			.get(`/api/v1/attachments/${id}/download`)
			.then((res) => res.arrayBuffer());
		await expect(read).rejects.toThrow();
	});

	it('lets exactly one of two racing uploads of a pending file win', async () => {
		const a = Buffer.from('site;q\nA-1;61.0\n');
		const b = Buffer.from('site;q\nB-1;72.0\n');
		const { id, uploadUrl } = await announce('race.csv', a.length);
		const results = await Promise.all([
			contributor.put(uploadUrl, a),
			contributor.put(uploadUrl, b)
		]);
		expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
		const winner = results[0].status === 200 ? a : b;
		const served = await contributor.get(`/api/v1/attachments/${id}/download`);
		expect(Buffer.from(await served.arrayBuffer()).equals(winner)).toBe(true);
		const [row] = await db.select().from(attachment).where(eq(attachment.id, id));
		expect(row.sha256).toBe(sha256(winner));
	});

	it('refuses an executable disguised as a PDF and removes it', async () => {
		const exe = Buffer.concat([Buffer.from('MZ'), Buffer.alloc(510, 0)]);
		const { id, put } = await upload('report.pdf', exe);
		expect(put.status).toBe(415);
		expect((await put.json()).error.message).toContain('executable');
		expect(await db.select().from(attachment).where(eq(attachment.id, id))).toEqual([]);
	});

	it('refuses bytes that do not have the announced size', async () => {
		const { id, uploadUrl } = await announce('short.txt', 100);
		const res = await contributor.put(uploadUrl, Buffer.from('only a few bytes'));
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toContain('announced size');
		expect(await db.select().from(attachment).where(eq(attachment.id, id))).toEqual([]);
	});

	it('takes bytes only from the person who announced the file', async () => {
		const bytes = Buffer.from('notes\n');
		const { id, uploadUrl } = await announce('notes.txt', bytes.length);
		// The organisation's owner may upload to this dataset, but did not announce this file.
		const owner = await signIn('owner@korvald-survey.example', DEMO_PASSWORD);
		const res = await owner.put(uploadUrl, bytes);
		expect(res.status).toBe(403);
		expect((await res.json()).error.message).toContain('announced');
		expect((await new Client().put(uploadUrl, bytes)).status).toBe(401);
		const [row] = await db.select().from(attachment).where(eq(attachment.id, id));
		expect(row.status).toBe('pending');
	});

	it('answers 404, not 500, for ids that are not file ids', async () => {
		expect(
			(await contributor.put('/api/v1/attachments/not-a-uuid/content', Buffer.from('x'))).status
		).toBe(404);
		expect((await contributor.get('/api/v1/attachments/not-a-uuid/download')).status).toBe(404);
		expect(
			(await contributor.json('/api/v1/attachments/not-a-uuid', undefined, 'DELETE')).status
		).toBe(404);
	});

	it('refuses a file over the size limit before any upload', async () => {
		const res = await contributor.json('/api/v1/attachments', {
			datasetId,
			fileName: 'huge.tif',
			sizeBytes: 51 * 1024 * 1024
		});
		expect(res.status).toBe(413);
		expect((await res.json()).error.message).toContain('limit is 50 MB');
	});
});
