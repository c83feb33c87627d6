// @ts-check
/**
 * The local S3-compatible object store: s3rver with its data under storage/, the app's bucket
 * created at start. Only requests signed (AWS Signature V4) with the key pair in
 * S3_ACCESS_KEY_ID / S3_SECRET_ACCESS_KEY are served: browsers never talk to it (the app streams
 * uploads and downloads itself), so it needs no CORS rule and accepts no anonymous request.
 * Usage: S3_ACCESS_KEY_ID=… S3_SECRET_ACCESS_KEY=… \
 *   node scripts/services/s3-fake.js --port 54331 --directory storage/local/s3 --bucket thermalith
 * The keys come from the environment, not the command line, so `ps` does not show them.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import { Readable } from 'node:stream';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';
import { createSigV4Verifier } from './s3-auth.js';

const { values } = parseArgs({
	options: {
		port: { type: 'string', default: '54331' },
		address: { type: 'string', default: '127.0.0.1' },
		directory: { type: 'string' },
		bucket: { type: 'string', default: 'thermalith' },
		// Bodies with a signed SHA-256 are held in memory until checked; attachments are far smaller.
		'max-body-mb': { type: 'string', default: '256' }
	}
});
if (!values.directory) throw new Error('--directory is required');
const accessKeyId = process.env.S3_ACCESS_KEY_ID;
const secretAccessKey = process.env.S3_SECRET_ACCESS_KEY;
if (!accessKeyId || !secretAccessKey) {
	throw new Error('S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY must be set for the S3 fake');
}
const maxBodyBytes = Number(values['max-body-mb']) * 1024 * 1024;
fs.mkdirSync(values.directory, { recursive: true });

const verify = createSigV4Verifier({
	accessKeyId,
	secretAccessKey,
	region: process.env.S3_REGION || 'us-east-1'
});

/** @param {string} s */
const xmlEscape = (s) =>
	s.replace(
		/[<>&'"]/g,
		(c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', "'": '&apos;', '"': '&quot;' })[c] ?? c
	);

/**
 * The parts of s3rver's Koa context used here (s3rver and Koa ship no types).
 * @typedef {{ method: string, url: string, headers: import('node:http').IncomingHttpHeaders,
 *   req: import('node:http').IncomingMessage, status: number, type: string, body: unknown }} Ctx
 */

/**
 * Answer with an S3 error document (the SDK turns its Code into the error's name).
 * @param {Ctx} ctx @param {number} status @param {string} code @param {string} message
 */
function answerError(ctx, status, code, message) {
	ctx.status = status;
	ctx.type = 'application/xml';
	ctx.body = `<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${code}</Code><Message>${xmlEscape(message)}</Message></Error>`;
}

/**
 * Read a request body into memory, or null when it is larger than the limit.
 * @param {import('node:http').IncomingMessage} req
 */
async function readBody(req) {
	/** @type {Buffer[]} */
	const chunks = [];
	let size = 0;
	for await (const chunk of req) {
		size += chunk.length;
		if (size > maxBodyBytes) return null;
		chunks.push(chunk);
	}
	return Buffer.concat(chunks);
}

/**
 * Runs before every s3rver middleware: check the signature, then the body against the SHA-256
 * the client signed (as S3 does), so a captured request cannot carry other bytes.
 * @param {Ctx} ctx @param {() => Promise<void>} next
 */
async function authenticate(ctx, next) {
	const verdict = await verify({ method: ctx.method, url: ctx.url, headers: ctx.headers });
	if (!verdict.ok) return answerError(ctx, verdict.status, verdict.code, verdict.message);
	if (verdict.payloadHash !== 'UNSIGNED-PAYLOAD') {
		const body = await readBody(ctx.req);
		if (!body) {
			return answerError(ctx, 413, 'EntityTooLarge', 'The body is larger than this store takes.');
		}
		if (crypto.createHash('sha256').update(body).digest('hex') !== verdict.payloadHash) {
			return answerError(
				ctx,
				400,
				'XAmzContentSHA256Mismatch',
				'The body does not match the signed x-amz-content-sha256.'
			);
		}
		// s3rver reads the body from ctx.req (pipe or 'data' events): hand it the checked bytes.
		ctx.req = /** @type {any} */ (Readable.from(body.length ? [body] : []));
	}
	// Checked here; s3rver would look the key up in its own account list, which holds only its
	// built-in key, so it gets the request without the header (its anonymous path).
	delete ctx.headers.authorization;
	await next();
}

const server = new S3rver({
	port: Number(values.port),
	address: values.address,
	directory: values.directory,
	silent: true,
	configureBuckets: [{ name: values.bucket, configs: [] }]
});
// s3rver is a Koa application; Koa composes `middleware` when the server starts listening, so the
// check placed first here runs before s3rver's routes on every request. (Its types omit both.)
const internals = /** @type {any} */ (server);
internals.middleware.unshift(authenticate);
// Earlier versions gave the bucket an open CORS rule for browser uploads; nothing needs it now.
await internals.store.deleteSubresource(values.bucket, undefined, 'cors').catch(() => {});
await server.run();
console.log(
	`S3 fake listening on http://${values.address}:${values.port} (bucket ${values.bucket}, signed requests only)`
);

for (const signal of /** @type {const} */ (['SIGINT', 'SIGTERM'])) {
	process.on(signal, async () => {
		await server.close();
		process.exit(0);
	});
}
