import { describe, expect, it } from 'vitest';
import { hashToken, looksLikeToken, newToken } from './tokens';

describe('hashToken', () => {
	// FIPS 180-2 appendix B.1 and B.2 worked examples for SHA-256.
	it.each([
		['abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
		['abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq', '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1']
	])('SHA-256 of %s', (input, hex) => {
		expect(hashToken(input)).toBe(hex);
	});
});

describe('newToken', () => {
	it('carries 256 bits as 43 base64url letters (RFC 4648 §5), different every time', () => {
		const a = newToken();
		const b = newToken();
		expect(a).toMatch(/^[A-Za-z0-9_-]{43}$/);
		// 32 bytes decode back from the 43 letters: 43 × 6 = 258 bits ≥ 256.
		expect(Buffer.from(a, 'base64url').length).toBe(32);
		expect(a).not.toBe(b);
		expect(looksLikeToken(a)).toBe(true);
		expect(looksLikeToken(a + '=')).toBe(false);
		expect(looksLikeToken('short')).toBe(false);
	});
});
