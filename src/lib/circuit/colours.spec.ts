import { describe, expect, it } from 'vitest';
import { displayColours, formatCode, IEC_60757, parseCode, TRADE_LETTERS, type Palette } from './colours';

describe('IEC 60757 palette', () => {
	// IEC 60757:1983 "Code for designation of colours": the two-letter codes (list as in TRADE.md).
	it('holds exactly the standard two-letter codes', () => {
		const codes = IEC_60757.colours.map((c) => c.code).sort();
		expect(codes).toEqual(
			['BK', 'BN', 'RD', 'OG', 'YE', 'GN', 'BU', 'VT', 'GY', 'WH', 'PK', 'GD', 'TQ', 'SR', 'GNYE'].sort()
		);
	});
	it.each([
		['BK', 'black'],
		['BN', 'brown'],
		['RD', 'red'],
		['OG', 'orange'],
		['YE', 'yellow'],
		['GN', 'green'],
		['BU', 'blue'],
		['VT', 'violet'],
		['GY', 'grey'],
		['WH', 'white'],
		['PK', 'pink'],
		['GD', 'gold'],
		['TQ', 'turquoise'],
		['SR', 'silver'],
		['GNYE', 'green-and-yellow']
	])('IEC 60757: %s is %s', (code, name) => {
		expect(IEC_60757.colours.find((c) => c.code === code)?.name).toBe(name);
	});
});

describe('trade single-letter palette', () => {
	// Common practice (BS AU 7 letters; LG, K, O, Y from memory — TRADE.md).
	it.each([
		['B', 'black'],
		['U', 'blue'],
		['N', 'brown'],
		['G', 'green'],
		['LG', 'light green'],
		['R', 'red'],
		['W', 'white'],
		['Y', 'yellow'],
		['P', 'purple'],
		['S', 'slate'],
		['K', 'pink'],
		['O', 'orange']
	])('%s is %s', (code, name) => {
		expect(TRADE_LETTERS.colours.find((c) => c.code === code)?.name).toBe(name);
	});
});

describe('parseCode', () => {
	it.each([
		['G/B', 'trade-letters', 'G', 'B'],
		['G-B', 'trade-letters', 'G', 'B'],
		['g b', 'trade-letters', 'G', 'B'],
		// Two letters with no separator: base then tracer (common practice: "WG = white with green tracer").
		['WG', 'trade-letters', 'W', 'G'],
		['LG', 'trade-letters', 'LG', null],
		['LGB', 'trade-letters', 'LG', 'B'],
		['LG/N', 'trade-letters', 'LG', 'N'],
		['N', 'trade-letters', 'N', null],
		['GN/BK', 'iec-60757', 'GN', 'BK'],
		['gnbk', 'iec-60757', 'GN', 'BK'],
		['GNYE', 'iec-60757', 'GNYE', null],
		['RD.WH', 'iec-60757', 'RD', 'WH']
	] as const)('%s in %s', (text, palette, base, tracer) => {
		const r = parseCode(text, palette);
		expect(r).toEqual({ ok: true, code: { base, tracer } });
	});

	it('names the unknown code and the palette by its name, not its id', () => {
		const r = parseCode('G/XQ', 'trade-letters');
		expect(r.ok).toBe(false);
		if (!r.ok) {
			expect(r.error).toContain('"XQ"');
			expect(r.error).toContain('in the palette Single-letter trade code');
			expect(r.error).not.toContain('trade-letters');
		}
		const r2 = parseCode('GN/B', 'iec-60757');
		expect(r2.ok).toBe(false);
		if (!r2.ok) expect(r2.error).toMatch(/"B" in the palette IEC 60757 two-letter codes/);
	});
	it('refuses three colours and an empty code', () => {
		expect(parseCode('G/B/R', 'trade-letters').ok).toBe(false);
		expect(parseCode('  ', 'trade-letters').ok).toBe(false);
	});
	it('reads a user palette', () => {
		const mine: Palette = {
			id: 'club-sheet',
			name: 'Club sheet',
			colours: [
				{ code: 'Bl', name: 'blue', display: '#0000ff' },
				{ code: 'Rt', name: 'red', display: '#ff0000' }
			]
		};
		expect(parseCode('bl/rt', mine)).toEqual({ ok: true, code: { base: 'Bl', tracer: 'Rt' } });
		expect(parseCode('BlRt', mine)).toEqual({ ok: true, code: { base: 'Bl', tracer: 'Rt' } });
		expect(parseCode('Gr', mine).ok).toBe(false);
	});
});

describe('formatCode and displayColours', () => {
	it('round-trips', () => {
		const r = parseCode('g-b', 'trade-letters');
		expect(r.ok && formatCode(r.code)).toBe('G/B');
		expect(formatCode({ base: 'LG', tracer: null })).toBe('LG');
	});
	it('gives base and tracer colours', () => {
		const d = displayColours('G/B', 'trade-letters');
		expect(d.base).toBe('#2e7d32');
		expect(d.tracer).toBe('#1a1a1a');
		expect(d.description).toBe('green with black tracer');
		expect(displayColours('LG', 'trade-letters').tracer).toBeNull();
		expect(() => displayColours('Q', 'trade-letters')).toThrow(/"Q"/);
	});
});
