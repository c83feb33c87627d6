import { describe, expect, it } from 'vitest';
import { looksLikeText, safeFileName, sniffFile } from './sniff';

const bytes = (s: string) => new TextEncoder().encode(s);

// Magic numbers (PE "MZ", ELF "\x7fELF", PNG signature) are from the formats' specifications
// (Microsoft PE/COFF spec; System V ABI; RFC 2083 §3.1) — common practice, from memory.
describe('sniffFile', () => {
	it('refuses executables by detected type even with an innocent name', () => {
		expect(
			sniffFile('report.pdf', bytes('MZ'), { mime: 'application/x-msdownload' })
		).toMatchObject({ ok: false });
		expect(sniffFile('notes.txt', bytes('\x7fELF'), { mime: 'application/x-elf' }).ok).toBe(false);
	});
	it('refuses scripts by name or shebang', () => {
		expect(sniffFile('install.sh', bytes('echo hi'), undefined).ok).toBe(false);
		expect(sniffFile('data.txt', bytes('#!/bin/sh\nrm -rf /'), undefined).reason).toContain('#!');
	});
	it('trusts the bytes, not the name, for images', () => {
		expect(sniffFile('photo.txt', new Uint8Array([0x89, 0x50]), { mime: 'image/png' })).toEqual({
			ok: true,
			contentType: 'image/png',
			isImage: true
		});
	});
	it('labels text formats by extension once the bytes are text', () => {
		expect(sniffFile('log.las', bytes('~VERSION INFORMATION\n'), undefined).contentType).toBe(
			'text/plain'
		);
		expect(sniffFile('sites.csv', bytes('code;lat\n'), undefined).contentType).toBe('text/csv');
		expect(sniffFile('blob.bin', new Uint8Array([0, 1, 2, 255]), undefined).contentType).toBe(
			'application/octet-stream'
		);
	});
	it('recognises UTF-8 text and rejects binary', () => {
		expect(looksLikeText(bytes('Temperatur 12,5 °C'))).toBe(true);
		expect(looksLikeText(new Uint8Array([0xff, 0xfe, 0x00, 0x41]))).toBe(false);
	});
});

describe('safeFileName', () => {
	it('drops paths and unsafe characters', () => {
		expect(safeFileName('../../etc/passwd')).toBe('passwd');
		expect(safeFileName('C:\\Users\\me\\Kjerne foto (1).JPG')).toBe('Kjerne_foto_1_.JPG');
		expect(safeFileName('...')).toBe('file');
	});
});
