/**
 * Settings of the test services, as `npm test` (scripts/test.js) exports them. These tests need
 * the real PostgreSQL, S3 fake, mail catcher and a running build: run them through `npm test`.
 */
function required(name: string): string {
	const value = process.env[name];
	if (!value) {
		throw new Error(`${name} is not set: run the integration tests through \`npm test\``);
	}
	return value;
}

export const testEnv = {
	databaseUrl: () => required('DATABASE_URL'),
	appUrl: () => required('TEST_APP_URL'),
	mailViewerUrl: () => required('MAIL_VIEWER_URL'),
	smtpUrl: () => required('SMTP_URL'),
	s3: () => ({
		endpoint: required('S3_ENDPOINT'),
		region: required('S3_REGION'),
		accessKeyId: required('S3_ACCESS_KEY_ID'),
		secretAccessKey: required('S3_SECRET_ACCESS_KEY'),
		forcePathStyle: true,
		bucket: required('S3_BUCKET')
	})
};
