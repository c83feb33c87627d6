import { S3Client } from '@aws-sdk/client-s3';

export interface S3Settings {
	endpoint: string;
	region: string;
	accessKeyId: string;
	secretAccessKey: string;
	forcePathStyle: boolean;
}

/** An S3 client for any S3-compatible store (s3rver locally, MinIO or a cloud service elsewhere). */
export function createS3Client(s: S3Settings): S3Client {
	return new S3Client({
		endpoint: s.endpoint,
		region: s.region,
		forcePathStyle: s.forcePathStyle,
		credentials: { accessKeyId: s.accessKeyId, secretAccessKey: s.secretAccessKey },
		// With the SDK's default checksums, streamed uploads reach s3rver with their aws-chunked
		// framing stored as the object's bytes; only send checksums a store asks for.
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED'
	});
}
