import { createHash } from 'node:crypto';
import { HeadObjectCommand } from '@aws-sdk/client-s3';
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

/** Announce, PUT to the presigned URL with plain fetch (as the browser does), and complete. */
async function upload(fileName: string, bytes: Buffer) {
	const start = await contributor.json('/api/v1/attachments', {
		datasetId,
		fileName,
		sizeBytes: bytes.length
	});
	expect(start.status).toBe(201);
	const { id, uploadUrl } = await start.json();
	expect((await fetch(uploadUrl, { method: 'PUT', body: new Uint8Array(bytes) })).status).toBe(200);
	return { id, complete: await contributor.json(`/api/v1/attachments/${id}/complete`) };
}

describe('attachments', () => {
	it('round trip: presign, PUT, check, thumbnail, presigned GET, delete', async () => {
		const png = await sharp({
			create: { width: 900, height: 600, channels: 3, background: '#904217' }
		})
			.png()
			.toBuffer();
		// The browser claims nothing about the type; the name even says .dat — the bytes decide.
		const { id, complete } = await upload('core-box-3.dat', png);
		expect(complete.status).toBe(200);
		const body = await complete.json();
		expect(body).toMatchObject({
			contentType: 'image/png',
			sizeBytes: png.length,
			hasThumbnail: true
		});
		expect(body.sha256).toBe(createHash('sha256').update(png).digest('hex'));

		const [row] = await db.select().from(attachment).where(eq(attachment.id, id));
		const head = await s3.send(
			new HeadObjectCommand({ Bucket: testEnv.s3().bucket, Key: row.objectKey })
		);
		expect(head.ContentLength).toBe(png.length);

		const download = await contributor.get(`/api/v1/attachments/${id}/download`);
		expect(download.status).toBe(302);
		const got = Buffer.from(await (await fetch(download.headers.get('location')!)).arrayBuffer());
		expect(got.equals(png)).toBe(true);

		const thumbRedirect = await contributor.get(`/api/v1/attachments/${id}/thumbnail`);
		const thumb = Buffer.from(
			await (await fetch(thumbRedirect.headers.get('location')!)).arrayBuffer()
		);
		const meta = await sharp(thumb).metadata();
		expect(meta.format).toBe('webp');
		expect(Math.max(meta.width!, meta.height!)).toBe(320);

		// The dataset is private: anonymous visitors and other organisations get 404, not a link.
		expect((await new Client().get(`/api/v1/attachments/${id}/download`)).status).toBe(404);
		const other = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
		expect((await other.get(`/api/v1/attachments/${id}/download`)).status).toBe(404);

		expect((await contributor.json(`/api/v1/attachments/${id}`, undefined, 'DELETE')).status).toBe(
			204
		);
		await expect(
			s3.send(new HeadObjectCommand({ Bucket: testEnv.s3().bucket, Key: row.objectKey }))
		).rejects.toThrow();
		expect(await db.select().from(attachment).where(eq(attachment.id, id))).toEqual([]);
	});

	it('refuses an executable disguised as a PDF and removes it', async () => {
		const exe = Buffer.concat([Buffer.from('MZ'), Buffer.alloc(510, 0)]);
		const { id, complete } = await upload('report.pdf', exe);
		expect(complete.status).toBe(415);
		expect((await complete.json()).message).toContain('executable');
		expect(await db.select().from(attachment).where(eq(attachment.id, id))).toEqual([]);
	});

	it('refuses a file over the size limit before any upload', async () => {
		const res = await contributor.json('/api/v1/attachments', {
			datasetId,
			fileName: 'huge.tif',
			sizeBytes: 51 * 1024 * 1024
		});
		expect(res.status).toBe(413);
		expect((await res.json()).message).toContain('limit is 50 MB');
	});
});
