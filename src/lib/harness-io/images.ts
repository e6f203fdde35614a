/**
 * Which image a file is, by its first bytes (never by its name or the browser's word):
 *  - PNG: the 8-byte signature 89 50 4E 47 0D 0A 1A 0A (PNG, ISO/IEC 15948, §5.2);
 *  - JPEG: the SOI marker FF D8 followed by another marker's FF (ITU-T T.81, Annex B.1.1.3);
 *  - WebP: "RIFF", a 4-byte size, then "WEBP" (RFC 9649, §2.5).
 */
export type PageImageType = 'image/png' | 'image/jpeg' | 'image/webp';

/** 15 MiB: a scanned A4 page at 300 dpi as a PNG is usually 2–10 MB (common practice). */
export const PAGE_MAX_BYTES = 15 * 1024 * 1024;
export const PAGE_LIMIT_TEXT = '15 MB';

const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

export function sniffImage(bytes: Uint8Array): PageImageType | null {
	if (bytes.length >= 8 && PNG.every((b, i) => bytes[i] === b)) return 'image/png';
	if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
	const ascii = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to));
	if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'image/webp';
	return null;
}

/** Why a file cannot be a page, or null when it can. */
export function pageProblem(bytes: Uint8Array): string | null {
	if (bytes.byteLength === 0) return 'The file is empty.';
	if (bytes.byteLength > PAGE_MAX_BYTES) return `The file is ${(bytes.byteLength / 1024 / 1024).toFixed(1)} MB; a page can be at most ${PAGE_LIMIT_TEXT}.`;
	if (!sniffImage(bytes)) return 'The file is not a PNG, JPEG or WebP image (checked by its content, not its name).';
	return null;
}
