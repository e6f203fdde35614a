// Codes that read one way in the diagram's palette and another in a standard. The standard is
// IEC 60757 (BK black, RD red, GN green, YE yellow); the single-letter trade code is common
// practice on older British-built vehicles (B black, K pink, R red, G green, N brown).
import { describe, expect, it } from 'vitest';
import { otherReading } from './ambiguity';

describe('otherReading', () => {
	it('reads BK in the trade letters as black with pink tracer, and offers IEC 60757 black written as B', () => {
		expect(otherReading('BK', 'trade-letters')).toEqual({ readAs: 'black with pink tracer', standard: 'IEC 60757 two-letter codes', otherWords: 'black', code: 'B' });
	});

	it('offers IEC 60757 colours with a tracer too (GN/YE: green with yellow tracer)', () => {
		const r = otherReading('GN/YE', 'trade-letters');
		// In the trade letters GN is green with brown tracer, so GN/YE does not read at all there.
		expect(r).toBeNull();
		expect(otherReading('RD', 'trade-letters')).toBeNull();
	});

	it.each([
		['B', 'trade-letters'],
		['G/B', 'trade-letters'],
		['BK', 'iec-60757'],
		['XQ', 'trade-letters']
	])('offers nothing for %s in %s (one reading only, or none)', (code, palette) => expect(otherReading(code, palette)).toBeNull());
});
