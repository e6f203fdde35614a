// The README's walk-through, walked with the circuit core: each step's probe is the one the plan
// chooses after the readings before it, each reading is what the planted fault makes the meter
// show (two decimals, as a 3½-digit meter), and the last reading leaves the planted fault alone.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { diagnose } from '../circuit/diagnose';
import { defaultScenario } from '../circuit/scenario';
import { readingsIf } from '../circuit/what-if';
import { OPEN_HUNT } from './demo';

const readme = readFileSync(new URL('../../../README.md', import.meta.url), 'utf8');
const table = readme.split('<!-- walkthrough:start -->')[1].split('<!-- walkthrough:end -->')[0];
const rows = [...table.matchAll(/^\s*\|\s*(\d+)\s*\|\s*`([^`]+)`[^|]*\|\s*(-?[\d.]+) (V|%|Ω)\s*\|$/gm)].map((m) => ({ step: Number(m[1]), probe: m[2], value: Number(m[3]), unit: m[4] }));

describe('README walk-through of the demo fault', () => {
	it('has its steps', () => {
		expect(rows.map((r) => r.step)).toEqual(rows.map((_, i) => i + 1));
		expect(rows.length).toBeGreaterThan(1);
	});

	it('is the plan the app makes, with the readings it predicts, ending at the planted fault', () => {
		const doc = demoHarness();
		const scenario = defaultScenario(doc);
		const readings: Record<string, number> = {};
		for (const row of rows) {
			const r = diagnose({ doc, scenario, marks: OPEN_HUNT.marks, readings });
			expect(r.plan.steps[0]?.probe, `step ${row.step}`).toBe(row.probe);
			const [predicted] = readingsIf({ doc, scenario, probes: [row.probe], fault: OPEN_HUNT.plantedFault });
			expect(predicted.unit).toBe(row.unit);
			expect(Math.round(predicted.reading * 100) / 100, `step ${row.step}`).toBe(row.value);
			readings[row.probe] = row.value;
		}
		const end = diagnose({ doc, scenario, marks: OPEN_HUNT.marks, readings });
		expect(end.readings!.remaining.map((x) => x.suspect)).toEqual([OPEN_HUNT.plantedFault]);
		expect(end.plan.steps).toHaveLength(0);
		// The number of suspects the README quotes.
		expect(readme).toContain(`lists ${end.suspects.length} suspects`);
	});
});
