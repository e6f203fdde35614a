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
import { bandAt, emfFromReading, SPREAD_MARGIN, type EmfRange, type Spread } from './bands';
import { atSize, FAULT_KINDS, generateHypotheses, regionOf, SIZE_GRIDS, sizeRange, type Change, type FaultKind, type Hypothesis, type Region } from './faults';
import { nodeOfTerminal } from './nets';
import { ENTRY_DMM, setupScenario, tableReading, type MeterProfile, type ProbeKind, type SetupId } from './meter';
import type { PredictionTable } from './outcomes';
import { buildPlan, checklist, replan, type ReadingTaken } from './plan';
import { Base, emptyFallbacks, evaluateHypothesis, faultedCircuit, predictReadings, type FallbackCount, type Meter } from './predict';
import { candidateProbes, CAUTIONS, type ProbeSpec } from './probes';
import type { Location } from './parts';
import type { Scenario } from './scenario';
import type { HarnessDocument } from './schema';
import { explain, markMiss, observedElement, quantity, seenOn, type Judged, type PartMark } from './symptoms';
import { batteryRange, CHARGE_BELOW_PER_12, factorWorlds, uncertaintyOf, withBattery, type UncertaintyInput } from './uncertainty';
import { planningView, type ReadingRange } from './outcomes';
import { groupAction } from './groups';
import { withArticle } from '../words';

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
	/** What is not known exactly (battery, part tolerances, wire lengths, senders); defaults from TRADE.md. */
	uncertainty?: UncertaintyInput;
}

/** Widening of each mark's band of ratios (symptoms.ts markFits): a person's "reads low" is a judgement. Invented. */
export const MARK_SLACK = 0.08;

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
	/** The fault sizes that explain the marks (Ω, or the stabilizer set-point factor): the suspect stands for all of them. */
	size?: { low: number; high: number };
	/** The size that fits the marks best: the suspect's `expected` readings are at it. */
	typical?: number;
}

/** A reading no suspect's band holds: kept, with the explanation that fits best. */
export interface Unexplained {
	probe: string;
	reading: number;
	reason: string;
	/** The suspects nearest to it, which the diagnosis goes on with. */
	nearest: string[];
	explanation: { cause: 'battery' | 'two-faults' | 'differs'; text: string; pair?: [string, string] };
}

/** The main battery as the diagnosis sees it. */
export interface BatteryState {
	/** The probe across its posts (taken first in a powered plan). */
	probe: string;
	part: string;
	/** The EMF range assumed until it is read (V). */
	assumed: { low: number; high: number };
	/** Once read: the reading and the EMF it implies (healthy harness). */
	measured?: number;
	emf?: number;
	/** The EMF below which it should be charged first: 12.0 V per 12 V at rest (BCI table; common practice); null while running. */
	chargeBelow: number | null;
	/** Read below `chargeBelow`: charge the battery before going on. */
	charge: boolean;
}

export interface DiagnoseResult {
	suspects: SuspectOut[];
	/** "single" when single faults explain the marks; "double" when only pairs do; "none" when nothing does. */
	/** 'nearest': nothing explains every mark; the suspects are the single faults that come nearest. */
	explainedBy: 'single' | 'double' | 'nearest' | 'none';
	/** `healthyBand`: what the harness as drawn reads there in a real vehicle (narrowed once the battery is read). */
	probes: (Omit<ProbeSpec, 'meter' | 'order'> & { expected: { suspect: string; reading: number }[]; healthy: number; healthyBand: ReadingRange })[];
	/** The bands in force (rows: probes, columns: suspects): the table's, narrowed once the battery is read. */
	bands: (ReadingRange | null)[][];
	minimalSet: { probes: string[]; cost: number; exact: boolean };
	ambiguityGroups: string[][];
	plan: { steps: ReturnType<typeof checklist>; expectedProbes: number; expectedCost: number };
	/** After readings: what they ruled out and what is left (`outside`: a reading lies beyond what it predicts). */
	readings?: {
		remaining: { suspect: string; chance: number; outside?: boolean }[];
		dropped: { suspect: string; probe: string; reading: number }[];
		unexplained: Unexplained[];
		unavailable: string[];
	};
	/** Suspects no probe tells apart, each group with one job in the restorer's words (groups.ts); the last one is what is left when the plan ends on several. */
	groups: { suspects: string[]; action: string; final?: boolean }[];
	notes: string[];
	fallbacks: FallbackCount;
	/** The prediction table the plan was made from (suspects × probes), with each reading's band. */
	table: PredictionTable;
	/** The main battery: its probe, the EMF assumed, and what its reading said. */
	battery: BatteryState | null;
	/** How each reading moves with the battery and everything else (bands.ts): lets a battery reading narrow the bands without a solve. */
	spread: { emf: EmfRange; rows: (Spread | null)[][]; healthy: (Spread | null)[] } | null;
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
	/** The fault's size in this variant (Ω or set-point factor) when its mode has a range. */
	size?: number;
	/** The hypothesis's own changes, before any fuse it blows: other sizes are made from them. */
	origin?: Change[];
}

/**
 * Current over a fuse's rating at which it is taken to blow: automotive blade fuses carry 110 % of
 * their rating for 100 hours and open at 135 % within minutes (ISO 8820-3 time-current limits,
 * recalled from memory). Below it a fuse run hot still conducts, as it does in the vehicle.
 */
export const FUSE_BLOWS = 1.35;
/** A fault blows a fuse only when it raises the fuse's current this much over the harness without it (a drawn rating too small is the drawing's, not the fault's). */
const FUSE_RISE = 1.5;

/** Amps through each fuse of the harness as drawn: a fault blows a fuse only by raising them. */
export function fuseCurrents(base: Base, c: Circuit): Map<string, { element: number; amps: number; rating: number; key: string }> {
	const out = new Map<string, { element: number; amps: number; rating: number; key: string }>();
	const s = base.solution;
	for (const f of c.doc.parts) {
		if (f.kind !== 'fuse') continue;
		const k = c.elements.findIndex((e) => e.ref.kind === 'part' && e.ref.part === f.id && e.ref.role === 'fuse');
		if (k < 0) continue;
		const e = c.elements[k];
		out.set(f.id, { element: k, amps: Math.abs(s.g[k] * (s.at(e.a) - s.at(e.b))), rating: f.params.rating, key: f.key });
	}
	return out;
}

/** Add a fuse the fault overloads (FUSE_BLOWS over its rating, and well above its current without the fault) as blown, until none is. */
export function settleFuses<H extends Pick<Candidate, 'changes' | 'label'>>(base: Base, c: Circuit, h: H, healthy = fuseCurrents(base, c)): H {
	let cur = h;
	for (let round = 0; round < 3; round++) {
		const ev = evaluateHypothesis(base, cur.changes);
		let worst: { element: number; ratio: number; key: string } | null = null;
		for (const f of healthy.values()) {
			const e = c.elements[f.element];
			const amps = Math.abs(ev.gOf(f.element) * (ev.at(e.a) - ev.at(e.b)));
			const ratio = amps / f.rating;
			if (ratio > FUSE_BLOWS && amps > FUSE_RISE * f.amps && (!worst || ratio > worst.ratio)) worst = { element: f.element, ratio, key: f.key };
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
			readings[pi] = cands.map((_, h) => tableReading(specs[pi].kind, rows[r][h], profile));
			healthy[pi] = tableReading(specs[pi].kind, rows[r][cands.length], profile);
		});
	}
	return { readings, healthy };
}


/**
 * Nodes joined to the battery's live post through wiring, switch and relay contacts and connector
 * pins only, no fuse: a short there draws what the battery gives and sags every feed. A short
 * behind another circuit's fuse blows it or draws too little to move parts elsewhere.
 */
function unfusedNodes(c: Circuit): Set<number> {
	const bat = c.doc.parts.find((p) => p.kind === 'battery');
	if (!bat) return new Set();
	const live = c.terminalNode({ part: bat.id, terminal: c.doc.vehicle.earth === 'positive' ? '-' : '+' });
	const next = new Map<number, number[]>();
	for (const e of c.elements) {
		if (e.g <= 0 || e.a < 0 || e.b < 0) continue;
		const passes = e.ref.kind === 'wire' || e.ref.kind === 'joint' || (e.ref.kind === 'part' && (e.ref.role === 'contact' || e.ref.role === 'pin'));
		if (!passes) continue;
		(next.get(e.a) ?? next.set(e.a, []).get(e.a)!).push(e.b);
		(next.get(e.b) ?? next.set(e.b, []).get(e.b)!).push(e.a);
	}
	const seen = new Set<number>(live >= 0 ? [live] : []);
	const stack = [...seen];
	while (stack.length) for (const m of next.get(stack.pop()!) ?? []) if (!seen.has(m)) (seen.add(m), stack.push(m));
	return seen;
}

/** A marks world: the circuit the marks are judged in (nominal, or a sender at one end of its travel). */
interface MarksWorld {
	c: Circuit;
	base: Base;
}

/** The grid of sizes a sized fault mode is sampled at, or null. */
function gridOf(h: Pick<Hypothesis, 'kind' | 'changes'>): readonly number[] | null {
	if (!sizeRange(h)) return null;
	if (h.kind === 'node:short') return SIZE_GRIDS.short;
	if (h.kind === 'stabilizer:low' || h.kind === 'stabilizer:high') return SIZE_GRIDS[h.kind];
	return SIZE_GRIDS.resistive;
}

/** "about 20 Ω" → the span that fits, in the label a restorer reads. */
function sizeText(kind: FaultKind | 'double', low: number, high: number): string {
	const n = (x: number) => (x >= 10 ? x.toFixed(0) : x >= 1 ? x.toFixed(1).replace(/\.0$/, '') : String(Number(x.toPrecision(2))));
	if (kind === 'stabilizer:low' || kind === 'stabilizer:high') return low === high ? `about ${Math.round(low * 100)} % of its setting` : `${Math.round(low * 100)}–${Math.round(high * 100)} % of its setting`;
	return low === high ? `about ${n(low)} Ω` : `${n(low)}–${n(high)} Ω`;
}

export function diagnose(input: DiagnoseInput): DiagnoseResult {
	const { doc, scenario } = input;
	const profile = input.meter ?? ENTRY_DMM;
	const u = uncertaintyOf(input.uncertainty);
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const c = buildCircuit(doc, scenario);
	const issues: { path: string; message: string }[] = [];
	const observed: { element: number; judged: Judged }[] = [];
	input.marks.forEach((m, i) => {
		const p = parts.get(m.part);
		if (!p) return issues.push({ path: `marks[${i}].part`, message: `no part "${m.part}" in this diagram` });
		const o = observedElement(c, p);
		if (!o) return issues.push({ path: `marks[${i}].part`, message: `part ${p.key} is ${withArticle(p.kind)}: mark the lamps, gauges, motors or other parts it serves instead` });
		observed.push(o);
	});
	if (!input.marks.length) issues.push({ path: 'marks', message: 'mark at least one part (reads-low, reads-high, dead, erratic or normal)' });
	if (issues.length) throw new DiagnoseError(issues);
	const notes: string[] = [CAUTIONS.general];
	const fallbacks = emptyFallbacks();
	const base = new Base(c);
	const healthyOf = (w: MarksWorld) =>
		observed.map((o) => {
			const e = w.c.elements[o.element];
			return quantity(o.judged, w.base.g[o.element], w.base.solution.at(e.a) - w.base.solution.at(e.b));
		});
	const healthy = healthyOf({ c, base });
	// Marks on a part that draws nothing in this scenario cannot be judged.
	const used: number[] = [];
	input.marks.forEach((m, i) => {
		const p = parts.get(m.part)!;
		if (!seenOn(c, observed[i].element, observed[i].judged, healthy[i])) notes.push(`Part ${p.key} is off in this scenario (it draws next to nothing), so its mark is not used: switch it on in the scenario.`);
		else used.push(i);
	});
	const marks = used.map((i) => input.marks[i]);
	const judged = used.map((i) => observed[i].judged);
	const meters: Meter[] = used.map((i) => ({ kind: 'current', element: observed[i].element }));
	const abnormal = marks.filter((m) => m.mark !== 'normal').map((m) => m.part);
	const region = regionOf(doc, scenario, abnormal.length ? abnormal : marks.map((m) => m.part));

	const fuses = fuseCurrents(base, c);
	const unfused = unfusedNodes(c);
	// Off the marked parts' wiring, a fault is a suspect where it can move them at all (a sneak
	// path, a relay falling to its other contact, a shared earth): each site's strongest form (open,
	// off, a hard short, fuses settled) is tried once on the marks, and a site that moves every
	// abnormal mark the marked way by SCREEN_MOVE joins the region, with all its sizes.
	function widenedByEffect(): Region {
		const wide: Region = { parts: new Set(region.parts), wires: new Set(region.wires), nodes: new Set(region.nodes) };
		const abnormalAt = marks.map((m, i) => (m.mark === 'normal' ? -1 : i)).filter((i) => i >= 0);
		if (!abnormalAt.length) return wide;
		const known = new Set(generateHypotheses(c, { region, weights: input.weights, sweep: [] }).map((h) => h.site));
		const strongest = generateHypotheses(c, { weights: input.weights, sweep: [] })
			.filter((h) => h.kind !== 'none' && !known.has(h.site) && !h.changes.some((ch) => ch.type === 'to-chassis' && unfused.has(ch.node)))
			.map((h) => settleFuses(base, c, { ...h }, fuses));
		if (!strongest.length) return wide;
		const rows = predictReadings(base, strongest, abnormalAt.map((i) => meters[i]), fallbacks);
		strongest.forEach((h, hi) => {
			const moves = abnormalAt.every((i, k) => {
				const e = c.elements[observed[used[i]].element];
				const h0 = healthy[used[i]];
				if (!(h0 > 1e-12)) return false;
				const amps = Math.abs(rows[k][hi]);
				let g = base.g[observed[used[i]].element];
				for (const ch of h.changes) if (ch.type === 'element' && ch.element === observed[used[i]].element) g = ch.ohms === null ? 0 : 1 / (ch.series ? 1 / e.gClosed + ch.ohms : ch.ohms);
				const r = (judged[i] === 'lamp' ? (g > 0 ? (amps * amps) / g : 0) : amps) / h0;
				const mark = marks[i].mark;
				return mark === 'erratic' ? Math.abs(r - 1) > SCREEN_MOVE : mark === 'reads-high' ? r > 1 + SCREEN_MOVE : r < 1 - SCREEN_MOVE;
			});
			if (!moves) return;
			if (h.place.part) wide.parts.add(h.place.part);
			if (h.place.wire) wide.wires.add(h.place.wire);
			if (h.place.node) wide.nodes.add(h.place.node);
		});
		return wide;
	}
	for (const f of fuses.values())
		if (f.amps > f.rating) notes.push(`Fuse ${f.key} carries ${f.amps.toFixed(1)} A in the harness as drawn, more than its ${f.rating} A rating: check the rating and the loads on the drawing.`);
	c.relays.forEach((r, k) => {
		const v = base.coilVolts.get(r.part)!;
		if (v >= r.dropOut && v < r.pullIn)
			notes.push(
				`Relay ${parts.get(r.part)!.key}'s coil gets ${v.toFixed(1)} V in the harness as drawn, between its drop-out (${r.dropOut.toFixed(1)} V) and pull-in (${r.pullIn.toFixed(1)} V): it stays as it was, taken here as ${base.energisedAt[k] ? 'pulled in' : 'released'}. Check its coil feed on the drawing; in the vehicle, listen for it.`
			);
	});
	// Every size a sized mode can have, sampled on its grid (faults.ts SIZE_GRIDS).
	const variants: Candidate[] = [];
	// Suspects are chosen by effect, not by adjacency: a chafed short anywhere draws its current
	// through the battery and the feeds it shares with the marked parts, and can sag them all, so
	// shorts are tried on every node of the harness; the marks keep only those that explain them.
	const inRegion = generateHypotheses(c, { region: widenedByEffect(), weights: input.weights, sweep: SIZE_GRIDS.resistive });
	const seen = new Set(inRegion.map((h) => h.site));
	const elsewhere = generateHypotheses(c, { weights: input.weights, sweep: [] }).filter((h) => h.kind === 'node:short' && !seen.has(h.site) && h.changes.some((ch) => ch.type === 'to-chassis' && unfused.has(ch.node)));
	for (const h of [...inRegion, ...elsewhere]) {
		const grid = h.kind === 'node:short' || h.kind === 'stabilizer:low' || h.kind === 'stabilizer:high' ? gridOf(h) : null;
		const sized = grid ? grid.map((size) => ({ ...h, id: `${h.site}:${size}`, changes: atSize(h, size), size })) : [{ ...h, ...(h.ohms !== undefined ? { size: h.ohms } : {}) }];
		for (const v of sized) {
			const cand: Candidate = { id: v.id, label: v.label, kind: v.kind, prior: v.prior, changes: v.changes, place: [v.place], site: v.site, ohms: v.ohms, size: v.size, origin: h.changes };
			// Every kind, not only shorts: an open or a joint lowers the battery's load but can push
			// more current through one fuse (a sneak path through another load, a relay falling to
			// its other contact).
			variants.push(settleFuses(base, c, cand, fuses));
		}
	}

	// The marks are judged in the nominal harness and with each unknown sender at either end of
	// its travel: how far a gauge drops for a given joint depends on the sender in series with it.
	const marksWorlds: MarksWorld[] = [{ c, base }];
	for (const w of factorWorlds(doc, scenario, u, region)) {
		if (!w.id.startsWith('sender:')) continue;
		const cw = buildCircuit(w.doc, w.scenario);
		marksWorlds.push({ c: cw, base: new Base(cw) });
	}
	// Lamps are judged by power: from the current, P = I²/g of the filament as faulted.
	const lampPower = (w: MarksWorld, h: Candidate, mi: number, amps: number) => {
		const k = observed[used[mi]].element;
		let g = w.base.g[k];
		for (const ch of h.changes) if (ch.type === 'element' && ch.element === k) g = ch.ohms === null ? 0 : 1 / (ch.series ? 1 / w.c.elements[k].gClosed + ch.ohms : ch.ohms);
		return g > 0 ? (amps * amps) / g : 0;
	};
	const judge = (w: MarksWorld, cands: Candidate[], slacks: readonly number[]) => {
		const h0 = healthyOf(w);
		const rows = predictReadings(w.base, cands, meters, fallbacks);
		return cands.map((h, hi) => {
			const ratios = used.map((_, mi) => {
				const amps = Math.abs(rows[mi][hi]);
				const q = judged[mi] === 'lamp' ? lampPower(w, h, mi, amps) : amps;
				return h0[used[mi]] > 1e-12 ? q / h0[used[mi]] : 1;
			});
			const miss = marks.reduce((m, mk, mi) => m + markMiss(judged[mi], ratios[mi], mk.mark), 0);
			return { miss, by: slacks.map((slack) => explain({ kind: h.kind === 'double' ? 'joint:resistive' : h.kind }, marks, judged, ratios, slack, Math.min(slack, MARK_SLACK))) };
		});
	};
	// Explained in some world; fit as in the nominal one where it explains there, else the best
	// world's. The other worlds are judged only for what nearly explains in the nominal one (a
	// sender's travel moves a gauge's ratio by a third at most): the rest cannot get there.
	const evaluate = (cands: Candidate[], worlds: readonly MarksWorld[]) => {
		const nominal = judge(worlds[0], cands, [MARK_SLACK, 0.35]);
		const out = cands.map((h, hi) => {
			const [at, wide] = nominal[hi].by;
			return { h, explains: at.explains, near: wide.explains, miss: nominal[hi].miss, fit: at.explains ? at.fit : 0, predicted: at.predicted };
		});
		const near = cands.map((_, hi) => hi).filter((hi) => !nominal[hi].by[0].explains && nominal[hi].by[1].explains);
		if (near.length)
			for (const w of worlds.slice(1)) {
				const got = judge(w, near.map((hi) => cands[hi]), [MARK_SLACK]);
				near.forEach((hi, k) => {
					const x = got[k].by[0];
					if (x.explains) {
						out[hi].explains = true;
						out[hi].fit = Math.max(out[hi].fit, x.fit);
					}
				});
			}
		return out;
	};
	let evaluated = evaluate(variants, marksWorlds);
	// Some marks fit only a narrow window of sizes (most parts dead and one still glowing): where
	// a sample of a site nearly fits, the sizes either side of its nearest sample are tried too,
	// closing in on the window a round at a time.
	for (let round = 0; round < 3; round++) {
		const bySize = new Map<string, (typeof evaluated)[number][]>();
		for (const e of evaluated) if (e.h.size !== undefined && e.h.origin) (bySize.get(e.h.site) ?? bySize.set(e.h.site, []).get(e.h.site)!).push(e);
		const extra: Candidate[] = [];
		for (const list of bySize.values()) {
			if (list.some((e) => e.explains) || !list.some((e) => e.near)) continue;
			list.sort((a, b) => a.h.size! - b.h.size!);
			const best = list.reduce((m, e, i) => (e.near && (m < 0 || e.miss < list[m].miss) ? i : m), -1);
			for (let i = 0; i + 1 < list.length; i++) {
				const [a, b] = [list[i], list[i + 1]];
				// Beside the nearest sample, or where the predicted marks change (a fuse blowing, a relay dropping out).
				if (!(a.near || b.near) || !(i === best - 1 || i === best || a.predicted.some((m, k) => m !== b.predicted[k]))) continue;
				const size = a.h.kind.startsWith('stabilizer') ? (a.h.size! + b.h.size!) / 2 : Math.sqrt(a.h.size! * b.h.size!);
				const shown = (x: number) => Number(x.toPrecision(3));
				if (shown(size) === shown(a.h.size!) || shown(size) === shown(b.h.size!)) continue;
				const v: Candidate = { ...a.h, id: `${a.h.site}:${Number(size.toPrecision(3))}`, changes: atSize({ kind: a.h.kind as FaultKind, changes: a.h.origin! }, size), size, ...(a.h.ohms !== undefined ? { ohms: Number(size.toPrecision(3)) } : {}) };
				extra.push(settleFuses(base, c, v, fuses));
			}
		}
		if (!extra.length) break;
		evaluated = [...evaluated, ...evaluate(extra, marksWorlds)];
	}

	let explainedBy: DiagnoseResult['explainedBy'] = 'single';
	let found = evaluated.filter((e) => e.explains);
	if (!found.length && abnormal.length) {
		explainedBy = 'double';
		notes.push('No single fault explains every mark: double faults over the region are offered instead.');
		// Pool: singles that move at least one abnormal mark the marked way.
		const pool = evaluated
			.filter((e) => marks.some((m, i) => m.mark !== 'normal' && (m.mark === 'erratic' ? e.predicted[i] !== 'normal' : e.predicted[i] === m.mark)))
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
		const singles = evaluated;
		evaluated = evaluate(pairs, [marksWorlds[0]]);
		found = evaluated.filter((e) => e.explains);
		if (!found.length) {
			// The vehicle differs from the drawing more than its tolerances say (a relay at another
			// threshold, a part drawing where the drawing has it off): the readings, which do not
			// depend on the marks, can still find the fault. Go on with the single faults whose marks
			// come nearest (markMiss), each at its nearest size, and say so.
			const nearestPerSite = new Map<string, (typeof singles)[number]>();
			for (const e of singles) {
				const prev = nearestPerSite.get(e.h.site);
				if (e.h.kind !== 'none' && (!prev || e.miss < prev.miss)) nearestPerSite.set(e.h.site, e);
			}
			const nearest = [...nearestPerSite.values()].sort((a, b) => a.miss - b.miss || b.h.prior - a.h.prior).slice(0, NEAREST_POOL);
			if (nearest.length) {
				explainedBy = 'nearest';
				for (const e of nearest) {
					e.explains = true;
					e.fit = Math.exp(-e.miss);
				}
				evaluated = singles;
				found = nearest;
				notes.push(`No single or double fault of the drawing explains every mark: the ${nearest.length} faults whose marks come nearest are the suspects, and the readings decide. Check the marks and the scenario (switch and sender positions); the vehicle may differ from the drawing.`);
			} else {
				explainedBy = 'none';
				notes.push('No single or double fault of the region explains the marks: check the marks, the scenario (switch and sender positions) and the diagram.');
			}
		}
	}

	// One suspect per site, standing for every size that explains the marks. Its span of sizes
	// reaches one grid step past them on each side, so a true size between the last sample that
	// explains and the first that does not still lies inside its band.
	const bySite = new Map<string, (typeof evaluated)[number][]>();
	for (const e of evaluated) (bySite.get(e.h.site) ?? bySite.set(e.h.site, []).get(e.h.site)!).push(e);
	type Chosen = { rep: Candidate; fit: number; span: Candidate[]; size?: { low: number; high: number } };
	const chosenAll: Chosen[] = [];
	for (const list of bySite.values()) {
		// In order of size, so a suspect's span runs between neighbouring samples.
		if (list.every((e) => e.h.size !== undefined)) list.sort((a, b) => a.h.size! - b.h.size!);
		const ok = list.map((e, i) => (e.explains ? i : -1)).filter((i) => i >= 0);
		if (!ok.length) continue;
		const best = ok.reduce((a, i) => (list[i].fit > list[a].fit ? i : a), ok[0]);
		const first = ok[0];
		const last = ok[ok.length - 1];
		const rep = list[best].h;
		// Every sample from one step below the sizes that fit to one above, not only the two ends: a
		// reading need not move monotonically with the size once a relay drops out or a lamp's
		// current moves a stabilizer, so the band takes the extremes over all of them.
		const span = list
			.slice(Math.max(0, first - 1), last + 2)
			.map((e) => e.h)
			.filter((h) => h !== rep);
		const size = rep.size !== undefined && list.length > 1 ? { low: list[first].h.size!, high: list[last].h.size! } : undefined;
		const label = size ? `${rep.label.replace(/, about [\d.]+ Ω$/, '')}, ${sizeText(rep.kind, size.low, size.high)}` : rep.label;
		chosenAll.push({ rep: { ...rep, id: size ? rep.site : rep.id, label }, fit: list[best].fit, span: size ? span : [], size });
	}
	const chosen = chosenAll.sort((a, b) => b.rep.prior * b.fit - a.rep.prior * a.fit);
	const total = chosen.reduce((s, e) => s + e.rep.prior * e.fit, 0);
	const suspects: SuspectOut[] = chosen.map((e) => ({
		id: e.rep.id,
		site: e.rep.site,
		label: e.rep.label,
		kind: e.rep.kind,
		chance: (e.rep.prior * e.fit) / total,
		prior: e.rep.prior,
		fit: e.fit,
		place: e.rep.place,
		...(e.rep.ohms !== undefined ? { ohms: e.rep.ohms } : {}),
		...(e.size ? { size: e.size, typical: e.rep.size } : {})
	}));
	const cands = chosen.map((e) => e.rep);

	// Probes and their readings under every suspect, one base per setup.
	const partOut = marks.filter((m) => m.mark !== 'normal').map((m) => m.part);
	// The probes reach every suspect's place, wherever the marks found it.
	const probeRegion: Region = { parts: new Set(region.parts), wires: new Set(region.wires), nodes: new Set(region.nodes) };
	for (const e of chosen)
		for (const place of e.rep.place) {
			if (place.part) probeRegion.parts.add(place.part);
			if (place.node) probeRegion.nodes.add(place.node);
			if (place.wire) probeRegion.wires.add(place.wire);
		}
	let specs = candidateProbes(doc, scenario, c, base.solution, probeRegion, { profile, reach: input.reach, tools: input.tools, partOut });
	if (input.onlyProbes) {
		const only = new Set(input.onlyProbes);
		specs = specs.filter((s) => only.has(s.id));
	}
	const spanCands = chosen.flatMap((e) => e.span);
	const everyRun = probeReadings(doc, scenario, c, base, [...cands, ...spanCands], specs, profile, fallbacks);
	// A probe where every suspect, at every size sampled, reads alike (within a thousandth: below a
	// meter's last digit) tells none of them apart, however wide the bands; on a large harness most
	// probes are on circuits the suspects do not touch. They are dropped before
	// the bands, which solve every suspect at every probe once per uncertain world. The battery's
	// own probes and probes already read stay.
	const telling = specs
		.map((sp, i) => i)
		.filter((i) => parts.get(specs[i].place.part)?.kind === 'battery' || input.readings?.[specs[i].id] !== undefined || tells(everyRun.readings[i]));
	if (telling.length < specs.length) specs = telling.map((i) => specs[i]);
	const nominalRun = telling.length < everyRun.readings.length ? { readings: telling.map((i) => everyRun.readings[i]), healthy: telling.map((i) => everyRun.healthy[i]) } : everyRun;
	const readings = nominalRun.readings.map((row) => row.slice(0, cands.length));
	const healthyReading = nominalRun.healthy;

	// Bands (bands.ts): every other group of uncertain values at each end, the battery at three EMFs.
	const bat = batteryRange(doc, scenario, u);
	const emf: EmfRange | null = bat ? { low: bat.low, nominal: bat.nominal, high: bat.high } : null;
	// With the battery disconnected its EMF and the stabilizer's setting change nothing: those
	// worlds solve the powered probes only and take the ohms readings as they are.
	const powered = specs.map((sp, i) => (sp.setup === 'power-off' ? -1 : i)).filter((i) => i >= 0);
	const solveWorld = (wdoc: HarnessDocument, wsc: Scenario, poweredOnly = false) => {
		const cw = buildCircuit(wdoc, wsc);
		if (!poweredOnly || powered.length === specs.length) return probeReadings(wdoc, wsc, cw, new Base(cw), cands, specs, profile, fallbacks);
		const got = probeReadings(wdoc, wsc, cw, new Base(cw), cands, powered.map((i) => specs[i]), profile, fallbacks);
		const out = { readings: readings.map((row) => [...row]), healthy: [...healthyReading] };
		powered.forEach((i, k) => {
			out.readings[i] = got.readings[k];
			out.healthy[i] = got.healthy[k];
		});
		return out;
	};
	const groups = new Map<string, { readings: number[][]; healthy: number[] }[]>();
	// Senders anywhere the probes reach, not only on the marked parts' wiring: an ohms reading
	// across a sender off their path still depends on where its float or bulb sits.
	for (const w of factorWorlds(doc, scenario, u, probeRegion)) {
		const g = w.id.slice(0, w.id.lastIndexOf(':'));
		(groups.get(g) ?? groups.set(g, []).get(g)!).push(solveWorld(w.doc, w.scenario, g === 'stabilizer'));
	}
	const ends = [...groups.values()];
	// The band at the nominal EMF: over the suspect's representative and the sizes of its span that
	// read lowest and highest, each moved by every group. A group moves a sample by its deviation
	// on the healthy harness plus the part due to the fault scaled by the sample's own effect
	// (ρ = its change from healthy over the representative's): a larger joint's drop moves more
	// with the lamp's current, a dead feed reads 0 V whatever the battery.
	const nominalBand = (p: number, h: number): ReadingRange => {
		const h0 = healthyReading[p];
		const rep = h < cands.length ? readings[p][h] : h0;
		const samples = [rep];
		if (h < cands.length) {
			const e = chosen[h];
			let at = cands.length + chosen.slice(0, h).reduce((a, x) => a + x.span.length, 0);
			let lo = Infinity;
			let hi = -Infinity;
			for (let k = 0; k < e.span.length; k++, at++) {
				lo = Math.min(lo, nominalRun.readings[p][at]);
				hi = Math.max(hi, nominalRun.readings[p][at]);
			}
			if (e.span.length) samples.push(lo, hi);
		}
		let low = Infinity;
		let high = -Infinity;
		for (const r of samples) {
			const effect = rep - h0;
			const rho = Math.abs(effect) < 1e-6 ? 1 : Math.max(-10, Math.min(10, (r - h0) / effect));
			let down = 0;
			let up = 0;
			for (const runs of ends) {
				let dmin = 0;
				let dmax = 0;
				for (const run of runs) {
					const hd = run.healthy[p] - h0;
					const rd = (h < cands.length ? run.readings[p][h] : run.healthy[p]) - rep;
					const d = (1 - rho) * hd + rho * rd;
					dmin = Math.min(dmin, d);
					dmax = Math.max(dmax, d);
				}
				down -= dmin;
				up += dmax;
			}
			low = Math.min(low, r - SPREAD_MARGIN * down);
			high = Math.max(high, r + SPREAD_MARGIN * up);
		}
		return { low, high };
	};
	const lowRun = emf ? solveWorld(withBattery(doc, scenario, emf.low), scenario, true) : null;
	const highRun = emf ? solveWorld(withBattery(doc, scenario, emf.high), scenario, true) : null;
	const spreadOf = (p: number, h: number): Spread => {
		const nominal = h < cands.length ? readings[p][h] : healthyReading[p];
		const pick = (run: typeof lowRun) => (run ? (h < cands.length ? run.readings[p][h] : run.healthy[p]) : nominal);
		const b = nominalBand(p, h);
		return { atLow: round(pick(lowRun)), atHigh: round(pick(highRun)), low: round(b.low), high: round(b.high) };
	};
	const spread = {
		emf: emf ?? { low: 0, nominal: 0, high: 0 },
		rows: specs.map((_, p) => cands.map((_, h) => spreadOf(p, h))),
		healthy: specs.map((_, p) => spreadOf(p, cands.length))
	};
	const batteryProbe = bat ? specs.find((s) => s.kind === 'volts' && s.setup === 'as-given' && s.place.part === bat.part.id && s.place.to === 'earth') : undefined;
	const battery: BatteryState | null =
		bat && batteryProbe ? { probe: batteryProbe.id, part: bat.part.id, assumed: { low: bat.low, high: bat.high }, chargeBelow: scenario.engineRunning ? null : (CHARGE_BELOW_PER_12 * doc.vehicle.systemVoltage) / 12, charge: false } : null;

	const table: PredictionTable = {
		suspects: suspects.map((s) => ({ id: s.id, prior: s.chance, label: s.label })),
		probes: specs.map((s) => ({ id: s.id, cost: s.cost, tolerance: s.tolerance, label: s.label, unit: s.unit })),
		readings: readings.map((row) => row.map(round)),
		bands: specs.map((sp, p) => cands.map((_, h) => roundBand(bandAt(readings[p][h], spread.rows[p][h], spread.emf, spread.emf.low, spread.emf.high), sp.unit)))
	};
	const probesOut = specs.map((s, i) => {
		const { meter: _m, order: _o, ...rest } = s;
		void _m;
		void _o;
		return {
			...rest,
			healthy: round(healthyReading[i]),
			healthyBand: roundBand(bandAt(healthyReading[i], spread.healthy[i]!, spread.emf, spread.emf.low, spread.emf.high), s.unit),
			expected: suspects.map((su, j) => ({ suspect: su.id, reading: table.readings[i][j] as number }))
		};
	});
	const result: DiagnoseResult = {
		suspects,
		explainedBy,
		probes: probesOut,
		minimalSet: { probes: [], cost: 0, exact: true },
		ambiguityGroups: [],
		plan: { steps: [], expectedProbes: 0, expectedCost: 0 },
		notes,
		fallbacks,
		table,
		bands: table.bands!,
		battery,
		spread: emf ? spread : null,
		groups: []
	};
	if (!suspects.length) return result;
	return explainPairs(input, withReadings(result, input.readings ?? {}, profile), input.readings ?? {});
}

const round = (x: number) => Math.round(x * 1e6) / 1e6;
/** A band rounded as the table is; brightness and ohms cannot go below zero (the first-order sum can). */
const roundBand = (b: ReadingRange, unit?: string): ReadingRange => {
	const floor = unit === '%' || unit === 'Ω' ? 0 : -Infinity;
	return { low: round(Math.max(floor, b.low)), high: round(Math.max(floor, b.high)) };
};

/**
 * A diagnosis planned again from readings taken: each reading weighs the suspects by how well it
 * fits their bands (plan.ts replan), and the plan is made from the ones left. A battery reading
 * first turns into each suspect's own EMF (bands.ts), narrowing every band. Needs no circuit
 * solve — the result holds every suspect's reading of every probe and how it moves — so a result
 * without readings can be kept and planned again cheaply after each reading.
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
	if (!result.suspects.length) return result;
	let table = result.table;
	let battery = result.battery;
	const batteryRead = battery ? readings[battery.probe] : undefined;
	let probes = result.probes;
	if (battery && result.spread && typeof batteryRead === 'number') {
		const spread = result.spread;
		const bp = table.probes.findIndex((q) => q.id === battery!.probe);
		const tol = table.probes[bp].tolerance;
		const t = tol.abs + tol.rel * Math.abs(batteryRead);
		// The EMFs a reading allows: the meter's tolerance, and how far the battery's own reading
		// moves at one EMF with everything else (loads drawing more sag the posts).
		const emfSpan = (nominal: number, sp: Spread) => {
			const lo = emfFromReading(nominal, sp, spread.emf, batteryRead - t - Math.max(0, sp.high - nominal));
			const hi = emfFromReading(nominal, sp, spread.emf, batteryRead + t + Math.max(0, nominal - sp.low));
			return lo && hi ? { low: Math.min(lo.emf, hi.emf), high: Math.max(lo.emf, hi.emf) } : null;
		};
		const healthyEmf = emfFromReading(result.probes[bp].healthy, spread.healthy[bp]!, spread.emf, batteryRead);
		battery = {
			...battery,
			measured: batteryRead,
			...(healthyEmf ? { emf: round(healthyEmf.emf) } : {}),
			charge: !!healthyEmf && battery.chargeBelow !== null && healthyEmf.emf < battery.chargeBelow
		};
		const envelope = { low: Math.min(spread.emf.low, healthyEmf?.emf ?? Infinity), high: Math.max(spread.emf.high, healthyEmf?.emf ?? -Infinity) };
		// Every band again at each suspect's own EMF (its battery reading includes its own load).
		const bands = table.readings.map((row, p) =>
			row.map((r, s) => {
				if (r === null) return null;
				const own = emfSpan(table.readings[bp][s] as number, spread.rows[bp][s]!);
				if (!own || p === bp) return table.bands?.[p]?.[s] ?? null;
				// A suspect whose own load would put the battery outside its possible range is
				// unlikely (the battery probe's band weighs it); its bands stay at a possible EMF.
				const clip = (e: number) => Math.min(envelope.high, Math.max(envelope.low, e));
				return roundBand(bandAt(r, spread.rows[p][s]!, spread.emf, clip(own.low), clip(own.high)), result.probes[p].unit);
			})
		);
		table = { ...table, bands };
		const healthySpan = emfSpan(result.probes[bp].healthy, spread.healthy[bp]!);
		if (healthySpan) probes = result.probes.map((q, p) => (p === bp ? q : { ...q, healthyBand: roundBand(bandAt(q.healthy, spread.healthy[p]!, spread.emf, healthySpan.low, healthySpan.high), q.unit) }));
	}
	const first = battery && battery.measured === undefined && readings[battery.probe] === undefined ? battery.probe : undefined;
	const r = replan(table, taken, first ? { first } : {});
	const cover = minimalProbeSet(planningView(r.table));
	const byId = new Map(result.suspects.map((x) => [x.id, x]));
	const said = (ids: readonly string[]) => groupAction(ids.map((id) => byId.get(id)!).filter(Boolean));
	const groups: DiagnoseResult['groups'] = cover.ambiguityGroups.map((g) => ({ suspects: g, action: said(g) }));
	if (taken.length && r.plan.root.kind !== 'probe' && r.remaining.length > 1) {
		const ids = r.remaining.map((x) => x.suspect);
		groups.push({ suspects: ids, action: said(ids), final: true });
	}
	const unexplained: Unexplained[] = r.unexplained.map((x) => ({ ...x, explanation: explanationOf(result, battery, x.probe, taken) }));
	return {
		...result,
		battery,
		probes,
		bands: table.bands ?? table.readings.map((row) => row.map((x) => (x === null ? null : { low: x, high: x }))),
		minimalSet: { probes: cover.probes, cost: cover.cost, exact: cover.exact },
		ambiguityGroups: cover.ambiguityGroups,
		groups,
		plan: { steps: checklist(r.table, r.plan), expectedProbes: r.plan.expectedProbes, expectedCost: r.plan.expectedCost },
		...(taken.length ? { readings: { remaining: r.remaining, dropped: r.dropped, unexplained, unavailable: r.unavailable } } : {})
	};
}

export const DIFFERS_TEXT =
	'No single fault of the drawing gives this reading. Check the probe contact and the meter setting and take it again; if it holds, the vehicle may differ from the drawing (a wire not drawn, a part of another value, a fuse of another rating) or two faults may be present. The diagnosis goes on with the nearest suspects, marked "outside what the drawing predicts".';

/** The likeliest reason a reading lies outside every band, without solving again (pairs: `explainPairs`). */
function explanationOf(result: DiagnoseResult, battery: BatteryState | null, probe: string, taken: readonly ReadingTaken[]): Unexplained['explanation'] {
	const p = result.probes.findIndex((q) => q.id === probe);
	const s = result.spread?.healthy[p];
	const movesWithBattery = !!s && Math.abs(s.atHigh - s.atLow) > 0.05;
	if (battery && movesWithBattery) {
		if (battery.measured === undefined && !taken.some((t) => t.probe === battery.probe))
			return { cause: 'battery', text: `The battery may not be where it was assumed (${battery.assumed.low.toFixed(1)}–${battery.assumed.high.toFixed(1)} V): read it at its posts first, and every expected reading is worked out again from it.` };
		if (battery.charge)
			return { cause: 'battery', text: `The battery reads ${Math.abs(battery.measured ?? 0).toFixed(2)} V, below ${battery.chargeBelow?.toFixed(1)} V: charge it, rest it some hours, and take the readings again.` };
	}
	return { cause: 'differs', text: DIFFERS_TEXT };
}

/** Whether the suspects' readings differ from each other by more than a thousandth of the larger (1 V floor), or in being readable. */
function tells(row: readonly number[]): boolean {
	let lo = Infinity;
	let hi = -Infinity;
	let unreadable = 0;
	for (const x of row) {
		if (Number.isNaN(x)) unreadable++;
		else {
			lo = Math.min(lo, x);
			hi = Math.max(hi, x);
		}
	}
	if (unreadable && unreadable < row.length) return true;
	return hi - lo > 1e-3 * Math.max(1, Math.abs(lo), Math.abs(hi));
}

/** How far a fault off the marked parts' wiring must move every abnormal mark, at its strongest, to be a suspect (invented: a third of the smallest mark threshold, 15 %). */
export const SCREEN_MOVE = 0.05;

/** Suspects kept when no fault explains the marks: the faults that come nearest (invented; enough for a few sites and their neighbours). */
export const NEAREST_POOL = 12;

/** Most single suspects paired when looking for two faults behind readings no single one explains. */
export const PAIR_POOL = 6;

/**
 * Readings no single suspect explains: do two of the leading suspects at once explain every
 * reading taken? Solves the pairs of PAIR_POOL leading suspects (left or ruled out) on the probes
 * read (a bounded check, and said so); a pair whose readings all fall within the meter's
 * tolerance plus the model's 1 % becomes the unexplained readings' explanation.
 */
export function explainPairs(input: Pick<DiagnoseInput, 'doc' | 'scenario' | 'meter'>, result: DiagnoseResult, readings: Readonly<Record<string, number | 'OL' | 'unreachable'>>): DiagnoseResult {
	if (!result.readings?.unexplained.length) return result;
	const { doc, scenario } = input;
	const profile = input.meter ?? ENTRY_DMM;
	const c = buildCircuit(doc, scenario);
	const base = new Base(c);
	// One hypothesis per site, each suspect taken at the size that fits its marks best.
	const bySite = new Map(generateHypotheses(c, { sweep: [1] }).map((h) => [h.site, h]));
	// The leading suspects left, then the likeliest ones the readings ruled out (a reading that
	// two faults make together can rule out either alone), then the rest of those left.
	const left = result.readings.remaining.map((x) => x.suspect);
	const out = result.suspects.map((s) => s.id).filter((id) => !left.includes(id));
	const half = Math.ceil(PAIR_POOL / 2);
	const pool = [...new Set([...left.slice(0, half), ...out, ...left])].slice(0, PAIR_POOL);
	const lead = pool
		.map((id) => result.suspects.find((s) => s.id === id))
		.filter((s): s is SuspectOut => !!s && s.kind !== 'double' && bySite.has(s.site))
		.map((s) => {
			const h = bySite.get(s.site)!;
			return { s, changes: s.typical !== undefined ? atSize(h, s.typical) : h.changes };
		});
	const read = Object.entries(readings).filter((e): e is [string, number] => typeof e[1] === 'number');
	const whole: Region = { parts: new Set(doc.parts.map((p) => p.id)), wires: new Set(doc.wires.map((w) => w.id)), nodes: new Set(doc.parts.flatMap((p) => p.terminals.map((t) => nodeOfTerminal(p, t)))) };
	const specs = candidateProbes(doc, scenario, c, base.solution, whole, {
		profile,
		partOut: [...new Set(read.map(([id]) => id).filter((id) => /^(volts|lamp)-out:/.test(id)).map((id) => id.split(':')[1]))]
	}).filter((sp) => read.some(([id]) => id === sp.id));
	if (specs.length < read.length || lead.length < 2) return result;
	const pairs: { a: SuspectOut; b: SuspectOut; changes: Change[] }[] = [];
	for (let i = 0; i < lead.length; i++) for (let j = i + 1; j < lead.length; j++) pairs.push({ a: lead[i].s, b: lead[j].s, changes: [...lead[i].changes, ...lead[j].changes] });
	const got = probeReadings(doc, scenario, c, base, pairs, specs, profile);
	const fits = pairs.findIndex((_, k) =>
		specs.every((sp, p) => {
			const x = read.find(([id]) => id === sp.id)![1];
			const r = got.readings[p][k];
			return Math.abs(x - r) <= sp.tolerance.abs + sp.tolerance.rel * Math.abs(r) + (sp.tolerance.band ?? 0) + 0.01 * Math.abs(r);
		})
	);
	if (fits < 0) return result;
	const { a, b } = pairs[fits];
	const explanation: Unexplained['explanation'] = { cause: 'two-faults', text: `Two faults at once fit every reading taken: ${a.label}, and ${b.label}. (Only pairs of the ${PAIR_POOL} likeliest suspects were tried.)`, pair: [a.id, b.id] };
	return { ...result, readings: { ...result.readings, unexplained: result.readings.unexplained.map((u) => (u.explanation.cause === 'differs' ? { ...u, explanation } : u)) } };
}

export { FAULT_KINDS };
