// How marks are judged against a hypothesis's predicted ratios (faulted / healthy quantity).
import { describe, expect, it } from 'vitest';
import { explain, markFits, markMiss, MARK_THRESHOLDS, SIDE_ALIKE } from './symptoms';

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

describe('how near a ratio comes to its mark', () => {
	it('is 0 inside the mark’s band and the log distance to its nearest edge outside (thresholds: symptoms.ts)', () => {
		const t = MARK_THRESHOLDS.gauge;
		expect(markMiss('gauge', 0.5, 'reads-low')).toBe(0);
		expect(markMiss('gauge', 1, 'reads-low')).toBeCloseTo(Math.log(1 / t.low), 12);
		expect(markMiss('gauge', 0.05, 'reads-low')).toBeCloseTo(Math.log(t.dead / 0.05), 12);
		expect(markMiss('gauge', 0, 'dead')).toBe(0);
		expect(markMiss('gauge', 2, 'reads-high')).toBe(0);
		// Erratic wants the part off normal: inside the normal band it is as far as the nearer edge.
		expect(markMiss('gauge', 1, 'erratic')).toBeCloseTo(Math.min(Math.log(1 / t.low), Math.log(t.high)), 12);
		expect(markMiss('gauge', 0.5, 'erratic')).toBe(0);
		// Nearer is smaller: the refinement closes in on the sizes whose ratio is nearest the band.
		expect(markMiss('lamp', 0.8, 'reads-low')).toBeLessThan(markMiss('lamp', 0.95, 'reads-low'));
	});
});
