/**
 * Read a request body into memory, stopping as soon as it grows past `maxBytes` (then null), so
 * an upload larger than it announced is refused without being read to the end.
 */
export async function readBodyUpTo(
	body: ReadableStream<Uint8Array> | null,
	maxBytes: number
): Promise<Buffer | null> {
	if (!body) return Buffer.alloc(0);
	const reader = body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > maxBytes) {
			await reader.cancel().catch(() => {});
			return null;
		}
		chunks.push(value);
	}
	return Buffer.concat(chunks, size);
}
