// What the diagnosis page and the API show of a plan: the planner's result cut to what the page
// uses. Every prediction is a band: a probe's entry carries the band each suspect predicts there
// (suspects with the same band together) and the band of a healthy harness.
//
// Over the network the view stays small (the demo diagnosis's page data, document included, under
// 100 kB; view.spec.ts): every probe by name, and the full entry only of the probes the page shows
// first (the next one, the battery's, and readings to take again). The browser plans again on its
// own (plan.worker.ts) and keeps every probe's full entry, for a probe chosen out of the plan.
import type { DiagnoseResult } from '../circuit/diagnose';
import type { ChecklistThen } from '../circuit/plan';
import { groupAction } from '../circuit/groups';
import { formatRange } from '../circuit/outcomes';
import type { DiagnosisPlan } from './session';

/** A band as the page shows it: volts and ohms to two decimals (as the plan prints its ranges, plan.ts checklist), lamp brightness in whole %. */
export interface Band {
	low: number;
	high: number;
}

/** Suspects that predict the same band at a probe (indexes into the view's `suspects`). */
export interface ExpectedBand extends Band {
	suspects: number[];
}

const rounder = (unit: string) => (x: number) => {
	const v = unit === '%' ? Math.round(x) : Math.round(x * 100) / 100;
	return Object.is(v, -0) ? 0 : v;
};

/** Each suspect's band at probe `p`, suspects with the same band (as shown) together, in the order first met. */
function expectedAt(result: DiagnoseResult, p: number, round: (x: number) => number): ExpectedBand[] {
	const out = new Map<string, ExpectedBand>();
	result.suspects.forEach((_, s) => {
		const r = result.table.readings[p][s];
		const b = result.bands?.[p]?.[s] ?? (r === null ? null : { low: r, high: r });
		if (!b) return;
		const low = round(b.low);
		const high = round(b.high);
		const key = `${low}:${high}`;
		const g = out.get(key) ?? out.set(key, { low, high, suspects: [] }).get(key)!;
		g.suspects.push(s);
	});
	return [...out.values()];
}

/** A probe's full entry: where the leads go, the meter setting, what to do first, and the bands. */
function detailOf(result: DiagnoseResult, i: number) {
	const p = result.probes[i];
	const round = rounder(p.unit);
	// The engine gives each probe its healthy band (diagnose.ts) before its type names it.
	const healthy = p.healthyBand ?? { low: p.healthy, high: p.healthy };
	return {
		place: p.place,
		setting: p.setting,
		conditions: p.conditions,
		cautions: p.cautions,
		/** The band the harness reads here with nothing wrong. */
		healthy: { low: round(healthy.low), high: round(healthy.high) } as Band,
		expected: expectedAt(result, i, round)
	};
}

/**
 * The page's view of a plan. `detail`: whose full entry rides along — every probe's in the
 * browser's own plan, or only those the page shows first (over the network).
 */
export function planView({ result }: DiagnosisPlan, detail: 'all' | 'shown' = 'shown') {
	const shown = new Set<string>([result.plan.steps[0]?.probe, result.battery?.probe, ...(result.readings?.unexplained.map((u) => u.probe) ?? [])].filter((x): x is string => !!x));
	return {
		explainedBy: result.explainedBy,
		suspects: result.suspects.map((s) => ({ id: s.id, label: s.label, kind: s.kind, chance: s.chance, ...(s.size ? { size: s.size } : {}) })),
		probes: result.probes.map((p, i) => ({
			id: p.id,
			kind: p.kind,
			label: p.label,
			unit: p.unit,
			...(detail === 'all' || shown.has(p.id) ? { detail: detailOf(result, i) } : {})
		})),
		minimalSet: result.minimalSet,
		groups: result.groups,
		battery: result.battery,
		plan: {
			// Each step's probe and where each range of readings leads; the probe's own entry has the rest.
			steps: result.plan.steps.map((s) => ({ step: s.step, probe: s.probe, outcomes: s.outcomes.map((o) => ({ reading: o.reading, then: o.then })) })),
			expectedProbes: result.plan.expectedProbes,
			expectedCost: result.plan.expectedCost
		},
		...(result.readings ? { readings: result.readings } : {}),
		notes: result.notes
	};
}
export type PlanView = ReturnType<typeof planView>;
export type ProbeView = PlanView['probes'][number];
export type ProbeDetail = ReturnType<typeof detailOf>;
export type StepView = PlanView['plan']['steps'][number];
export type SuspectView = PlanView['suspects'][number];

/** The one job for a group of suspects no probe tells apart (groups.ts), from their ids. */
export function jobFor(plan: Pick<PlanView, 'suspects' | 'groups'>, ids: readonly string[]): string {
	const same = plan.groups.find((g) => g.suspects.length === ids.length && g.suspects.every((id) => ids.includes(id)));
	if (same) return same.action;
	const byId = new Map(plan.suspects.map((s) => [s.id, s]));
	return groupAction(ids.map((id) => byId.get(id)).filter((s): s is SuspectView => !!s));
}

/** Where a range of readings leads, in words ("go to step 4", "found: …", the group's job). */
export function endingText(plan: Pick<PlanView, 'suspects' | 'groups'>, then: ChecklistThen): string {
	const label = (id: string) => plan.suspects.find((s) => s.id === id)?.label ?? id;
	if (then.kind === 'step') return `go to step ${then.step}`;
	if (then.kind === 'found') return `found: ${label(then.suspect)}`;
	if (then.kind === 'ambiguous') return `cannot be told apart with a meter. ${jobFor(plan, then.suspects)}`;
	return `enter the readings so far to plan again (${then.suspects.map(label).join('; ')})`;
}

/**
 * A band in words, in the plan's number style: "−12.74 to −11.82 V", "0.00–0.03 V", "75–111 %";
 * ohms at the meter's range top read OL ("2.10 Ω to OL", "OL (over range)").
 * @example formatBand({ low: -12.74, high: -11.82 }, 'V', 40e6) // "−12.74 to −11.82 V"
 */
export function formatBand(band: Band, unit: string, overLimit: number): string {
	if (unit === '\u03a9' && band.low >= overLimit) return 'OL (over range)';
	const digits = unit === '%' ? 0 : 2;
	if (unit === '\u03a9' && band.high >= overLimit) return `${formatRange({ low: band.low, high: band.low }, '', digits)} \u03a9 to OL`;
	return formatRange(band, unit, digits);
}
