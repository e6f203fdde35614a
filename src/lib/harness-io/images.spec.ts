import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { PAGE_MAX_BYTES, pageProblem, sniffImage } from './images';

const bytes = (...b: number[]) => new Uint8Array(b);
const ascii = (s: string) => [...s].map((c) => c.charCodeAt(0));

describe('sniffImage', () => {
	const cases: [string, Uint8Array, string | null][] = [
		// PNG signature, ISO/IEC 15948 §5.2.
		['PNG signature', bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13), 'image/png'],
		// JFIF files start SOI (FFD8) then APP0 (FFE0); ITU-T T.81 B.1.1.3 and JFIF 1.02.
		['JPEG, JFIF', bytes(0xff, 0xd8, 0xff, 0xe0, 0, 16, ...ascii('JFIF')), 'image/jpeg'],
		['JPEG, Exif', bytes(0xff, 0xd8, 0xff, 0xe1, 0, 16, ...ascii('Exif')), 'image/jpeg'],
		// RIFF container with the WEBP form type, RFC 9649 §2.5.
		['WebP', bytes(...ascii('RIFF'), 0x24, 0, 0, 0, ...ascii('WEBPVP8 ')), 'image/webp'],
		['a RIFF that is not WebP (WAVE audio)', bytes(...ascii('RIFF'), 0x24, 0, 0, 0, ...ascii('WAVEfmt ')), null],
		['a PNG cut short', bytes(0x89, 0x50, 0x4e, 0x47), null],
		['a GIF (GIF89a)', bytes(...ascii('GIF89a'), 1, 0, 1, 0), null],
		['a PDF', bytes(...ascii('%PDF-1.7')), null],
		['text named .png', new TextEncoder().encode('not an image at all'), null]
	];
	for (const [name, b, want] of cases) it(name, () => expect(sniffImage(b)).toBe(want));

	it('knows the committed fixture page as a PNG', () => {
		const file = new Uint8Array(readFileSync(new URL('../../../fixtures/manual-page.png', import.meta.url)));
		expect(sniffImage(file)).toBe('image/png');
		expect(file.byteLength).toBeLessThan(300 * 1024);
	});
});

describe('pageProblem', () => {
	it('refuses empty, oversized and non-image files with a reason', () => {
		expect(pageProblem(new Uint8Array())).toMatch(/empty/);
		const big = new Uint8Array(PAGE_MAX_BYTES + 1);
		big.set([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
		expect(pageProblem(big)).toMatch(/at most 15 MB/);
		expect(pageProblem(bytes(...ascii('GIF89a')))).toMatch(/not a PNG, JPEG or WebP/);
		expect(pageProblem(big.subarray(0, 100))).toBeNull();
	});
});
