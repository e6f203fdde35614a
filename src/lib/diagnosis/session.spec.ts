import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { defaultScenario } from '../circuit/scenario';
import { OPEN_HUNT } from './demo';
import { basePlan, planDiagnosis, readingsForPlan, type ReadingJson } from './session';

const r = (probeId: string, takenAt: string, value: number | null, extra: Partial<ReadingJson> = {}): ReadingJson => ({
	clientId: crypto.randomUUID(),
	probeId,
	outcome: value === null ? 'unreachable' : 'value',
	value,
	unit: 'V',
	note: '',
	takenAt,
	...extra
});

describe('readings the planner is told', () => {
	it('takes the latest reading of each probe, ignores struck ones, and passes "couldn\u2019t reach" and over-range on', () => {
		const used = readingsForPlan([
			r('a', '2026-01-01T10:00:00.000Z', 1),
			r('a', '2026-01-01T10:05:00.000Z', 2),
			r('a', '2026-01-01T10:09:00.000Z', 9, { struck: true }),
			r('b', '2026-01-01T10:01:00.000Z', null),
			r('c', '2026-01-01T10:02:00.000Z', null, { outcome: 'over-range' })
		]);
		expect(used).toEqual({ a: 2, b: 'unreachable', c: 'OL' });
	});
});

describe('planning again from the kept plan', () => {
	it('gives what a fresh plan with the same readings gives, without solving again', () => {
		const doc = demoHarness();
		const d = { scenario: defaultScenario(doc), marks: OPEN_HUNT.marks, meter: 'entry-dmm' as const };
		const base = basePlan(doc, d);
		// The README's first two readings: the battery at its posts, then fuse 6's input.
		const first = base.plan.steps[0].probe;
		expect(first).toBe('volts:battery:-');
		const readings = [r(first, '2026-01-01T10:00:00.000Z', -12.53), r('volts:fuse-ign:in', '2026-01-01T10:01:00.000Z', -6.85)];
		const kept = planDiagnosis(doc, d, readings, base);
		const fresh = planDiagnosis(doc, d, readings);
		expect(kept.result.readings).toEqual(fresh.result.readings);
		expect(kept.result.plan).toEqual(fresh.result.plan);
		// The reading narrowed the suspects (the planted fault is among those left).
		expect(kept.result.readings!.remaining.length).toBeLessThan(base.suspects.length);
		expect(kept.result.readings!.remaining.map((x) => x.suspect)).toContain(OPEN_HUNT.plantedSuspect);
		// The kept plan itself is unchanged by planning again from it.
		expect(base.readings).toBeUndefined();
	});
});

describe('the diagnosis\u2019s uncertainty reaches the planner', () => {
	it('plans with the battery range the diagnosis stores, and with the defaults when it stores none', () => {
		const doc = demoHarness();
		const d = { scenario: defaultScenario(doc), marks: OPEN_HUNT.marks, meter: 'entry-dmm' as const };
		// Defaults: 11.9–12.8 V at rest per 12 V (BCI rest table, TRADE.md).
		expect(basePlan(doc, { ...d, uncertainty: null }).battery?.assumed).toEqual({ low: 11.9, high: 12.8 });
		// Invented: a restorer who read 12.2 V on a charger's display this morning narrows it.
		const narrowed = basePlan(doc, { ...d, uncertainty: { battery: { low: 12.1, high: 12.3 } } });
		expect(narrowed.battery?.assumed.low).toBeCloseTo(12.1, 9);
		// The model's own 12.6 V stays inside the range (uncertainty.ts batteryRange).
		expect(narrowed.battery?.assumed.high).toBeGreaterThanOrEqual(12.3);
		// A narrower battery range narrows the healthy band of a powered probe.
		const width = (r: typeof narrowed, id: string) => {
			const b = r.probes.find((p) => p.id === id)!.healthyBand;
			return b.high - b.low;
		};
		expect(width(narrowed, 'volts:fuse-ign:in')).toBeLessThan(width(basePlan(doc, d), 'volts:fuse-ign:in'));
	});
});
