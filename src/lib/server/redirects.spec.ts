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
		['garage', '/garage']
	])('%j → %s', (next, expected) => expect(safeNext(next)).toBe(expected));
});
