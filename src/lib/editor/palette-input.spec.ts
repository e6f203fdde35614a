import { describe, expect, it } from 'vitest';
import { IEC_60757, parseCode, TRADE_LETTERS } from '$lib/circuit/colours';
import { formatPath } from '$lib/circuit/schema';
import { asPalette, PaletteInputSchema } from './palette-input';

// The built-in palettes are the outside reference: IEC 60757's two-letter codes and the trade
// single-letter set (palettes.ts) must pass as a person's own palette, and a copy must read
// codes exactly as the built-in does.
const problems = (input: unknown) => {
	const r = PaletteInputSchema.safeParse(input);
	return r.success ? [] : r.error.issues.map((i) => `${formatPath(i.path)}: ${i.message}`);
};

describe('a palette of one’s own', () => {
	it.each([IEC_60757, TRADE_LETTERS])('accepts the built-in $id as a starting point', (p) => {
		expect(problems({ name: `My ${p.name}`, colours: p.colours })).toEqual([]);
	});

	it.each([
		{ colours: [{ code: 'G', name: 'green', display: '#2e7d32' }, { code: 'g', name: 'grass', display: '#2e7d32' }], want: ['colours[1].code: "g" is defined twice (also row 1)'] },
		{ colours: [{ code: 'G', name: 'green', display: '#2e7d32' }, { code: 'LG', name: 'Green', display: '#9ccc65' }], want: ['colours[1].name: "Green" is named twice (also row 1)'] },
		{ colours: [{ code: 'G1', name: 'green', display: '#2e7d32' }], want: ['colours[0].code: A code is letters only, e.g. G or GN.'] },
		{ colours: [{ code: 'GREENISH', name: 'green', display: '#2e7d32' }], want: ['colours[0].code: A code is at most 6 letters.'] },
		{ colours: [{ code: 'G', name: 'green', display: 'green' }], want: ['colours[0].display: A screen colour is written #rrggbb, e.g. #2e7d32.'] },
		{ colours: [{ code: ' ', name: 'green', display: '#2e7d32' }], want: ['colours[0].code: A code is needed.'] }
	])('names the row and field: $want', ({ colours, want }) => {
		expect(problems({ name: 'Workshop codes', colours })).toEqual(want);
	});

	it('trims the name and codes, and a copy reads codes as the built-in does', () => {
		const parsed = PaletteInputSchema.parse({ name: '  Workshop codes  ', colours: TRADE_LETTERS.colours.map((c) => ({ ...c, code: ` ${c.code} ` })) });
		expect(parsed.name).toBe('Workshop codes');
		const copy = asPalette({ id: '3f1c', ...parsed });
		expect(copy.id).toBe('account-3f1c');
		// "LGN" without separators splits as light green with brown (LG + N), as in the built-in.
		expect(parseCode('LGN', copy)).toEqual(parseCode('LGN', TRADE_LETTERS));
		expect(parseCode('lgn', copy)).toEqual({ ok: true, code: { base: 'LG', tracer: 'N' } });
	});
});
