// @ts-check
/**
 * AWS Signature Version 4 checking for the embedded S3 fake. s3rver 3 checks only V2 signatures:
 * it lets V4-signed requests through unchecked and unsigned ones as anonymous, so on its own it
 * answers anyone who can reach its port. This module recomputes each request's signature with
 * the AWS SDK's own signer (@smithy/signature-v4) from the configured key pair and compares.
 *
 * Only the Authorization-header form is accepted: the app signs every request itself and hands
 * no presigned URLs to browsers, so query-string signatures are refused outright.
 */
import crypto from 'node:crypto';
import { SignatureV4 } from '@smithy/signature-v4';

/** Largest clock difference accepted, as S3 does (15 minutes). */
const MAX_SKEW_MS = 15 * 60 * 1000;
const HEX_SHA256 = /^[0-9a-f]{64}$/;

/**
 * The hash interface the signer expects (update, then a promised digest; an HMAC when given a
 * secret), backed by node:crypto.
 */
class NodeSha256 {
	/** @param {import('@smithy/types').SourceData} [secret] */
	constructor(secret) {
		this.hash = secret
			? crypto.createHmac('sha256', toBuffer(secret))
			: crypto.createHash('sha256');
	}
	/** @param {import('@smithy/types').SourceData} data */
	update(data) {
		this.hash.update(toBuffer(data));
	}
	async digest() {
		return new Uint8Array(this.hash.digest());
	}
	reset() {
		throw new Error('not used by the signer');
	}
}

/** @param {import('@smithy/types').SourceData} data */
function toBuffer(data) {
	if (typeof data === 'string') return Buffer.from(data, 'utf8');
	if (ArrayBuffer.isView(data)) return Buffer.from(data.buffer, data.byteOffset, data.byteLength);
	return Buffer.from(data);
}

/**
 * @typedef {{ ok: true, payloadHash: string }
 *   | { ok: false, status: number, code: string, message: string }} Verdict
 */

/** @param {number} status @param {string} code @param {string} message @returns {Verdict} */
const refuse = (status, code, message) => ({ ok: false, status, code, message });

/** 20261202T074212Z → Date, or null. @param {string} value */
function parseAmzDate(value) {
	const m = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(value);
	if (!m) return null;
	const [, y, mo, d, h, mi, s] = m.map(Number);
	return new Date(Date.UTC(y, mo - 1, d, h, mi, s));
}

/**
 * @param {{ accessKeyId: string, secretAccessKey: string, region: string }} keys
 */
export function createSigV4Verifier(keys) {
	const signer = new SignatureV4({
		credentials: { accessKeyId: keys.accessKeyId, secretAccessKey: keys.secretAccessKey },
		region: keys.region,
		service: 's3',
		sha256: NodeSha256,
		// S3 signs the path as sent, without the second encoding other services use.
		uriEscapePath: false,
		applyChecksum: false
	});

	/**
	 * Decide whether a request was signed with the configured key pair. The payload hash it
	 * returns is what the client signed; the caller checks the body against it.
	 * @param {{ method: string, url: string, headers: import('node:http').IncomingHttpHeaders }} req
	 * @param {Date} [now]
	 * @returns {Promise<Verdict>}
	 */
	return async function verify(req, now = new Date()) {
		const url = new URL(req.url, 'http://store.invalid');
		if (url.searchParams.has('X-Amz-Signature') || url.searchParams.has('Signature')) {
			return refuse(403, 'AccessDenied', 'Presigned URLs are not accepted by this store.');
		}
		const authorization = req.headers.authorization;
		if (!authorization) {
			return refuse(403, 'AccessDenied', 'Anonymous requests are not accepted by this store.');
		}
		const m =
			/^AWS4-HMAC-SHA256 Credential=([^/,\s]+)\/(\d{8})\/([^/,\s]+)\/s3\/aws4_request,\s*SignedHeaders=([a-z0-9;-]+),\s*Signature=([0-9a-f]{64})$/.exec(
				authorization
			);
		if (!m) {
			return refuse(
				403,
				'AccessDenied',
				'Only AWS Signature Version 4 in the Authorization header is accepted.'
			);
		}
		const [, accessKeyId, scopeDate, region, signedHeaderList, signature] = m;
		if (accessKeyId !== keys.accessKeyId) {
			return refuse(403, 'InvalidAccessKeyId', 'The access key id is not known to this store.');
		}
		if (region !== keys.region) {
			return refuse(403, 'AuthorizationHeaderMalformed', `The region must be ${keys.region}.`);
		}
		const amzDate = String(req.headers['x-amz-date'] ?? '');
		const signingDate = parseAmzDate(amzDate);
		if (!signingDate || amzDate.slice(0, 8) !== scopeDate) {
			return refuse(403, 'AccessDenied', 'X-Amz-Date is missing or does not match the scope.');
		}
		if (Math.abs(now.getTime() - signingDate.getTime()) > MAX_SKEW_MS) {
			return refuse(403, 'RequestTimeTooSkewed', 'The request time is too far from the present.');
		}
		const payloadHash = String(req.headers['x-amz-content-sha256'] ?? '');
		if (payloadHash !== 'UNSIGNED-PAYLOAD' && !HEX_SHA256.test(payloadHash)) {
			return refuse(
				400,
				'InvalidRequest',
				'x-amz-content-sha256 must be the SHA-256 of the body or UNSIGNED-PAYLOAD.'
			);
		}
		const signedHeaders = signedHeaderList.split(';');
		for (const required of ['host', 'x-amz-date', 'x-amz-content-sha256']) {
			if (!signedHeaders.includes(required)) {
				return refuse(403, 'AccessDenied', `The signature must cover the ${required} header.`);
			}
		}
		/** @type {Record<string, string>} */
		const headers = {};
		for (const name of signedHeaders) {
			const value = req.headers[name];
			if (value === undefined) {
				return refuse(403, 'AccessDenied', `The signed header ${name} is missing.`);
			}
			headers[name] = Array.isArray(value) ? value.join(',') : value;
		}
		/** @type {Record<string, string | string[]>} */
		const query = {};
		for (const [key, value] of url.searchParams) {
			const seen = query[key];
			query[key] = seen === undefined ? value : [...[seen].flat(), value];
		}
		const expected = await signer.sign(
			{
				method: req.method,
				protocol: 'http:',
				hostname: url.hostname,
				path: req.url.split('?')[0],
				query,
				headers
			},
			{ signingDate, signableHeaders: new Set(signedHeaders) }
		);
		const expectedSignature = /Signature=([0-9a-f]{64})$/.exec(
			String(expected.headers.authorization)
		)?.[1];
		const same =
			expectedSignature !== undefined &&
			crypto.timingSafeEqual(Buffer.from(expectedSignature), Buffer.from(signature));
		if (!same) {
			return refuse(
				403,
				'SignatureDoesNotMatch',
				'The request signature does not match the one calculated with this store’s key.'
			);
		}
		return { ok: true, payloadHash };
	};
}
