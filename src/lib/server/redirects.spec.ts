import { describe, expect, it } from 'vitest';
import { safeNext } from './redirects';

// OWASP ASVS 4.0.3 §5.1.5: redirects only to allowed destinations (here: paths on this site).
describe('safeNext', () => {
	it.each([
		['/garage/abc?tab=1', '/garage/abc?tab=1'],
		['/diagrams/x', '/diagrams/x'],
		[null, '/garage'],
		['', '/garage'],
		['https://elsewhere.test/', '/garage'],
		['//elsewhere.test/', '/garage'],
		['/\\elsewhere.test', '/garage'],
		['/\telsewhere', '/garage'],
		['garage', '/garage'],
		// RFC 3986 §2.1 / WHATWG URL percent-encoding of UTF-8: é = C3 A9, ☎ = E2 98 8E.
		['/garage?q=é', '/garage?q=%C3%A9'],
		['/diagrams/☎ x', '/diagrams/%E2%98%8E%20x'],
		// A lone surrogate is not text: no destination at all.
		['/garage/\ud800', '/garage']
	])('%j → %s', (next, expected) => expect(safeNext(next)).toBe(expected));
});
