import { createHash } from 'node:crypto';
import { describe, expect, it, vi } from 'vitest';
import { checkedStream } from './checked-stream';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const streamOf = (...chunks: string[]) =>
	new ReadableStream<Uint8Array>({
		start(c) {
			for (const s of chunks) c.enqueue(new TextEncoder().encode(s));
			c.close();
		}
	});
const collect = async (s: ReadableStream<Uint8Array>) =>
	Buffer.from(await new Response(s).arrayBuffer()).toString();

describe('checkedStream', () => {
	it('passes the recorded bytes through unchanged', async () => {
		const bytes = new TextEncoder().encode('core photo bytes');
		const onMismatch = vi.fn();
		const out = checkedStream(
			streamOf('core ', 'photo ', 'bytes'),
			{ sha256: sha(bytes), sizeBytes: bytes.length },
			onMismatch
		);
		await expect(collect(out)).resolves.toBe('core photo bytes');
		expect(onMismatch).not.toHaveBeenCalled();
	});

	it('fails, without the last chunk, when bytes of the same size were swapped', async () => {
		const recorded = new TextEncoder().encode('PNG-ish bytes!');
		const onMismatch = vi.fn();
		const out = checkedStream(
			streamOf('<html>', '<script>'),
			{ sha256: sha(recorded), sizeBytes: recorded.length },
			onMismatch
		);
		// The last chunk is held until the hash is known, so the swapped file never arrives whole.
		await expect(collect(out)).rejects.toThrow(/SHA-256/);
		expect(onMismatch).toHaveBeenCalledOnce();
	});

	it('fails as soon as the stored file is longer than recorded', async () => {
		const onMismatch = vi.fn();
		const out = checkedStream(
			streamOf('abc', 'def'),
			{ sha256: sha(new Uint8Array(2)), sizeBytes: 2 },
			onMismatch
		);
		await expect(collect(out)).rejects.toThrow(/larger/);
		expect(onMismatch).toHaveBeenCalledOnce();
	});
});
