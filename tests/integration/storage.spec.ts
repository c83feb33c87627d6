import { randomBytes } from 'node:crypto';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { describe, expect, it } from 'vitest';
import { createS3Client } from '../../src/lib/server/storage-client';
import { testEnv } from './env';

describe('S3 fake', () => {
	it('accepts a presigned PUT from plain fetch and returns the same bytes', async () => {
		const settings = testEnv.s3();
		const s3 = createS3Client(settings);
		const key = `it/${Date.now()}-${randomBytes(4).toString('hex')}.bin`;
		const bytes = randomBytes(200_000);

		const putUrl = await getSignedUrl(
			s3,
			new PutObjectCommand({
				Bucket: settings.bucket,
				Key: key,
				ContentType: 'application/octet-stream'
			}),
			{ expiresIn: 60 }
		);
		const put = await fetch(putUrl, {
			method: 'PUT',
			body: bytes,
			headers: { 'content-type': 'application/octet-stream' }
		});
		expect(put.status).toBe(200);

		const getUrl = await getSignedUrl(
			s3,
			new GetObjectCommand({ Bucket: settings.bucket, Key: key }),
			{
				expiresIn: 60
			}
		);
		const got = Buffer.from(await (await fetch(getUrl)).arrayBuffer());
		expect(got.equals(bytes)).toBe(true);

		await s3.send(new DeleteObjectCommand({ Bucket: settings.bucket, Key: key }));
		expect((await fetch(getUrl)).status).toBe(404);
	});
});
