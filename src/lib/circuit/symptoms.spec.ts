// How marks are judged against a hypothesis's predicted ratios (faulted / healthy quantity).
import { describe, expect, it } from 'vitest';
import { explain, markFits, MARK_THRESHOLDS, SIDE_ALIKE } from './symptoms';

describe('marks side by side', () => {
	const marks = [
		{ part: 'a', mark: 'normal' as const },
		{ part: 'b', mark: 'reads-high' as const }
	];
	const lamps = ['lamp', 'lamp'] as const;
	const h = { kind: 'joint:off' as const };
	it('two lamps a person sees at 127 % and 136 % of their power: marked normal and bright is a borderline call, kept at a lower fit', () => {
		// The lamp thresholds put "bright" above 130 % of the usual power (symptoms.ts, invented).
		expect(MARK_THRESHOLDS.lamp.high).toBe(1.3);
		const clear = explain(h, marks, lamps, [1.0, 1.6], 0.08);
		const close = explain(h, marks, lamps, [1.27, 1.36], 0.08);
		expect(clear.explains).toBe(true);
		expect(close.explains).toBe(true);
		expect(close.fit).toBeLessThan(clear.fit * 0.5);
	});
	it('two lamps alike to within 2 % cannot be marked one normal and one bright', () => {
		expect(SIDE_ALIKE).toBe(0.02);
		expect(explain(h, marks, lamps, [1.29, 1.31], 0.08).explains).toBe(false);
	});
	it('a mark\u2019s band widens by the slack at each edge', () => {
		expect(markFits('lamp', 0.72, 'reads-low')).toBe(false);
		expect(markFits('lamp', 0.72, 'reads-low', 0.08)).toBe(true);
	});
});
