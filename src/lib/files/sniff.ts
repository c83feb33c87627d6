/**
 * Decide what an uploaded file is from its first bytes and name, never from what the browser
 * claimed. `detected` is file-type's answer (magic numbers) or undefined for text and unknown
 * formats. Executables and scripts are refused whatever they are called.
 */
export interface SniffResult {
	ok: boolean;
	contentType: string;
	reason?: string;
	isImage: boolean;
}

const EXECUTABLE_MIME = new Set([
	'application/x-msdownload',
	'application/x-elf',
	'application/x-mach-binary',
	'application/x-executable',
	'application/x-sharedlib',
	'application/vnd.microsoft.portable-executable',
	'application/x-msi',
	'application/java-archive',
	'application/x-apple-diskimage'
]);
const EXECUTABLE_EXT = /\.(exe|dll|com|scr|msi|bat|cmd|ps1|sh|bash|jar|app|dmg|vbs|js|mjs)$/i;
const IMAGE_MIME = new Set(['image/jpeg', 'image/png', 'image/webp', 'image/tiff', 'image/gif']);
const TEXT_TYPES: Record<string, string> = {
	csv: 'text/csv',
	tsv: 'text/tab-separated-values',
	txt: 'text/plain',
	las: 'text/plain',
	geojson: 'application/geo+json',
	json: 'application/json',
	md: 'text/markdown'
};

/** True when the bytes decode as UTF-8 without replacement characters and hold no NUL bytes. */
export function looksLikeText(head: Uint8Array): boolean {
	if (head.includes(0)) return false;
	try {
		// A multi-byte character may be cut at the end of the sample; ignore the last 3 bytes.
		new TextDecoder('utf-8', { fatal: true }).decode(
			head.subarray(0, Math.max(0, head.length - 3))
		);
		return true;
	} catch {
		return false;
	}
}

export function sniffFile(
	fileName: string,
	head: Uint8Array,
	detected: { mime: string } | undefined
): SniffResult {
	const refuse = (reason: string): SniffResult => ({
		ok: false,
		contentType: detected?.mime ?? 'unknown',
		reason,
		isImage: false
	});
	if (detected && EXECUTABLE_MIME.has(detected.mime))
		return refuse('executable programs cannot be attached');
	if (EXECUTABLE_EXT.test(fileName)) return refuse('programs and scripts cannot be attached');
	if (head[0] === 0x23 && head[1] === 0x21)
		return refuse('scripts (files starting with #!) cannot be attached');
	if (detected)
		return { ok: true, contentType: detected.mime, isImage: IMAGE_MIME.has(detected.mime) };
	if (looksLikeText(head)) {
		const ext = fileName.split('.').pop()?.toLowerCase() ?? '';
		return { ok: true, contentType: TEXT_TYPES[ext] ?? 'text/plain', isImage: false };
	}
	return { ok: true, contentType: 'application/octet-stream', isImage: false };
}

/** A safe object-key segment from a user's file name (keeps letters, digits, dot, dash, underscore). */
export function safeFileName(fileName: string): string {
	const base = fileName.split(/[\\/]/).pop() ?? 'file';
	const cleaned = base
		.normalize('NFKD')
		.replace(/[^\w.-]+/g, '_')
		.replace(/^\.+/, '')
		.slice(0, 120);
	return cleaned || 'file';
}
