import { describe, expect, it } from 'vitest';
import { IEC_60757, TRADE_LETTERS } from '$lib/circuit/colours';
import { codeSuggestions, usedCodes } from './codes';

// Expected lists worked by hand from the palettes' data (trade letters B U N G LG R W Y P S K O;
// IEC 60757 two-letter codes BK BN RD …).
describe('codeSuggestions', () => {
	it('offers the diagram’s own codes first, most used first', () => {
		const s = codeSuggestions('', TRADE_LETTERS, ['R/W', 'G/B', 'G/B', 'B']);
		expect(s.slice(0, 4).map((x) => x.code)).toEqual(['G/B', 'R/W', 'B', 'U']);
	});

	it('offers every tracer once a base and separator are typed', () => {
		const s = codeSuggestions('G/', TRADE_LETTERS, [], 20);
		expect(s.map((x) => x.code)).toEqual(['G/B', 'G/U', 'G/N', 'G/LG', 'G/R', 'G/W', 'G/Y', 'G/P', 'G/S', 'G/K', 'G/O']);
		expect(s[0]).toEqual({ code: 'G/B', base: '#2e7d32', tracer: '#1a1a1a', description: 'green with black tracer' });
	});

	it('narrows tracers by the letters after the separator', () => {
		expect(codeSuggestions('l-g', TRADE_LETTERS, []).map((x) => x.code)).toEqual([]);
		expect(codeSuggestions('LG/', TRADE_LETTERS, []).length).toBeGreaterThan(5);
		expect(codeSuggestions('gn/y', IEC_60757, []).map((x) => x.code)).toEqual(['GN/YE']);
	});

	it('matches base codes by prefix and writes a run-together code properly', () => {
		expect(codeSuggestions('L', TRADE_LETTERS, []).map((x) => x.code)).toEqual(['LG']);
		expect(codeSuggestions('gb', TRADE_LETTERS, []).map((x) => x.code)).toEqual(['G/B']);
	});

	it('counts used codes', () => {
		expect(usedCodes(['a', 'b', 'b', 'c', 'a', 'b'])).toEqual(['b', 'a', 'c']);
	});
});
