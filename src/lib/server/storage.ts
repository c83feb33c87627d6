import type { S3Client } from '@aws-sdk/client-s3';
import { config } from './config';
import { createS3Client } from './storage-client';

let client: S3Client | undefined;

/** The app's S3 client for the configured object store. */
export function s3(): S3Client {
	if (client) return client;
	const c = config();
	client = createS3Client({
		endpoint: c.S3_ENDPOINT,
		region: c.S3_REGION,
		accessKeyId: c.S3_ACCESS_KEY_ID,
		secretAccessKey: c.S3_SECRET_ACCESS_KEY,
		forcePathStyle: c.S3_FORCE_PATH_STYLE === 'true'
	});
	return client;
}

export function bucket(): string {
	return config().S3_BUCKET;
}
