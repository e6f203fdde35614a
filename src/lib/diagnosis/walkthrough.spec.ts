// The README's walk-throughs, walked with the circuit core: each step's probe is the one the plan
// chooses after the readings before it, each reading is what the planted fault makes the meter
// show (two decimals, as a 3½-digit meter), and the last reading leaves the planted fault alone.
// The second walk is a real garage: the battery half charged (12.2 V at rest ≈ 50 % in the BCI
// table at 80 °F, TRADE.md) and the joint at 35 Ω instead of the 20 Ω of the first.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { diagnose } from '../circuit/diagnose';
import { defaultScenario } from '../circuit/scenario';
import { withBattery } from '../circuit/uncertainty';
import { readingsIf } from '../circuit/what-if';
import { OPEN_HUNT } from './demo';

const readme = readFileSync(new URL('../../../README.md', import.meta.url), 'utf8');
const rowsOf = (marker: string) =>
	[...readme.split(`<!-- ${marker}:start -->`)[1].split(`<!-- ${marker}:end -->`)[0].matchAll(/^\s*\|\s*(\d+)\s*\|\s*`([^`]+)`[^|]*\|\s*(-?[\d.]+) (V|%|Ω)\s*\|$/gm)].map((m) => ({
		step: Number(m[1]),
		probe: m[2],
		value: Number(m[3]),
		unit: m[4]
	}));

const doc = demoHarness();
const scenario = defaultScenario(doc);

describe.each([
	{ marker: 'walkthrough', emf: undefined, size: undefined },
	{ marker: 'walkthrough-garage', emf: 12.2, size: 35 }
])('README walk-through "$marker" of the demo fault', ({ marker, emf, size }) => {
	const rows = rowsOf(marker);
	it('has its steps, the battery first', () => {
		expect(rows.map((r) => r.step)).toEqual(rows.map((_, i) => i + 1));
		expect(rows.length).toBeGreaterThan(1);
		expect(rows[0].probe).toBe('volts:battery:-');
	});

	it('is the plan the app makes, with the readings it predicts, ending at the planted fault', () => {
		// The truth: the document as drawn, but with its battery and joint as in the garage.
		const truth = emf === undefined ? doc : withBattery(doc, scenario, emf);
		const readings: Record<string, number> = {};
		for (const row of rows) {
			const r = diagnose({ doc, scenario, marks: OPEN_HUNT.marks, readings });
			expect(r.plan.steps[0]?.probe, `step ${row.step}`).toBe(row.probe);
			const [predicted] = readingsIf({ doc: truth, scenario, probes: [row.probe], fault: size === undefined ? OPEN_HUNT.plantedFault : OPEN_HUNT.plantedSuspect, size });
			expect(predicted.unit).toBe(row.unit);
			expect(Math.round(predicted.reading * 100) / 100, `step ${row.step}`).toBe(row.value);
			readings[row.probe] = row.value;
			expect(r.readings?.unexplained ?? [], `step ${row.step}`).toEqual([]);
		}
		const end = diagnose({ doc, scenario, marks: OPEN_HUNT.marks, readings });
		expect(end.readings!.remaining.map((x) => x.suspect)).toEqual([OPEN_HUNT.plantedSuspect]);
		expect(end.readings!.unexplained).toEqual([]);
		expect(end.plan.steps).toHaveLength(0);
		// The number of suspects the README quotes.
		expect(readme).toContain(`lists ${end.suspects.length} suspects`);
		if (emf !== undefined) expect(end.battery!.emf!).toBeCloseTo(emf, 1);
	});
});
