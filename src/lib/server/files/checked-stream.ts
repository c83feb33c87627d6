import { createHash } from 'node:crypto';

/**
 * Pass a stored file's bytes through while hashing them, and hold the last chunk back until the
 * SHA-256 and size match what was recorded when the file was checked. If the object was changed
 * in the store behind the app's back, the download fails instead of completing with other bytes.
 */
export function checkedStream(
	source: ReadableStream<Uint8Array>,
	expected: { sha256: string; sizeBytes: number },
	onMismatch: () => void
): ReadableStream<Uint8Array> {
	const hash = createHash('sha256');
	let size = 0;
	let held: Uint8Array | null = null;
	return source.pipeThrough(
		new TransformStream<Uint8Array, Uint8Array>({
			transform(chunk, controller) {
				hash.update(chunk);
				size += chunk.byteLength;
				if (size > expected.sizeBytes) {
					onMismatch();
					controller.error(new Error('stored file is larger than recorded'));
					return;
				}
				if (held) controller.enqueue(held);
				held = chunk;
			},
			flush(controller) {
				if (size !== expected.sizeBytes || hash.digest('hex') !== expected.sha256) {
					onMismatch();
					controller.error(new Error('stored file does not match its recorded SHA-256'));
					return;
				}
				if (held) controller.enqueue(held);
			}
		})
	);
}
