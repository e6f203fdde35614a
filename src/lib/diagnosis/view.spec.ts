// The page's view of a plan, on the invented demo harness and its open hunt (both gauges low).
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { groupAction } from '$lib/circuit/groups';
import { ENTRY_DMM } from '$lib/circuit/meter';
import { defaultScenario } from '$lib/circuit/scenario';
import { OPEN_HUNT } from './demo';
import { basePlan, planDiagnosis, type DiagnosisPlan, type ReadingJson } from './session';
import { endingText, formatBand, jobFor, planView, type PlanView } from './view';

const doc = demoHarness();
const hunt = { scenario: defaultScenario(doc), marks: OPEN_HUNT.marks, meter: 'entry-dmm' };
const reading = (probeId: string, value: number, i: number): ReadingJson => ({ clientId: `c${i}`, probeId, outcome: 'value', value, unit: 'V', note: '', takenAt: `2026-11-28T09:4${i}:00.000Z` });

let plan: DiagnosisPlan;
let lean: PlanView;
let full: PlanView;

beforeAll(() => {
	plan = planDiagnosis(doc, hunt, []);
	lean = planView(plan);
	full = planView(plan, 'all');
});

describe('planView', () => {
	it('keeps the page small: the demo diagnosis\u2019s document and plan under 100 kB with room for the rest of the page', () => {
		// The budget is the page's whole data (the issue asks < 100 kB for the demo diagnosis); the
		// diagnosis, vehicle and a handful of readings add about 3 kB to these two.
		const size = JSON.stringify({ document: doc, plan: lean }).length;
		expect(size).toBeLessThan(90_000);
		// Every probe is named (the reading log, the probe list), the full entry only where the page shows it first.
		expect(lean.probes.map((p) => p.id)).toEqual(plan.result.probes.map((p) => p.id));
		const detailed = lean.probes.filter((p) => p.detail).map((p) => p.id);
		expect(detailed).toContain(lean.plan.steps[0].probe);
		expect(detailed).toContain(lean.battery!.probe);
		expect(detailed.length).toBeLessThanOrEqual(3);
		expect(full.probes.every((p) => p.detail)).toBe(true);
	});

	it('leads a powered plan with the battery at its posts, with the EMF it assumes until read', () => {
		expect(lean.plan.steps[0].probe).toBe(lean.battery!.probe);
		expect(lean.battery!.probe).toBe('volts:battery:-');
		// TRADE.md: a 12 V battery at rest spans 11.89 V (discharged) to 12.65 V (full), a surface charge reading higher.
		expect(lean.battery!.assumed.low).toBeLessThanOrEqual(11.9);
		expect(lean.battery!.assumed.high).toBeGreaterThanOrEqual(12.65);
		expect(lean.battery!.chargeBelow).toBe(12);
	});

	it('gives every suspect with a reading one band at each probe, holding the reading it predicts (two decimals, lamps in whole %)', () => {
		const table = plan.result.table;
		for (const [p, probe] of full.probes.entries()) {
			const seen = full.probes[p].detail!.expected.flatMap((e) => e.suspects).sort((a, b) => a - b);
			expect(seen).toEqual(full.suspects.map((_, s) => s).filter((s) => table.readings[p][s] !== null));
			const half = probe.unit === '%' ? 0.5 : 0.005;
			for (const e of probe.detail!.expected) {
				expect(e.low).toBeLessThanOrEqual(e.high);
				for (const s of e.suspects) {
					const r = table.readings[p][s] as number;
					expect(r, `${probe.id} ${full.suspects[s].id}`).toBeGreaterThanOrEqual(e.low - half);
					expect(r, `${probe.id} ${full.suspects[s].id}`).toBeLessThanOrEqual(e.high + half);
				}
			}
		}
		// Bands, not numbers: the battery probe's band spans the assumed battery (more than a volt).
		const b = full.probes.find((p) => p.id === 'volts:battery:-')!.detail!;
		expect(b.healthy.high - b.healthy.low).toBeGreaterThan(0.5);
	});

	it('says where each range leads: the next step, what is found, or a group\u2019s one job (groups.ts)', () => {
		const ambiguous = lean.plan.steps.flatMap((s) => s.outcomes).filter((o) => o.then.kind === 'ambiguous');
		expect(ambiguous.length).toBeGreaterThan(0);
		for (const o of ambiguous) {
			if (o.then.kind !== 'ambiguous') continue;
			const members = o.then.suspects.map((id) => plan.result.suspects.find((s) => s.id === id)!);
			expect(endingText(lean, o.then)).toBe(`cannot be told apart with a meter. ${groupAction(members)}`);
		}
		expect(endingText(lean, { kind: 'step', step: 4 })).toBe('go to step 4');
		expect(endingText(lean, { kind: 'found', suspect: lean.suspects[0].id })).toBe(`found: ${lean.suspects[0].label}`);
		for (const g of lean.groups) expect(jobFor(lean, [...g.suspects].reverse())).toBe(g.action);
	});

	it('keeps a reading no suspect explains, with its explanation, and gives its probe in full to take again', () => {
		const base = basePlan(doc, hunt);
		// Volts at fuse 6's input to earth: every suspect reads between the battery's negative EMF and 0 V
		// on this positive-earth vehicle; +5 V is beyond every band.
		const r = planDiagnosis(doc, hunt, [reading('volts:battery:-', -12.4, 0), reading('volts:fuse-ign:in', 5, 1)], base);
		const v = planView(r);
		expect(v.readings!.unexplained).toHaveLength(1);
		const u = v.readings!.unexplained[0];
		expect(u.probe).toBe('volts:fuse-ign:in');
		expect(u.explanation.text.length).toBeGreaterThan(20);
		expect(u.nearest.length).toBeGreaterThan(0);
		expect(v.readings!.remaining.filter((x) => x.outside).map((x) => x.suspect)).toEqual(expect.arrayContaining(u.nearest.filter((id) => v.readings!.remaining.some((x) => x.suspect === id))));
		// The diagnosis goes on: a next probe, in full, and the unexplained probe's entry to read again.
		expect(v.plan.steps.length).toBeGreaterThan(0);
		expect(v.probes.find((p) => p.id === v.plan.steps[0].probe)!.detail).toBeTruthy();
		expect(v.probes.find((p) => p.id === 'volts:fuse-ign:in')!.detail).toBeTruthy();
		expect(v.battery!.measured).toBe(-12.4);
		expect(v.battery!.charge).toBe(false);
	});
});

describe('formatBand', () => {
	// Two decimals and the unit, the minus sign U+2212 (ISO 80000-1), as the plan prints its ranges.
	it.each([
		[{ low: -12.74, high: -11.82 }, 'V', '\u221212.74 to \u221211.82 V'],
		[{ low: 0, high: 0.03 }, 'V', '0.00\u20130.03 V'],
		[{ low: -0.001, high: 0.001 }, 'V', '0.00 V'],
		[{ low: 75.2, high: 111.4 }, '%', '75\u2013111 %'],
		[{ low: 2.1, high: 5e7 }, '\u03a9', '2.10 \u03a9 to OL'],
		[{ low: 5e7, high: 6e7 }, '\u03a9', 'OL (over range)']
	])('%o %s prints as %s', (band, unit, text) => expect(formatBand(band, unit, ENTRY_DMM.ohms.overLimit)).toBe(text));
});
