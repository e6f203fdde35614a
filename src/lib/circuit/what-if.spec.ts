import { describe, expect, it } from 'vitest';
import { demoHarness } from './demo';
import { diagnose } from './diagnose';
import { defaultScenario } from './scenario';
import { readingsIf } from './what-if';

const doc = demoHarness();
const scenario = defaultScenario(doc);
const marks = [
	{ part: 'fuel-gauge', mark: 'reads-low' as const },
	{ part: 'temp-gauge', mark: 'reads-low' as const }
];

describe('readings if a fault were there', () => {
	const plan = diagnose({ doc, scenario, marks });

	it('agrees with the prediction table the plan was made from, for every suspect and probe', () => {
		// Two paths to one number: diagnose() over the marks' region, readingsIf() over the whole
		// harness. A disagreement means the region cut off something that carries current.
		for (const s of plan.suspects.slice(0, 6)) {
			const got = readingsIf({ doc, scenario, probes: plan.probes.map((p) => p.id), fault: s.id, size: s.typical });
			got.forEach((r, i) => {
				const want = plan.probes[i].expected.find((e) => e.suspect === s.id)!.reading;
				expect(r.reading, `${s.id} at ${r.id}`).toBeCloseTo(want, 4);
			});
		}
	});

	it('reads the healthy circuit with no fault: battery volts about 12.6 V on the earthed post side (positive earth reads negative)', () => {
		const [r] = readingsIf({ doc, scenario, probes: ['volts:fuse-ign:out'] });
		// BCI state-of-charge table via TRADE.md: a charged battery rests near 12.6 V; with ignition
		// loads the fuse output sits a little below it, negative on a positive-earth vehicle.
		expect(r.unit).toBe('V');
		expect(r.reading).toBeLessThan(-11.5);
		expect(r.reading).toBeGreaterThan(-12.8);
	});

	it('names the probe and the fault it does not know, with where', () => {
		expect(() => readingsIf({ doc, scenario, probes: ['volts:nowhere:x'], fault: 'no-such-fault' })).toThrowError(/probes\[0\].*no probe "volts:nowhere:x".*fault: no fault "no-such-fault"/s);
	});
});
