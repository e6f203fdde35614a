/**
 * Diagnosis: document + scenario + marks (+ meter profile, readings taken) → suspects, the
 * candidate probes with what each suspect predicts, the minimal probe set with its ambiguity
 * groups, and a step-by-step plan (cover.ts, plan.ts), planned again from real readings.
 *
 * Steps: the region of the marked parts (faults.ts); its hypotheses, with a fuse that the
 * fault overloads taken as blown; the marked parts' currents under each (predict.ts, from one
 * factorisation); the suspects that explain every mark (symptoms.ts) — single faults first,
 * and double faults over the region when no single one does; then every candidate probe's
 * reading under every suspect, one factorisation per setup (scenario, battery off, part out).
 */
import { buildCircuit, type Circuit } from './circuit';
import { minimalProbeSet } from './cover';
import { FAULT_KINDS, generateHypotheses, regionOf, type Change, type FaultKind, type Hypothesis } from './faults';
import { ENTRY_DMM, type MeterProfile } from './meter-profiles';
import type { PredictionTable } from './outcomes';
import { buildPlan, checklist, replan, type ReadingTaken } from './plan';
import { Base, emptyFallbacks, evaluateHypothesis, faultedCircuit, predictReadings, type FallbackCount, type Meter } from './predict';
import { candidateProbes, CAUTIONS, setupScenario, tableReading, type ProbeKind, type ProbeSpec, type SetupId } from './probes';
import type { Location } from './parts';
import type { Scenario } from './scenario';
import type { HarnessDocument } from './schema';
import { explain, observedElement, quantity, type Judged, type PartMark } from './symptoms';

/** A double fault's prior relative to the product of its two single priors (invented: two faults at once are rare). */
export const DOUBLE_FAULT_FACTOR = 0.05;
/** Most single hypotheses paired when looking for double faults. */
export const DOUBLE_FAULT_POOL = 40;

export interface DiagnoseInput {
	doc: HarnessDocument;
	scenario: Scenario;
	marks: readonly PartMark[];
	meter?: MeterProfile;
	/** Probe id → measured value (volts, % brightness, ohms), "OL" for over-range, or "unreachable". */
	readings?: Readonly<Record<string, number | 'OL' | 'unreachable'>>;
	weights?: Partial<Record<FaultKind, number>>;
	reach?: Partial<Record<Location, number>>;
	tools?: readonly ProbeKind[];
	/** Probe ids to consider only (default all candidates). */
	onlyProbes?: readonly string[];
}

export interface SuspectOut {
	id: string;
	/** The place and mode, whatever the fault's size (`joint:w-ign-fuse:to` for every joint resistance there). */
	site: string;
	label: string;
	kind: FaultKind | 'double';
	/** Chance among the suspects (priors × fit, normalised). */
	chance: number;
	prior: number;
	fit: number;
	place: Hypothesis['place'][];
	ohms?: number;
}

export interface DiagnoseResult {
	suspects: SuspectOut[];
	/** "single" when single faults explain the marks; "double" when only pairs do; "none" when nothing does. */
	explainedBy: 'single' | 'double' | 'none';
	probes: (Omit<ProbeSpec, 'meter' | 'order'> & { expected: { suspect: string; reading: number }[]; healthy: number })[];
	minimalSet: { probes: string[]; cost: number; exact: boolean };
	ambiguityGroups: string[][];
	plan: { steps: ReturnType<typeof checklist>; expectedProbes: number; expectedCost: number };
	/** After readings: what they ruled out and what is left. */
	readings?: { remaining: { suspect: string; chance: number }[]; dropped: { suspect: string; probe: string; reading: number }[]; unexplained: { probe: string; reading: number; reason: string }[]; unavailable: string[] };
	notes: string[];
	fallbacks: FallbackCount;
	/** The prediction table the plan was made from (suspects × probes). */
	table: PredictionTable;
}

export class DiagnoseError extends Error {
	constructor(readonly issues: { path: string; message: string }[]) {
		super(issues.map((i) => `${i.path}: ${i.message}`).join('; '));
	}
}

interface Candidate {
	id: string;
	label: string;
	kind: FaultKind | 'double';
	prior: number;
	changes: Change[];
	place: Hypothesis['place'][];
	site: string;
	ohms?: number;
}

/** Add a fuse the fault overloads (current above its rating) as blown, until none is. */
export function settleFuses<H extends Pick<Candidate, 'changes' | 'label'>>(base: Base, c: Circuit, h: H): H {
	const fuses = c.doc.parts.filter((p) => p.kind === 'fuse');
	let cur = h;
	for (let round = 0; round < 3; round++) {
		const ev = evaluateHypothesis(base, cur.changes);
		let worst: { element: number; ratio: number; key: string } | null = null;
		for (const f of fuses) {
			if (f.kind !== 'fuse') continue;
			const k = c.elements.findIndex((e) => e.ref.kind === 'part' && e.ref.part === f.id && e.ref.role === 'fuse');
			const e = c.elements[k];
			const amps = Math.abs(ev.gOf(k) * (ev.at(e.a) - ev.at(e.b)));
			const ratio = amps / f.params.rating;
			if (ratio > 1 && (!worst || ratio > worst.ratio)) worst = { element: k, ratio, key: f.key };
		}
		if (!worst) break;
		cur = { ...cur, changes: [...cur.changes, { type: 'element', element: worst.element, ohms: null }], label: `${cur.label} (fuse ${worst.key} blows)` };
	}
	return cur;
}

/**
 * Every probe's table reading under each candidate (rows: probes; columns: candidates) and in the
 * healthy circuit, from one factorisation per setup (as given, battery off, a part taken out).
 */
export function probeReadings(
	doc: HarnessDocument,
	scenario: Scenario,
	c: Circuit,
	base: Base,
	cands: readonly { changes: Change[] }[],
	specs: readonly ProbeSpec[],
	profile: MeterProfile,
	fallbacks: FallbackCount = emptyFallbacks()
): { readings: number[][]; healthy: number[] } {
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const bySetup = new Map<SetupId, number[]>();
	specs.forEach((s, i) => (bySetup.get(s.setup) ?? bySetup.set(s.setup, []).get(s.setup)!).push(i));
	const readings: number[][] = specs.map(() => []);
	const healthy: number[] = specs.map(() => 0);
	for (const [setup, idx] of bySetup) {
		// A part taken out: its own element opens, its holder and wires stay (the bulb out of its socket).
		const outPart = setup.startsWith('part-out:') ? parts.get(setup.slice('part-out:'.length)) : undefined;
		const outEl = outPart ? observedElement(c, outPart) : null;
		const sc =
			setup === 'as-given' ? c : outEl ? faultedCircuit(c, [{ type: 'element', element: outEl.element, ohms: null }]) : buildCircuit(doc, setupScenario(doc, scenario, setup));
		const b = setup === 'as-given' ? base : new Base(sc);
		const none = [{ changes: [] as Change[] }];
		const rows = predictReadings(b, [...cands, ...none], idx.map((i) => specs[i].meter), fallbacks);
		idx.forEach((pi, r) => {
			readings[pi] = cands.map((_, h) => tableReading(specs[pi], rows[r][h], profile));
			healthy[pi] = tableReading(specs[pi], rows[r][cands.length], profile);
		});
	}
	return { readings, healthy };
}

export function diagnose(input: DiagnoseInput): DiagnoseResult {
	const { doc, scenario } = input;
	const profile = input.meter ?? ENTRY_DMM;
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const c = buildCircuit(doc, scenario);
	const issues: { path: string; message: string }[] = [];
	const observed: { element: number; judged: Judged }[] = [];
	input.marks.forEach((m, i) => {
		const p = parts.get(m.part);
		if (!p) return issues.push({ path: `marks[${i}].part`, message: `no part "${m.part}" in this diagram` });
		const o = observedElement(c, p);
		if (!o) return issues.push({ path: `marks[${i}].part`, message: `part ${p.key} is a ${p.kind}: mark the lamps, gauges, motors or other parts it serves instead` });
		observed.push(o);
	});
	if (!input.marks.length) issues.push({ path: 'marks', message: 'mark at least one part (reads-low, reads-high, dead, erratic or normal)' });
	if (issues.length) throw new DiagnoseError(issues);
	const notes: string[] = [CAUTIONS.general];
	const fallbacks = emptyFallbacks();
	const base = new Base(c);
	const healthy = observed.map((o) => {
		const e = c.elements[o.element];
		return quantity(o.judged, base.g[o.element], base.solution.at(e.a) - base.solution.at(e.b));
	});
	// Marks on a part that draws nothing in this scenario cannot be judged.
	const used: number[] = [];
	input.marks.forEach((m, i) => {
		const p = parts.get(m.part)!;
		if (!(healthy[i] > 1e-9)) notes.push(`Part ${p.key} draws nothing in this scenario, so its mark is not used: switch it on in the scenario.`);
		else used.push(i);
	});
	const marks = used.map((i) => input.marks[i]);
	const judged = used.map((i) => observed[i].judged);
	const meters: Meter[] = used.map((i) => ({ kind: 'current', element: observed[i].element }));
	const abnormal = marks.filter((m) => m.mark !== 'normal').map((m) => m.part);
	const region = regionOf(doc, scenario, abnormal.length ? abnormal : marks.map((m) => m.part));
	const singles: Candidate[] = generateHypotheses(c, { region, weights: input.weights }).map((h) =>
		settleFuses(base, c, { id: h.id, label: h.label, kind: h.kind, prior: h.prior, changes: h.changes, place: [h.place], site: h.site, ohms: h.ohms })
	);

	// Lamps are judged by power: from the current, P = I²/g of the filament as faulted.
	const lampPower = (h: Candidate, mi: number, amps: number) => {
		const k = observed[used[mi]].element;
		let g = base.g[k];
		for (const ch of h.changes) if (ch.type === 'element' && ch.element === k) g = ch.ohms === null ? 0 : 1 / (ch.series ? 1 / c.elements[k].gClosed + ch.ohms : ch.ohms);
		return g > 0 ? (amps * amps) / g : 0;
	};
	const evaluate = (cands: Candidate[]) => {
		const rows = predictReadings(base, cands, meters, fallbacks);
		return cands.map((h, hi) => {
			const ratios = used.map((_, mi) => {
				const amps = Math.abs(rows[mi][hi]);
				const q = judged[mi] === 'lamp' ? lampPower(h, mi, amps) : amps;
				return q / healthy[used[mi]];
			});
			return { h, ratios, ex: explain({ kind: h.kind === 'double' ? 'joint:resistive' : h.kind }, marks, judged, ratios) };
		});
	};
	let evaluated = evaluate(singles);
	let explainedBy: DiagnoseResult['explainedBy'] = 'single';
	let found = evaluated.filter((e) => e.ex.explains);
	if (!found.length && abnormal.length) {
		explainedBy = 'double';
		notes.push('No single fault explains every mark: double faults over the region are offered instead.');
		// Pool: singles that move at least one abnormal mark the marked way.
		const pool = evaluated
			.filter((e) => marks.some((m, i) => m.mark !== 'normal' && (m.mark === 'erratic' ? e.ex.predicted[i] !== 'normal' : e.ex.predicted[i] === m.mark)))
			.sort((a, b) => b.h.prior - a.h.prior);
		const bestPerSite = new Map<string, (typeof pool)[number]>();
		for (const e of pool) if (!bestPerSite.has(e.h.site)) bestPerSite.set(e.h.site, e);
		const top = [...bestPerSite.values()].slice(0, DOUBLE_FAULT_POOL).map((e) => e.h);
		const pairs: Candidate[] = [];
		for (let i = 0; i < top.length; i++)
			for (let j = i + 1; j < top.length; j++) {
				const a = top[i];
				const b = top[j];
				pairs.push({ id: `${a.id}+${b.id}`, label: `${a.label}; and ${b.label}`, kind: 'double', prior: a.prior * b.prior * DOUBLE_FAULT_FACTOR, changes: [...a.changes, ...b.changes], place: [...a.place, ...b.place], site: `${a.site}+${b.site}` });
			}
		evaluated = evaluate(pairs);
		found = evaluated.filter((e) => e.ex.explains);
		if (!found.length) {
			explainedBy = 'none';
			notes.push('No single or double fault of the region explains the marks: check the marks, the scenario (switch and sender positions) and the diagram.');
		}
	}
	// One suspect per site: the sweep value that fits best.
	const perSite = new Map<string, (typeof found)[number]>();
	for (const e of found) {
		const prev = perSite.get(e.h.site);
		if (!prev || e.ex.fit > prev.ex.fit) perSite.set(e.h.site, e);
	}
	const chosen = [...perSite.values()].sort((a, b) => b.h.prior * b.ex.fit - a.h.prior * a.ex.fit);
	const total = chosen.reduce((s, e) => s + e.h.prior * e.ex.fit, 0);
	const suspects: SuspectOut[] = chosen.map((e) => ({
		id: e.h.id,
		site: e.h.site,
		label: e.h.label,
		kind: e.h.kind,
		chance: (e.h.prior * e.ex.fit) / total,
		prior: e.h.prior,
		fit: e.ex.fit,
		place: e.h.place,
		...(e.h.ohms !== undefined ? { ohms: e.h.ohms } : {})
	}));
	const cands = chosen.map((e) => e.h);

	// Probes and their readings under every suspect, one base per setup.
	const partOut = marks.filter((m) => m.mark !== 'normal').map((m) => m.part);
	let specs = candidateProbes(doc, scenario, c, base.solution, region, { profile, reach: input.reach, tools: input.tools, partOut });
	if (input.onlyProbes) {
		const only = new Set(input.onlyProbes);
		specs = specs.filter((s) => only.has(s.id));
	}
	const { readings, healthy: healthyReading } = probeReadings(doc, scenario, c, base, cands, specs, profile, fallbacks);
	const round = (x: number) => Math.round(x * 1e6) / 1e6;
	const table: PredictionTable = {
		suspects: suspects.map((s) => ({ id: s.id, prior: s.chance, label: s.label })),
		probes: specs.map((s) => ({ id: s.id, cost: s.cost, tolerance: s.tolerance, label: s.label, unit: s.unit })),
		readings: readings.map((row) => row.map(round))
	};
	const probesOut = specs.map((s, i) => {
		const { meter: _m, order: _o, ...rest } = s;
		void _m;
		void _o;
		return { ...rest, healthy: round(healthyReading[i]), expected: suspects.map((su, j) => ({ suspect: su.id, reading: table.readings[i][j] as number })) };
	});
	if (!suspects.length) {
		return {
			suspects,
			explainedBy,
			probes: probesOut,
			minimalSet: { probes: [], cost: 0, exact: true },
			ambiguityGroups: [],
			plan: { steps: [], expectedProbes: 0, expectedCost: 0 },
			notes,
			fallbacks,
			table
		};
	}
	const cover = minimalProbeSet(table);
	const plan = buildPlan(table);
	const result: DiagnoseResult = {
		suspects,
		explainedBy,
		probes: probesOut,
		minimalSet: { probes: cover.probes, cost: cover.cost, exact: cover.exact },
		ambiguityGroups: cover.ambiguityGroups,
		plan: { steps: checklist(table, plan), expectedProbes: plan.expectedProbes, expectedCost: plan.expectedCost },
		notes,
		fallbacks,
		table
	};
	return input.readings && Object.keys(input.readings).length ? withReadings(result, input.readings, profile) : result;
}

/**
 * A diagnosis planned again from readings taken: the suspects they contradict drop out and the
 * plan is made from the rest (plan.ts replan). Needs no circuit solve — the result's prediction
 * table holds every suspect's reading of every probe — so a result without readings can be kept
 * and planned again cheaply after each reading.
 */
export function withReadings(result: DiagnoseResult, readings: Readonly<Record<string, number | 'OL' | 'unreachable'>>, profile: MeterProfile = ENTRY_DMM): DiagnoseResult {
	const taken: ReadingTaken[] = [];
	const bad: { path: string; message: string }[] = [];
	const ids = new Set(result.probes.map((p) => p.id));
	for (const [probe, value] of Object.entries(readings)) {
		if (!ids.has(probe)) {
			bad.push({ path: `readings.${probe}`, message: `no probe "${probe}" in this plan` });
			continue;
		}
		if (value === 'unreachable') taken.push({ probe, unreachable: true });
		else if (value === 'OL') taken.push({ probe, reading: profile.ohms.overLimit });
		else taken.push({ probe, reading: value });
	}
	if (bad.length) throw new DiagnoseError(bad);
	if (!result.suspects.length || !taken.length) return result;
	const r = replan(result.table, taken);
	return {
		...result,
		plan: { steps: checklist(r.table, r.plan), expectedProbes: r.plan.expectedProbes, expectedCost: r.plan.expectedCost },
		readings: { remaining: r.remaining, dropped: r.dropped, unexplained: r.unexplained, unavailable: r.unavailable }
	};
}

export { FAULT_KINDS };
