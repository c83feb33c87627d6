import { S3Client } from '@aws-sdk/client-s3';

export interface S3Settings {
	endpoint: string;
	region: string;
	accessKeyId: string;
	secretAccessKey: string;
	forcePathStyle: boolean;
}

/**
 * How long one request to the store may take, so that a store that is down or hangs (process
 * stopped, network gone) gives the user an error instead of a request that never ends. The SDK
 * sets no timeouts of its own. requestTimeout runs until the store's answer starts (a 50 MB upload
 * must reach the store within it, fine on one machine or network) and not while a download
 * streams to a slow browser; no idle-socket timeout for that reason. Two attempts in all.
 */
export const STORE_TIMEOUTS = { connectionTimeout: 5_000, requestTimeout: 30_000, maxAttempts: 2 };

/** An S3 client for any S3-compatible store (s3rver locally, MinIO or a cloud service elsewhere). */
export function createS3Client(s: S3Settings, timeouts = STORE_TIMEOUTS): S3Client {
	return new S3Client({
		endpoint: s.endpoint,
		region: s.region,
		forcePathStyle: s.forcePathStyle,
		credentials: { accessKeyId: s.accessKeyId, secretAccessKey: s.secretAccessKey },
		// With the SDK's default checksums, streamed uploads reach s3rver with their aws-chunked
		// framing stored as the object's bytes; only send checksums a store asks for.
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED',
		maxAttempts: timeouts.maxAttempts,
		requestHandler: {
			connectionTimeout: timeouts.connectionTimeout,
			requestTimeout: timeouts.requestTimeout,
			throwOnRequestTimeout: true
		}
	});
}
