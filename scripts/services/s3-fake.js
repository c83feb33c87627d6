// @ts-check
/**
 * The local S3-compatible object store: s3rver with its data under storage/, the app's bucket
 * created with a CORS rule so browsers can PUT to presigned URLs.
 * Usage: node scripts/services/s3-fake.js --port 54331 --directory storage/local/s3 --bucket thermalith
 */
import fs from 'node:fs';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

const { values } = parseArgs({
	options: {
		port: { type: 'string', default: '54331' },
		address: { type: 'string', default: '127.0.0.1' },
		directory: { type: 'string' },
		bucket: { type: 'string', default: 'thermalith' }
	}
});
if (!values.directory) throw new Error('--directory is required');
fs.mkdirSync(values.directory, { recursive: true });

const cors = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

const server = new S3rver({
	port: Number(values.port),
	address: values.address,
	directory: values.directory,
	silent: true,
	configureBuckets: [{ name: values.bucket, configs: [cors] }]
});
await server.run();
console.log(
	`S3 fake listening on http://${values.address}:${values.port} (bucket ${values.bucket})`
);

for (const signal of /** @type {const} */ (['SIGINT', 'SIGTERM'])) {
	process.on(signal, async () => {
		await server.close();
		process.exit(0);
	});
}
