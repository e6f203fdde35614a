/**
 * Readings under every hypothesis, incrementally from one factorisation per setup.
 *
 * A setup is the circuit state a probe is taken in (the scenario as given, the battery
 * disconnected for ohms, a part taken out). For each setup the healthy circuit is solved once
 * (`solveCircuit`: relays and stabilizers settled), and its factorisation is kept. A fault is a
 * change of a few conductances (and possibly of the right-hand side); a meter is one more
 * conductance (a voltmeter, a test lamp) or a current injection (an ohmmeter). With the changed
 * conductances δⱼ on the node pairs uⱼ, the faulted voltages follow from the Woodbury identity
 * (Hager 1989, "Updating the inverse of a matrix", SIAM Review 31(2):221–239):
 *
 *   x' = x̂ + Σ αⱼ yⱼ,  yⱼ = G⁻¹uⱼ,  with  αᵢ/δᵢ + uᵢᵀx̂ + Σⱼ (uᵢᵀyⱼ) αⱼ = 0,
 *
 * a system as small as the number of changes (αⱼ = −δⱼ·uⱼᵀx' is the current the change diverts).
 *
 * Regulating stabilizers are not a fixed conductance: their contacts adjust so the output
 * holds the set-point. In the averaged model (solve.ts) that is a linear constraint wₛᵀx = Tₛ
 * with an unknown current injected along their input–output pair, so the regulated circuit is
 * still linear: every column is first made "regulated", ỹ = y − Yₛ P⁻¹ Wₛᵀy with P = WₛᵀYₛ.
 * A stabilizer that stops regulating, starts to, or a relay that changes state under a fault is
 * a different piece of the piecewise-linear model: then this hypothesis (or this hypothesis with
 * this meter) falls back to a full solve, and the fallbacks are counted.
 *
 * Two more fallbacks keep the results exact: opening an element whose other side then hangs on
 * the leakage alone (the Woodbury denominator cancels to rounding, |1/δ + uᵀy| ≪ |1/δ|), and a
 * stabilizer fault that releases a regulating stabilizer. The first is avoided where the far
 * side is a small dead island (no source, relay or stabilizer in it): the rest of the circuit
 * then sees a tiny, well-conditioned change at the element's live end (`islandOf`), and only the
 * meters touching the island are read on the solved fault.
 *
 * The pair loop (every hypothesis × every voltmeter and test lamp) costs a system of k + 1
 * unknowns and one comparison: per hypothesis a kit is made once (`pairKit`: the fault's small
 * block, its inverse and Θ, the least relay or stabilizer margin over its driving-point
 * resistance), per meter the healthy column at its own two nodes once (`Base.meterEnds`), and a
 * pair whose meter current |α| satisfies |α|·√ρₘ < Θ cannot move any relay or stabilizer
 * (Cauchy–Schwarz in the inner product of the faulted G⁻¹). Only the pairs that fail that bound
 * are checked at every relay and stabilizer. A test lamp's settling (solve.ts's path from relays
 * released) is replayed only where the circuit did not settle in solve.ts's first round
 * (`Base.replayNeeded`) and, on a circuit settled in the second round, only where the same bound
 * on the first round's decisions fails (`firstRoundKit`).
 */
import { addCurrentSource, addElement, type Circuit, type Element, type Source, type StabilizerDevice } from './circuit';
import type { Change, Hypothesis } from './faults';
import { probeNode, type ProbePoint } from './meters';
import { factorCircuit, solveCircuit, sourceVector, type Solution } from './solve';
import type { Factorization } from './sparse';

/** What is read: a DMM on volts, a test lamp, a DMM on ohms (current injected), or the current a part draws. */
export type Meter =
	| { kind: 'volts'; a: ProbePoint; b: ProbePoint; inputOhms: number }
	| { kind: 'lamp'; a: ProbePoint; b: ProbePoint; ohms: number; watts: number }
	| { kind: 'ohms'; a: ProbePoint; b: ProbePoint; testCurrent: number }
	| { kind: 'current'; element: number };

/**
 * The reading of a meter: volts (red minus black), lamp brightness (power over rated power),
 * ohms (may be huge for an open circuit), or amperes through the element (from its a to b).
 */
export type Reading = number;

export interface FallbackCount {
	/** Hypotheses whose fault changes a relay or stabilizer state: solved in full. */
	stateFlips: number;
	/** Hypotheses opening an element that leaves a part of the circuit hanging on the leakage (and not as a dead island, see `islandOf`): solved in full. */
	illConditioned: number;
	/** Hypotheses releasing a regulating stabilizer (stuck open or welded). */
	stabilizerReleased: number;
	/** Hypothesis–meter pairs where the meter itself changed a state: solved in full. */
	meterFlips: number;
	/** Hypothesis–meter pairs read by a full solve because even on the solved fault the rounding bound was too large. */
	roundoff: number;
	/** Hypotheses solved incrementally. */
	incremental: number;
	/** Hypotheses opening an element that cuts off a dead island, done incrementally on the rest (`islandOf`); counted in `incremental` too. */
	deadIslands: number;
	/** Hypothesis–meter pairs read on the fault solved in full: incrementally they could carry more rounding than `ROUNDING_LIMIT`, or they touch a dead island. */
	onSolvedFault: number;
	/** Hypothesis–meter pairs whose meter current was too large for the state bound (`PairKit.theta`): every relay and stabilizer checked one by one. */
	checkedOneByOne: number;
}

export const emptyFallbacks = (): FallbackCount => ({ stateFlips: 0, illConditioned: 0, stabilizerReleased: 0, meterFlips: 0, roundoff: 0, incremental: 0, deadIslands: 0, onSolvedFault: 0, checkedOneByOne: 0 });

const at = (v: Float64Array, i: number) => (i < 0 ? 0 : v[i]);

// ---------------------------------------------------------------------------------------------
// Full solves (the reference, and the fallback)

/** A copy of a circuit with a fault's changes applied (elements and sources copied; the rest shared). */
export function faultedCircuit(c: Circuit, changes: readonly Change[]): Circuit {
	const elements: Element[] = c.elements.map((e) => ({ ...e }));
	const sources: Source[] = c.sources.map((s) => ({ ...s }));
	let stabilizers: StabilizerDevice[] = c.stabilizers.map((s) => ({ ...s }));
	const coils = new Set(c.relays.map((r) => r.coil));
	const chassis = c.nodeIndex.get('chassis') ?? -1;
	for (const ch of changes) {
		if (ch.type === 'element') {
			const e = elements[ch.element];
			const g = elementConductance(c.elements[ch.element], ch, coils.has(ch.element));
			e.g = g.g;
			e.gClosed = g.gClosed;
		} else if (ch.type === 'to-chassis') {
			elements.push({ a: ch.node, b: chassis, g: 1 / ch.ohms, gClosed: 1 / ch.ohms, ref: { kind: 'meter', label: 'short to earth' } });
		} else if (ch.type === 'stabilizer') {
			const st = stabilizers.find((s) => s.part === ch.part);
			if (!st) throw new Error(`faultedCircuit: no stabilizer "${ch.part}"`);
			if (ch.mode === 'stuck-open') {
				elements[st.element].g = 0;
				elements[st.element].gClosed = 0;
			} else if (ch.mode === 'stuck-closed') stabilizers = stabilizers.filter((s) => s !== st);
			else st.setPoint *= ch.factor ?? 1;
		} else if (ch.type === 'emf') {
			for (const s of sources) if (s.ref.kind === 'part' && s.ref.part === ch.part && s.emf) s.emf = ch.volts;
		}
	}
	return { ...c, elements, sources, stabilizers };
}

/**
 * An element's conductance under an element change, from its healthy state in the built circuit.
 * A relay coil that opens keeps its closed value (solve.ts treats g = 0 with gClosed > 0 as
 * disconnected, so the relay stays released); other opened elements lose both.
 */
function elementConductance(e: Element, ch: Extract<Change, { type: 'element' }>, isCoil: boolean): { g: number; gClosed: number } {
	if (ch.ohms === null) return isCoil ? { g: 0, gClosed: e.gClosed } : { g: 0, gClosed: 0 };
	const ohms = ch.series ? 1 / e.gClosed + ch.ohms : ch.ohms;
	const g = 1 / ohms;
	// A replaced value closes a contact the scenario leaves open ("stuck closed"); a series one does not.
	return { g: e.g > 0 || !ch.series ? g : 0, gClosed: g };
}

/** Add a meter to a copy of a circuit; returns the circuit and the meter's nodes. */
function withMeter(c: Circuit, meter: Meter): { c: Circuit; a: number; b: number } {
	if (meter.kind === 'current') {
		const e = c.elements[meter.element];
		return { c, a: e.a, b: e.b };
	}
	const copy: Circuit = { ...c, elements: [...c.elements], sources: [...c.sources] };
	const a = probeNode(c, meter.a);
	const b = probeNode(c, meter.b);
	if (meter.kind === 'volts') addElement(copy, a, b, meter.inputOhms, 'voltmeter');
	else if (meter.kind === 'lamp') addElement(copy, a, b, meter.ohms, 'test lamp');
	else addCurrentSource(copy, a, b, meter.testCurrent, 'ohmmeter');
	return { c: copy, a, b };
}

function readingFrom(meter: Meter, va: number, vb: number, g: number): Reading {
	switch (meter.kind) {
		case 'volts':
			return va - vb;
		case 'lamp': {
			const v = va - vb;
			return (v * v) / meter.ohms / meter.watts;
		}
		case 'ohms':
			return (va - vb) / meter.testCurrent;
		case 'current':
			return g * (va - vb);
	}
}

/** The reading of one meter on a circuit with a fault, by a full solve (build, apply, add the meter, settle). */
export function fullReading(c: Circuit, changes: readonly Change[], meter: Meter): Reading {
	const faulted = faultedCircuit(c, changes);
	const m = withMeter(faulted, meter);
	const s = solveCircuit(m.c);
	const g = meter.kind === 'current' ? s.g[meter.element] : 0;
	return readingFrom(meter, s.at(m.a), s.at(m.b), g);
}

// ---------------------------------------------------------------------------------------------
// The incremental engine


interface Column {
	/** Regulated response to a unit injection into a, out of b. */
	y: Float64Array;
	/** The stabilizers' share of it: ỹ = y − Yₛ c. */
	c: Float64Array;
	/** Where a value was formed as a difference, the magnitudes before it (for the rounding bound); else |y|. */
	mag?: Float64Array;
}

type SparseVec = { idx: Int32Array; val: Float64Array };

/** A meter column at its own two nodes only; `dense` when taken from a full solve (badly scaled sums). */
interface MeterEnds {
	ya: number;
	yb: number;
	scale: number;
	dense?: boolean;
}

/** a − b of two sparse vectors with rising positions. */
function sparseDiff(a: SparseVec | null, b: SparseVec | null): SparseVec {
	const ai = a?.idx ?? new Int32Array(0);
	const bi = b?.idx ?? new Int32Array(0);
	const idx: number[] = [];
	const val: number[] = [];
	let p = 0;
	let q = 0;
	while (p < ai.length || q < bi.length) {
		const x = p < ai.length ? ai[p] : Infinity;
		const y = q < bi.length ? bi[q] : Infinity;
		if (x === y) {
			idx.push(x);
			val.push(a!.val[p++] - b!.val[q++]);
		} else if (x < y) {
			idx.push(x);
			val.push(a!.val[p++]);
		} else {
			idx.push(y);
			val.push(-b!.val[q++]);
		}
	}
	return { idx: Int32Array.from(idx), val: Float64Array.from(val) };
}

/**
 * A meter's column known only where the small systems read it: at a fixed set of nodes (the
 * relays' and stabilizers' nodes) and at its own two nodes, from entries of the inverse
 * (`Factorization.unitForward`), not from a full solve. At a fault's nodes it is read per
 * hypothesis from the fault nodes' own columns by symmetry of G⁻¹: eᵢᵀG⁻¹u = uᵀ(G⁻¹eᵢ).
 */
interface SparseColumn {
	a: number;
	b: number;
	/** Largest sum of term magnitudes behind the values (Ω). */
	scale: number;
	/** Values at the fixed nodes (in their order). */
	fixed: Float64Array;
	ya: number;
	yb: number;
	/** The stabilizers' share (as `Column.c`). */
	c: Float64Array;
}

/** Fills a scratch vector with a sparse column where one hypothesis reads it. */
class ColumnScratch {
	readonly y: Float64Array;
	readonly mag: Float64Array;
	private written: number[] = [];
	constructor(
		n: number,
		private readonly fixedNodes: readonly number[],
		private readonly nodeColumn: (i: number) => Float64Array,
		private readonly ys: readonly Float64Array[]
	) {
		// Never-written entries are NaN: a read outside the filled nodes shows at once.
		this.y = new Float64Array(n).fill(NaN);
		this.mag = new Float64Array(n).fill(NaN);
	}

	fill(col: SparseColumn, faultNodes: readonly number[]): Column {
		const { y, mag, ys } = this;
		for (const i of this.written) {
			y[i] = NaN;
			mag[i] = NaN;
		}
		this.written.length = 0;
		const put = (i: number, v: number, m: number) => {
			if (i < 0) return;
			y[i] = v;
			mag[i] = m;
			this.written.push(i);
		};
		for (const f of faultNodes) {
			if (f < 0) continue;
			const r = this.nodeColumn(f);
			const ra = col.a >= 0 ? r[col.a] : 0;
			const rb = col.b >= 0 ? r[col.b] : 0;
			let v = ra - rb;
			let m = Math.abs(ra) + Math.abs(rb);
			for (let q = 0; q < ys.length; q++) {
				const t = ys[q][f] * col.c[q];
				v -= t;
				m += Math.abs(t);
			}
			put(f, v, m);
		}
		this.fixedNodes.forEach((d, q) => put(d, col.fixed[q], Math.abs(col.fixed[q])));
		put(col.a, col.ya, Math.abs(col.ya));
		put(col.b, col.yb, Math.abs(col.yb));
		return { y, c: col.c, mag };
	}
}

/** Raw (unregulated) sparse column of the pair (a, b) on a factorisation, at the given nodes. */
function rawSparse(forward: (i: number) => SparseVec, a: number, b: number, nodes: readonly number[], dense: Float64Array): { fixed: Float64Array; ya: number; yb: number; scale: number } {
	const wa = a >= 0 ? forward(a) : null;
	const wb = b >= 0 ? forward(b) : null;
	// wₐ − w_b scattered into a dense scratch (zero outside the two paths), so each entry is one gather.
	if (wa) for (let q = 0; q < wa.idx.length; q++) dense[wa.idx[q]] += wa.val[q];
	if (wb) for (let q = 0; q < wb.idx.length; q++) dense[wb.idx[q]] -= wb.val[q];
	let scale = 0;
	const dot = (w: SparseVec) => {
		let v = 0;
		let m = 0;
		for (let q = 0; q < w.idx.length; q++) {
			const t = w.val[q] * dense[w.idx[q]];
			v += t;
			m += Math.abs(t);
		}
		if (m > scale) scale = m;
		return v;
	};
	const fixed = new Float64Array(nodes.length);
	for (let q = 0; q < nodes.length; q++) fixed[q] = dot(forward(nodes[q]));
	const ya = wa ? dot(wa) : 0;
	const yb = wb ? dot(wb) : 0;
	if (wa) for (let q = 0; q < wa.idx.length; q++) dense[wa.idx[q]] = 0;
	if (wb) for (let q = 0; q < wb.idx.length; q++) dense[wb.idx[q]] = 0;
	return { fixed, ya, yb, scale };
}

/**
 * Above this size of the terms (Ω) in a sparse column's sums, the column is solved in full
 * instead: a part hanging on the leakage has transfer resistances near 1/gmin, and the sums of
 * the inverse's entries lose the digits a full solve keeps.
 */
const SPARSE_SCALE_LIMIT = 1e4;

function cachedForward(f: Factorization, cache: Map<number, SparseVec>): (i: number) => SparseVec {
	return (i) => {
		let w = cache.get(i);
		if (!w) cache.set(i, (w = f.unitForward(i)));
		return w;
	};
}

/** One solved circuit (healthy, or a fallback's faulted one) to update from. */
export class Base {
	readonly c: Circuit;
	readonly solution: Solution;
	readonly x: Float64Array;
	readonly g: Float64Array;
	/** Regulating stabilizers (indices into c.stabilizers) and their constraint data. */
	readonly regulated: number[];
	private readonly ys: Float64Array[];
	private readonly pInv: Float64Array[];
	private readonly columns = new Map<string, Column>();
	private readonly setPointResponse = new Map<number, Float64Array>();
	/** Nodes whose values the state checks need. */
	readonly deviceNodes: number[];
	readonly chassis: number;
	readonly coils: Set<number>;
	readonly regulatedIndex: Map<number, number>;
	/** Coil voltage of each relay in the base. */
	readonly coilVolts = new Map<string, number>();
	/** Per relay (in c.relays order): pulled in in the base; its coil below pull-in there (held in). */
	readonly energisedAt: boolean[];
	readonly coilBelowPullIn: boolean[];
	private readonly forwards = new Map<number, SparseVec>();
	private readonly nodeCols = new Map<number, Float64Array>();
	private readonly sparseCols = new Map<string, SparseColumn>();
	private readonly deviceIndex = new Map<number, number>();
	private scratchFill?: ColumnScratch;
	/** Faults solved in full on this base (fallbacks), kept while their change lists live. */
	private readonly locals = new WeakMap<readonly Change[], Base>();
	private denseScratch?: Float64Array;
	private readonly ends = new Map<number, MeterEnds>();
	/**
	 * The base settled in solve.ts's first round (nothing moved, no stabilizer regulating): then
	 * its matrix is the first round's, and a fault or meter that keeps every state of that round
	 * keeps solve.ts's settling path too (see `replayNeeded`).
	 */
	readonly settledFirstRound: boolean;

	constructor(c: Circuit, solution: Solution = solveCircuit(c)) {
		this.c = c;
		this.solution = solution;
		this.x = solution.voltages;
		this.g = solution.g;
		this.chassis = c.nodeIndex.get('chassis') ?? -1;
		this.coils = new Set(c.relays.map((r) => r.coil));
		this.regulated = [];
		c.stabilizers.forEach((st, i) => {
			// Regulating and not pinned at the leakage floor (a stabilizer whose output is held up
			// from elsewhere stays at gmin, a fixed conductance like any other).
			const g = solution.g[st.element];
			if (c.elements[st.element].g !== 0 && solution.regulating.get(st.part) && g > c.gmin * (1 + 1e-9)) this.regulated.push(i);
		});
		const n = c.nodeNames.length;
		this.ys = this.regulated.map((i) => {
			const st = c.stabilizers[i];
			const u = new Float64Array(n);
			if (st.input >= 0) u[st.input] += 1;
			if (st.output >= 0) u[st.output] -= 1;
			return solution.factor.solve(u);
		});
		const k = this.regulated.length;
		const p = Array.from({ length: k }, (_, r) => {
			const row = new Float64Array(k);
			for (let s = 0; s < k; s++) row[s] = this.wDot(r, this.ys[s]);
			return row;
		});
		this.pInv = invert(p);
		this.regulatedIndex = new Map(this.regulated.map((i, r) => [i, r]));
		const nodes = new Set<number>();
		for (const r of c.relays) {
			const e = c.elements[r.coil];
			nodes.add(e.a).add(e.b);
			this.coilVolts.set(r.part, Math.abs(at(this.x, e.a) - at(this.x, e.b)));
		}
		for (const st of c.stabilizers) nodes.add(st.input).add(st.output).add(st.earth);
		nodes.delete(-1);
		this.deviceNodes = [...nodes];
		this.deviceNodes.forEach((d, q) => this.deviceIndex.set(d, q));
		this.energisedAt = c.relays.map((r) => solution.energised.has(r.part));
		this.coilBelowPullIn = c.relays.map((r) => this.coilVolts.get(r.part)! < r.pullIn);
		this.settledFirstRound = solution.converged && solution.iterations === 1 && this.regulated.length === 0;
		this.contacts = new Set(c.relays.flatMap((r) => [r.normallyOpen, r.normallyClosed]));
	}

	private readonly contacts: Set<number>;

	/** Do the changes touch a relay contact? */
	touchesContact(changes: readonly Change[]): boolean {
		for (const ch of changes) if (ch.type === 'element' && this.contacts.has(ch.element)) return true;
		return false;
	}
	private incident?: number[][];

	/** Elements at each node (built on first use). */
	incidence(): number[][] {
		if (!this.incident) {
			const inc: number[][] = Array.from({ length: this.c.nodeNames.length }, () => []);
			this.c.elements.forEach((e, j) => {
				if (e.a >= 0) inc[e.a].push(j);
				if (e.b >= 0 && e.b !== e.a) inc[e.b].push(j);
			});
			this.incident = inc;
		}
		return this.incident;
	}

	/** Nodes a source drives. */
	get sourceNodes(): number[] {
		return (this.sourceList ??= this.c.sources.flatMap((s) => [s.a, s.b]).filter((v) => v >= 0));
	}
	private sourceList?: number[];

	/**
	 * Must solve.ts's settling be replayed to trust an incremental state check of these changes
	 * (and a meter)? Not when the base settled in the first round and the changes touch no relay
	 * contact: solve.ts's first round on the faulted circuit is then the base's matrix with the
	 * changes, exactly what `evaluatePrepared` checks; when that check finds every relay and
	 * stabilizer where it was, the first round moves nothing, so solve.ts stops there in the
	 * base's states. (A changed contact may start solve.ts from another relay state: replayed.)
	 */
	replayNeeded(changes: readonly Change[]): boolean {
		if (!this.c.relays.length && !this.c.stabilizers.length) return false;
		if (!this.settledFirstRound) return true;
		for (const ch of changes) if (ch.type === 'element' && this.contacts.has(ch.element)) return true;
		return false;
	}

	/**
	 * (G⁻¹u)ₐ and (G⁻¹u)ᵦ for u = eₐ − eᵦ, from the two nodes' `unitForward` paths only (cached),
	 * with the size of the terms behind them (Ω) for the scaling limit.
	 */
	meterEnds(a: number, b: number): MeterEnds {
		const key = (a + 1) * (this.c.nodeNames.length + 1) + b + 1;
		let me = this.ends.get(key);
		if (!me) {
			const raw = rawSparse(cachedForward(this.solution.factor, this.forwards), a, b, [], (this.denseScratch ??= new Float64Array(this.c.nodeNames.length)));
			me = { ya: raw.ya, yb: raw.yb, scale: raw.scale };
			if (me.scale > SPARSE_SCALE_LIMIT) {
				const y = this.column(a, b).y;
				me = { ya: at(y, a), yb: at(y, b), scale: 0, dense: true };
			}
			this.ends.set(key, me);
		}
		return me;
	}

	/**
	 * The first round of solve.ts on this circuit: relays as built (released), stabilizer contacts
	 * closed. A fault that changes any decision of that round (a relay pulling in, a stabilizer
	 * starting to regulate) may lead the full solve down another path to another settled state
	 * (relays that feed each other's coils can settle either way): such faults are solved in full.
	 */
	private start?: {
		f: ReturnType<typeof factorCircuit>;
		x: Float64Array;
		g: Float64Array;
		cols: Map<number, Float64Array>;
		/** The last fault replayed: its translation, reused for each meter it is replayed with. */
		last?: { changes: readonly Change[]; gClosedOf: Map<number, number>; gNow: Map<number, number>; extra: { a: number; b: number; delta: number }[]; targets: Map<number, number>; skip: Set<number>; shift: Float64Array | null };
		/** The nodes every replay reads: relay coils and contacts, stabilizers. */
		fixed: number[];
		forward: (i: number) => SparseVec;
		sparse: Map<string, SparseColumn>;
		scratch: ColumnScratch;
		dense: Float64Array;
	};

	private startState() {
		if (!this.start) {
			const c = this.c;
			const g = Float64Array.from(c.elements, (e) => e.g);
			const f = factorCircuit(c, g);
			const x = f.solve(sourceVector(c, g));
			const nodes = new Set<number>();
			for (const r of c.relays) for (const k of [r.coil, r.normallyOpen, r.normallyClosed]) nodes.add(c.elements[k].a).add(c.elements[k].b);
			for (const s of c.stabilizers) nodes.add(s.input).add(s.output).add(s.earth).add(c.elements[s.element].a).add(c.elements[s.element].b);
			nodes.delete(-1);
			const fixed = [...nodes];
			const n = c.nodeNames.length;
			const nodeCols = new Map<number, Float64Array>();
			const nodeColumn = (i: number) => {
				let y = nodeCols.get(i);
				if (!y) {
					const u = new Float64Array(n);
					u[i] = 1;
					nodeCols.set(i, (y = f.solve(u)));
				}
				return y;
			};
			this.start = { f, x, g, cols: new Map(), fixed, forward: cachedForward(f, new Map()), sparse: new Map(), scratch: new ColumnScratch(n, fixed, nodeColumn, []), dense: new Float64Array(n) };
		}
		return this.start;
	}

	private startBaseCache?: Base;

	/** solve.ts's first round (relays as built, stabilizers closed) as a base of its own, for the first-round bound. */
	startBase(): Base {
		if (!this.startBaseCache) {
			const st = this.startState();
			const c = this.c;
			const energised = new Set(c.relays.filter((r) => st.g[r.normallyOpen] > 0).map((r) => r.part));
			const x = st.x;
			const solution: Solution = { circuit: c, voltages: x, g: st.g, currents: new Float64Array(0), power: new Map(), energised, regulating: new Map(), converged: true, iterations: 1, warnings: [], factor: st.f, at: (i) => (i < 0 ? 0 : x[i]) };
			this.startBaseCache = new Base(c, solution);
		}
		return this.startBaseCache;
	}

	/**
	 * The base settled in solve.ts's second round with no stabilizer regulating: its first round
	 * moved relays (and closed stabilizers) once, the second moved nothing.
	 */
	get settledSecondRound(): boolean {
		return this.solution.converged && this.solution.iterations === 2 && this.regulated.length === 0;
	}

	/** A meter's column on the first round's matrix, where a replay reads it, for one fault's nodes. */
	private startMeterColumn(a: number, b: number, faultNodes: readonly number[]): Float64Array | null {
		const st = this.startState();
		const key = `${a},${b}`;
		let sc = st.sparse.get(key);
		if (!sc) {
			const raw = rawSparse(st.forward, a, b, st.fixed, st.dense);
			sc = { a, b, ...raw, c: new Float64Array(0) };
			st.sparse.set(key, sc);
		}
		// Badly scaled: the caller solves the full column instead.
		if (sc.scale > SPARSE_SCALE_LIMIT) return null;
		return st.scratch.fill(sc, faultNodes).y;
	}

	/** A fault's changes relative to the first round's circuit (as faultedCircuit builds them). */
	private replayFault(changes: readonly Change[]) {
		const st = this.start!;
		const c = this.c;
		const n = c.nodeNames.length;
		const coils = this.coils;
		const gClosedOf = new Map<number, number>();
		const gNow = new Map<number, number>();
		const extra: { a: number; b: number; delta: number }[] = [];
		const targets = new Map<number, number>();
		const skip = new Set<number>();
		const rhs = new Float64Array(n);
		let rhsUsed = false;
		for (const ch of changes) {
			if (ch.type === 'element') {
				const e = c.elements[ch.element];
				const g = elementConductance(e, ch, coils.has(ch.element));
				gNow.set(ch.element, g.g);
				gClosedOf.set(ch.element, g.gClosed);
				for (const s of c.sources) {
					if (s.element === ch.element && s.emf) {
						const j = s.emf * (g.g - st.g[ch.element]);
						if (s.a >= 0) rhs[s.a] += j;
						if (s.b >= 0) rhs[s.b] -= j;
						rhsUsed = true;
					}
				}
			} else if (ch.type === 'to-chassis') extra.push({ a: ch.node, b: this.chassis, delta: 1 / ch.ohms });
			else if (ch.type === 'stabilizer') {
				const i = c.stabilizers.findIndex((x) => x.part === ch.part);
				const s = c.stabilizers[i];
				if (ch.mode === 'set-point') targets.set(i, s.setPoint * (ch.factor ?? 1));
				else {
					skip.add(i);
					if (ch.mode === 'stuck-open') {
						gNow.set(s.element, 0);
						gClosedOf.set(s.element, 0);
					}
				}
			} else if (ch.type === 'emf') {
				for (const s of c.sources) {
					if (s.ref.kind === 'part' && s.ref.part === ch.part && s.emf && s.element !== undefined) {
						const j = (ch.volts - s.emf) * st.g[s.element];
						if (s.a >= 0) rhs[s.a] += j;
						if (s.b >= 0) rhs[s.b] -= j;
						rhsUsed = true;
					}
				}
			}
		}
		const shift = rhsUsed ? st.f.solve(rhs) : null;
		return { changes, gClosedOf, gNow, extra, targets, skip, shift };
	}

	/**
	 * Replays solve.ts's settling rounds on the faulted circuit, incrementally from the first
	 * round's factorisation (relays released, stabilizer contacts closed), and says whether it
	 * settles in the same states as this base: the same relays pulled in, each stabilizer
	 * regulating, closed or held at the floor as here. Each round is one small Woodbury system
	 * over the fault, the relay contacts that moved and the stabilizers whose contacts moved.
	 */
	sameSettledState(changes: readonly Change[], meter?: { a: number; b: number; delta: number }): boolean {
		if (!this.c.relays.length && !this.c.stabilizers.length) return true;
		const st = this.startState();
		const c = this.c;
		const n = c.nodeNames.length;
		const coils = this.coils;
		const column = (a: number, b: number) => {
			const key = (a + 1) * (n + 1) + b + 1;
			let y = st.cols.get(key);
			if (!y) {
				const u = new Float64Array(n);
				if (a >= 0) u[a] += 1;
				if (b >= 0) u[b] -= 1;
				y = st.f.solve(u);
				st.cols.set(key, y);
			}
			return y;
		};
		if (st.last?.changes !== changes) st.last = this.replayFault(changes);
		const { gClosedOf, targets, skip, shift } = st.last;
		const gNow = new Map(st.last.gNow);
		const extra = [...st.last.extra];
		let meterY: Float64Array | null = null;
		if (meter) {
			extra.push(meter);
			const faultNodes: number[] = [];
			for (const k of gNow.keys()) faultNodes.push(c.elements[k].a, c.elements[k].b);
			for (const e of extra) if (e !== meter) faultNodes.push(e.a, e.b);
			meterY = this.startMeterColumn(meter.a, meter.b, faultNodes);
		}
		const builtOf = (k: number) => c.elements[k];
		const g = (k: number) => gNow.get(k) ?? st.g[k];
		const hat = (i: number) => (i < 0 ? 0 : st.x[i] + (shift ? shift[i] : 0));
		const energised = new Set<string>();
		for (const r of c.relays) if (g(r.normallyOpen) > 0) energised.add(r.part);
		const regulating = new Map<number, boolean>();
		for (let round = 0; round < 40; round++) {
			const cols: { a: number; b: number; delta: number; y: Float64Array }[] = [];
			for (const [k, gk] of gNow) {
				const d = gk - st.g[k];
				if (d !== 0) cols.push({ a: builtOf(k).a, b: builtOf(k).b, delta: d, y: column(builtOf(k).a, builtOf(k).b) });
			}
			for (const e of extra) cols.push({ ...e, y: e === meter && meterY ? meterY : column(e.a, e.b) });
			const m = cols.length;
			const mat = cols.map((ci) => Float64Array.from(cols, (cj) => at(cj.y, ci.a) - at(cj.y, ci.b)));
			cols.forEach((ci, i) => (mat[i][i] += 1 / ci.delta));
			const solveFor = (vhat: (i: number) => number) => {
				if (!m) return vhat;
				const r = Float64Array.from(cols, (ci) => -(vhat(ci.a) - vhat(ci.b)));
				const al = solveSmall(mat.map((row) => Float64Array.from(row)), r);
				if (!al) return null;
				return (i: number) => {
					if (i < 0) return 0;
					let x = vhat(i);
					for (let j = 0; j < m; j++) x += al[j] * cols[j].y[i];
					return x;
				};
			};
			const v = solveFor(hat);
			if (!v) return false;
			let unsettled = false;
			for (const r of c.relays) {
				const coil = builtOf(r.coil);
				if ((gClosedOf.get(r.coil) ?? coil.gClosed) > 0 && g(r.coil) === 0) continue;
				const volts = Math.abs(v(coil.a) - v(coil.b));
				const on = energised.has(r.part);
				const next = on ? volts >= r.dropOut : volts >= r.pullIn;
				if (next !== on) {
					unsettled = true;
					if (next) energised.add(r.part);
					else energised.delete(r.part);
					gNow.set(r.normallyOpen, next ? (gClosedOf.get(r.normallyOpen) ?? builtOf(r.normallyOpen).gClosed) : 0);
					gNow.set(r.normallyClosed, next ? 0 : (gClosedOf.get(r.normallyClosed) ?? builtOf(r.normallyClosed).gClosed));
				}
			}
			for (let i = 0; i < c.stabilizers.length; i++) {
				const s = c.stabilizers[i];
				if (skip.has(i) || g(s.element) === 0 && (gClosedOf.get(s.element) === 0 || builtOf(s.element).g === 0)) continue;
				const heater = c.polarity * (v(s.input) - v(s.earth));
				const target = targets.get(i) ?? s.setPoint;
				const now = g(s.element);
				let next = s.gMax;
				if (heater > target) {
					const ys = column(s.input, s.output);
					const z = solveFor((q) => (q < 0 ? 0 : ys[q]));
					if (!z) return false;
					const a = v(s.input) - v(s.output);
					const b = z(s.input) - z(s.output);
					const cOut = v(s.output) - v(s.earth);
					const d = z(s.output) - z(s.earth);
					const tgt = c.polarity * target;
					const denom = d * a - (cOut - tgt) * b;
					const delta = denom !== 0 ? (cOut - tgt) / denom : 0;
					next = Math.min(s.gMax, Math.max(c.gmin, now + delta));
				}
				regulating.set(i, next < s.gMax);
				if (Math.abs(next - now) > 1e-10 * Math.max(now, next)) {
					unsettled = true;
					gNow.set(s.element, next);
				}
			}
			if (!unsettled) break;
		}
		if (energised.size !== this.solution.energised.size) return false;
		for (const r of energised) if (!this.solution.energised.has(r)) return false;
		const kind = (gv: number, gMax: number) => (gv >= gMax ? 'closed' : gv <= c.gmin * (1 + 1e-9) ? 'floor' : 'regulating');
		for (let i = 0; i < c.stabilizers.length; i++) {
			if (skip.has(i)) continue;
			const s = c.stabilizers[i];
			if (kind(g(s.element), s.gMax) !== kind(this.g[s.element], s.gMax)) return false;
		}
		return true;
	}

	/** wₛᵀv for the r-th regulated stabilizer: its output above its own earth, in the feed's sense. */
	private wDot(r: number, v: Float64Array): number {
		const st = this.c.stabilizers[this.regulated[r]];
		return this.c.polarity * (at(v, st.output) - at(v, st.earth));
	}

	/** Regulated response to injecting a vector (already solved: y = G⁻¹b). */
	private regulate(y: Float64Array): Column {
		const k = this.regulated.length;
		const c = new Float64Array(k);
		if (k === 0) return { y, c };
		const wy = new Float64Array(k);
		for (let r = 0; r < k; r++) wy[r] = this.wDot(r, y);
		for (let r = 0; r < k; r++) {
			let s = 0;
			for (let q = 0; q < k; q++) s += this.pInv[r][q] * wy[q];
			c[r] = s;
		}
		const out = Float64Array.from(y);
		for (let r = 0; r < k; r++) {
			const cr = c[r];
			if (cr === 0) continue;
			const ys = this.ys[r];
			for (let i = 0; i < out.length; i++) out[i] -= ys[i] * cr;
		}
		return { y: out, c };
	}

	/** The regulated column of a node pair (cached). */
	column(a: number, b: number): Column {
		const key = `${a},${b}`;
		let col = this.columns.get(key);
		if (!col) {
			const u = new Float64Array(this.c.nodeNames.length);
			if (a >= 0) u[a] += 1;
			if (b >= 0) u[b] -= 1;
			col = this.regulate(this.solution.factor.solve(u));
			this.columns.set(key, col);
		}
		return col;
	}

	/** The faulted circuit solved in full, as a base of its own (kept per change list, so a fault solved for its fuses is not solved again for its readings). */
	localFor(changes: readonly Change[]): Base {
		let b = this.locals.get(changes);
		if (!b) {
			b = new Base(faultedCircuit(this.c, changes));
			this.locals.set(changes, b);
		}
		return b;
	}

	/** Raw response to a unit injection at node i (cached). */
	nodeColumn(i: number): Float64Array {
		let y = this.nodeCols.get(i);
		if (!y) {
			const u = new Float64Array(this.c.nodeNames.length);
			u[i] = 1;
			y = this.solution.factor.solve(u);
			this.nodeCols.set(i, y);
		}
		return y;
	}

	/** A meter's regulated column where the small systems read it (cached per node pair). */
	sparseColumn(a: number, b: number): SparseColumn {
		const key = `${a},${b}`;
		let sc = this.sparseCols.get(key);
		if (!sc) {
			const raw = rawSparse(cachedForward(this.solution.factor, this.forwards), a, b, this.deviceNodes, (this.denseScratch ??= new Float64Array(this.c.nodeNames.length)));
			const k = this.regulated.length;
			const c = new Float64Array(k);
			if (k) {
				const rawAt = (i: number) => (i < 0 ? 0 : i === a ? raw.ya : i === b ? raw.yb : raw.fixed[this.deviceIndex.get(i)!]);
				const wy = new Float64Array(k);
				for (let r = 0; r < k; r++) {
					const st = this.c.stabilizers[this.regulated[r]];
					wy[r] = this.c.polarity * (rawAt(st.output) - rawAt(st.earth));
				}
				for (let r = 0; r < k; r++) {
					let t = 0;
					for (let q = 0; q < k; q++) t += this.pInv[r][q] * wy[q];
					c[r] = t;
				}
			}
			const reg = (i: number, v: number) => {
				if (i < 0) return 0;
				for (let r = 0; r < k; r++) v -= this.ys[r][i] * c[r];
				return v;
			};
			const fixed = Float64Array.from(this.deviceNodes, (d, q) => reg(d, raw.fixed[q]));
			sc = { a, b, scale: raw.scale, fixed, ya: reg(a, raw.ya), yb: reg(b, raw.yb), c };
			this.sparseCols.set(key, sc);
		}
		return sc;
	}

	/** The scratch a sparse meter column is filled into for one hypothesis (one at a time). */
	scratch(): ColumnScratch {
		return (this.scratchFill ??= new ColumnScratch(this.c.nodeNames.length, this.deviceNodes, (i) => this.nodeColumn(i), this.ys));
	}

	/** Regulated response to a right-hand-side change. */
	responseTo(rhs: Float64Array): Column {
		return this.regulate(this.solution.factor.solve(rhs));
	}

	/** Response of the regulated circuit to raising the r-th regulated stabilizer's set-point by 1 V: Yₛ P⁻¹ eᵣ. */
	setPointColumn(r: number): Float64Array {
		let v = this.setPointResponse.get(r);
		if (!v) {
			const n = this.c.nodeNames.length;
			v = new Float64Array(n);
			for (let q = 0; q < this.regulated.length; q++) {
				const f = this.pInv[q][r];
				if (f === 0) continue;
				const ys = this.ys[q];
				for (let i = 0; i < n; i++) v[i] += ys[i] * f;
			}
			this.setPointResponse.set(r, v);
		}
		return v;
	}

	pInvEntry(q: number, r: number): number {
		return this.pInv[q][r];
	}
}

/** Gauss–Jordan inverse with partial pivoting of a small dense matrix. */
function invert(m: Float64Array[]): Float64Array[] {
	const n = m.length;
	const a = m.map((row) => Float64Array.from(row));
	const inv = Array.from({ length: n }, (_, i) => {
		const r = new Float64Array(n);
		r[i] = 1;
		return r;
	});
	for (let col = 0; col < n; col++) {
		let piv = col;
		for (let r = col + 1; r < n; r++) if (Math.abs(a[r][col]) > Math.abs(a[piv][col])) piv = r;
		if (a[piv][col] === 0) throw new Error('predict: the stabilizers of this circuit fix the same voltage twice');
		[a[col], a[piv]] = [a[piv], a[col]];
		[inv[col], inv[piv]] = [inv[piv], inv[col]];
		const d = a[col][col];
		for (let q = 0; q < n; q++) {
			a[col][q] /= d;
			inv[col][q] /= d;
		}
		for (let r = 0; r < n; r++) {
			if (r === col) continue;
			const f = a[r][col];
			if (f === 0) continue;
			for (let q = 0; q < n; q++) {
				a[r][q] -= f * a[col][q];
				inv[r][q] -= f * inv[col][q];
			}
		}
	}
	return inv;
}

/** Solve a small dense system in place (partial pivoting); null when singular. */
function solveSmall(m: Float64Array[], rhs: Float64Array): Float64Array | null {
	const n = rhs.length;
	for (let col = 0; col < n; col++) {
		let piv = col;
		for (let r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[piv][col])) piv = r;
		if (!(Math.abs(m[piv][col]) > 0)) return null;
		if (piv !== col) {
			[m[col], m[piv]] = [m[piv], m[col]];
			const t = rhs[col];
			rhs[col] = rhs[piv];
			rhs[piv] = t;
		}
		for (let r = col + 1; r < n; r++) {
			const f = m[r][col] / m[col][col];
			if (f === 0) continue;
			for (let q = col; q < n; q++) m[r][q] -= f * m[col][q];
			rhs[r] -= f * rhs[col];
		}
	}
	const out = new Float64Array(n);
	for (let r = n - 1; r >= 0; r--) {
		let s = rhs[r];
		for (let q = r + 1; q < n; q++) s -= m[r][q] * out[q];
		out[r] = s / m[r][r];
	}
	return out;
}

/** A fault translated for one base: conductance changes on node pairs, a right-hand-side change, set-point changes. */
interface Prepared {
	/** The nodes of the changed elements (where a meter's sparse column must be read). */
	faultNodes: number[];
	cols: { a: number; b: number; delta: number; element: number; col: Column }[];
	/** x̂ = x + response to the right-hand-side and set-point changes. */
	shift: Float64Array | null;
	/** Stabilizer injection shares of the shift (per regulated stabilizer). */
	shiftC: Float64Array | null;
	/** New set-point per regulated stabilizer index r (only changed ones). */
	targets: Map<number, number>;
	/** Stabilizers (indices into c.stabilizers) taken out of the model by the fault. */
	stuck: Set<number>;
	/** New element conductances (index → g). */
	gNew: Map<number, number>;
	/** Set-points of non-regulating stabilizers changed by the fault. */
	idleTargets: Map<number, number>;
	/** The dead island an opening cuts off, when that is how it is done (`islandOf`): meters touching it are read on the solved fault. */
	island?: Island;
	/** Why this cannot be done incrementally, if so. */
	fallback?: 'illConditioned' | 'stabilizerReleased';
}

/** See `islandOf`. */
interface Island {
	/** The opened element's live end (−1: the reference). */
	r: number;
	nodes: Set<number>;
	/** The conductance change at r that stands for the cut. */
	sigma: number;
}

/** The state of one hypothesis (with or without a meter) on a base, or why it needs a full solve. */
export interface Evaluated {
	ok: boolean;
	reason?: 'stateFlip' | 'illConditioned' | 'stabilizerReleased';
	/** Voltage at a node (valid when ok). */
	at(node: number): number;
	/** Conductance of an element after the fault. */
	gOf(element: number): number;
	/** Bound on the rounding error of `at(a) − at(b)` (V), when solved incrementally. */
	errorOf?(a: number, b: number): number;
}

const CANCELLATION = 1e-7;

function prepare(base: Base, changes: readonly Change[]): Prepared {
	const c = base.c;
	const prepared: Prepared = { faultNodes: [], cols: [], shift: null, shiftC: null, targets: new Map(), stuck: new Set(), gNew: new Map(), idleTargets: new Map() };
	const rhs = new Float64Array(c.nodeNames.length);
	let rhsUsed = false;
	const setPointShift = new Map<number, number>();
	const addCol = (a: number, b: number, delta: number, element: number) => {
		if (delta === 0) return;
		prepared.cols.push({ a, b, delta, element, col: base.column(a, b) });
		prepared.faultNodes.push(a, b);
	};
	for (const ch of changes) {
		if (ch.type === 'element') {
			const e = c.elements[ch.element];
			const healthy = c.elements[ch.element];
			let g = elementConductance(healthy, ch, base.coils.has(ch.element)).g;
			// Relay contacts follow the settled state of the base, not the built one.
			const relay = c.relays.find((r) => r.normallyOpen === ch.element || r.normallyClosed === ch.element);
			if (relay) {
				const closedNow = base.g[ch.element] > 0;
				const gc = elementConductance({ ...healthy, g: 1 }, ch, false).gClosed;
				g = closedNow ? gc : 0;
			}
			const delta = g - base.g[ch.element];
			prepared.gNew.set(ch.element, g);
			addCol(e.a, e.b, delta, ch.element);
			for (const s of c.sources) {
				if (s.element === ch.element && s.emf) {
					const j = s.emf * delta;
					if (s.a >= 0) rhs[s.a] += j;
					if (s.b >= 0) rhs[s.b] -= j;
					rhsUsed = true;
				}
			}
		} else if (ch.type === 'to-chassis') {
			addCol(ch.node, base.chassis, 1 / ch.ohms, -1);
		} else if (ch.type === 'stabilizer') {
			const i = c.stabilizers.findIndex((s) => s.part === ch.part);
			if (i < 0) throw new Error(`predict: no stabilizer "${ch.part}"`);
			const st = c.stabilizers[i];
			const r = base.regulated.indexOf(i);
			if (ch.mode === 'set-point') {
				const target = st.setPoint * (ch.factor ?? 1);
				if (r >= 0) setPointShift.set(r, target - st.setPoint);
				else prepared.idleTargets.set(i, target);
				if (r >= 0) prepared.targets.set(r, target);
				continue;
			}
			if (r >= 0) {
				prepared.fallback = 'stabilizerReleased';
				return prepared;
			}
			prepared.stuck.add(i);
			if (c.elements[st.element].g === 0) continue; // unplugged in this setup
			const g = ch.mode === 'stuck-open' ? 0 : st.gMax;
			prepared.gNew.set(st.element, g);
			addCol(st.input, st.output, g - base.g[st.element], st.element);
		} else if (ch.type === 'emf') {
			for (const s of c.sources) {
				if (s.ref.kind === 'part' && s.ref.part === ch.part && s.emf && s.element !== undefined) {
					const j = (ch.volts - s.emf) * base.g[s.element];
					if (s.a >= 0) rhs[s.a] += j;
					if (s.b >= 0) rhs[s.b] -= j;
					rhsUsed = true;
				}
			}
		}
	}
	if (rhsUsed || setPointShift.size) {
		const n = c.nodeNames.length;
		const shift = new Float64Array(n);
		const shiftC = new Float64Array(base.regulated.length);
		if (rhsUsed) {
			const r = base.responseTo(rhs);
			shift.set(r.y);
			shiftC.set(r.c);
		}
		for (const [r, dT] of setPointShift) {
			const v = base.setPointColumn(r);
			for (let i = 0; i < n; i++) shift[i] += v[i] * dT;
			// The injection that raises set-point r by dT: −P⁻¹ eᵣ dT in the sign of `Column.c`.
			for (let q = 0; q < shiftC.length; q++) shiftC[q] -= base.pInvEntry(q, r) * dT;
		}
		prepared.shift = shift;
		prepared.shiftC = shiftC;
	}
	const cancels = (col: Prepared['cols'][number]) => {
		if (col.delta >= 0) return false;
		const self = at(col.col.y, col.a) - at(col.col.y, col.b);
		const d = 1 / col.delta;
		return Math.abs(d + self) < CANCELLATION * Math.abs(d);
	};
	for (const col of prepared.cols) {
		if (!cancels(col)) continue;
		// One opened element cutting off a dead island: the rest of the circuit sees a small,
		// well-conditioned change at the element's live end instead (see `islandOf`).
		const island = prepared.cols.length === 1 && !prepared.shift && col.element >= 0 && !base.replayNeeded(changes) ? islandOf(base, col.element) : null;
		if (island) {
			prepared.island = island;
			prepared.cols = [];
			prepared.faultNodes = [];
			if (island.r >= 0) {
				const cut = { a: island.r, b: -1, delta: island.sigma, element: -1, col: base.column(island.r, -1) };
				if (!cancels(cut)) {
					prepared.cols.push(cut);
					prepared.faultNodes.push(island.r, -1);
					return prepared;
				}
			} else return prepared;
		}
		prepared.island = undefined;
		prepared.fallback = 'illConditioned';
		return prepared;
	}
	return prepared;
}

/** Largest island handled without a full solve (nodes), and the smallest conductance inside it (S). */
const ISLAND_NODES = 64;
const ISLAND_G = 1e-4;

/**
 * A dead island cut off by opening element k: the nodes on one side of k that, without k, reach
 * neither the reference nor the rest of the circuit through any conductance (only the leakage
 * gmin of each node), hold no source, no relay and no stabilizer. Then the faulted matrix is
 * block diagonal: the island reads 0 V (no source in it), and the rest R sees
 * A − gₖeᵣeᵣᵀ. With the healthy G = [[A, B], [Bᵀ, C]], (G⁻¹)_RR = (A − BC⁻¹Bᵀ)⁻¹ (Schur
 * complement) and BC⁻¹Bᵀ = gₖ²φ eᵣeᵣᵀ, φ = (C⁻¹)_ff = 1/(gₖ + y), y the island's admittance from
 * its node f to the reference; so the rest's matrix is (G⁻¹)_RR⁻¹ + σeᵣeᵣᵀ with
 * σ = −gₖy/(gₖ + y): a rank-one change at r of the healthy inverse's entries, with no
 * cancelling denominator. y = 1/ψ with ψ = fᵀ(L + gmin I)⁻¹f, L the island's Laplacian; split f
 * into its mean and a zero-mean part: ψ = 1/(n·gmin) + t, t = (L⁺(eᶠ − 1/n))ᶠ, found by grounding
 * f in L (a small dense solve). Dropping gmin in t changes it by a factor within gmin/λ₂ of 1,
 * λ₂ ≥ 4·ISLAND_G/n² (Mohar 1991, "Eigenvalues, diameter and mean distance in graphs"), and t
 * itself is at most n/ISLAND_G against 1/(n·gmin): far below rounding of ψ.
 */
function islandOf(base: Base, k: number): Island | null {
	const c = base.c;
	const e = c.elements[k];
	const gk = base.g[k];
	if (!(gk > 0)) return null;
	const incident = base.incidence();
	const walk = (from: number): number[] | null => {
		if (from < 0) return null;
		const seen = new Set<number>([from]);
		const stack = [from];
		while (stack.length) {
			const v = stack.pop()!;
			for (const j of incident[v]) {
				if (j === k || !(base.g[j] > 0)) continue;
				if (base.g[j] < ISLAND_G) return null;
				const el = c.elements[j];
				const w = el.a === v ? el.b : el.a;
				if (w < 0) return null;
				if (!seen.has(w)) {
					if (seen.size >= ISLAND_NODES) return null;
					seen.add(w);
					stack.push(w);
				}
			}
		}
		return [...seen];
	};
	let nodes = walk(e.b);
	let f = e.b;
	let r = e.a;
	if (!nodes) {
		nodes = walk(e.a);
		f = e.a;
		r = e.b;
	}
	if (!nodes) return null;
	const set = new Set(nodes);
	if (r >= 0 && set.has(r)) return null;
	if (base.deviceNodes.some((d) => set.has(d)) || base.sourceNodes.some((d) => set.has(d))) return null;
	for (const rl of c.relays) for (const q of [rl.normallyOpen, rl.normallyClosed]) if (set.has(c.elements[q].a) || set.has(c.elements[q].b)) return null;
	// Grounded Laplacian of the island at f: solve L w = −1/n on the other nodes.
	const n = nodes.length;
	const others = nodes.filter((v) => v !== f);
	const idx = new Map(others.map((v, i) => [v, i]));
	const m = others.length;
	const L = new Float64Array(m * m);
	for (const v of nodes) {
		for (const j of incident[v]) {
			if (j === k || !(base.g[j] > 0)) continue;
			const el = c.elements[j];
			if (el.a !== v) continue; // each element once, from its a end
			const g = base.g[j];
			const p = idx.get(el.a);
			const q = idx.get(el.b);
			if (p !== undefined) L[p * m + p] += g;
			if (q !== undefined) L[q * m + q] += g;
			if (p !== undefined && q !== undefined) {
				L[p * m + q] -= g;
				L[q * m + p] -= g;
			}
		}
	}
	const w = new Float64Array(m).fill(-1 / n);
	if (m && !choleskySolve(L, w, m)) return null;
	let sum = 0;
	for (let i = 0; i < m; i++) sum += w[i];
	const t = -sum / n;
	const psi = 1 / (n * c.gmin) + t;
	const y = 1 / psi;
	return { r, nodes: set, sigma: (-gk * y) / (gk + y) };
}

/** Solve S x = b in place for a small dense SPD matrix (Cholesky); false when not positive definite. */
function choleskySolve(S: Float64Array, b: Float64Array, m: number): boolean {
	for (let j = 0; j < m; j++) {
		let d = S[j * m + j];
		for (let q = 0; q < j; q++) d -= S[j * m + q] * S[j * m + q];
		if (!(d > 0)) return false;
		d = Math.sqrt(d);
		S[j * m + j] = d;
		for (let i = j + 1; i < m; i++) {
			let v = S[i * m + j];
			for (let q = 0; q < j; q++) v -= S[i * m + q] * S[j * m + q];
			S[i * m + j] = v / d;
		}
	}
	for (let i = 0; i < m; i++) {
		let v = b[i];
		for (let q = 0; q < i; q++) v -= S[i * m + q] * b[q];
		b[i] = v / S[i * m + i];
	}
	for (let i = m - 1; i >= 0; i--) {
		let v = b[i];
		for (let q = i + 1; q < m; q++) v -= S[q * m + i] * b[q];
		b[i] = v / S[i * m + i];
	}
	return true;
}

/** Unit roundoff of doubles, with a safety factor for the sums in the small system (Higham 2002, §3.1). */
const EPS = 8 * 2 ** -53;

/**
 * How far an incremental reading may be from the exact one, by a first-order bound
 * on the rounding: the small system's entries are differences of column values, and when those
 * values are huge (a part of the circuit hanging on the leakage has transfer resistances near
 * 1/gmin) the differences lose digits that no later step recovers. Perturbation bound for
 * S α = r with |δS| ≤ ε|S|ₐ, |δr| ≤ ε|r|ₐ (|·|ₐ: the magnitudes before cancellation):
 * |δα| ≤ |S⁻¹|(ε|r|ₐ + ε|S|ₐ|α|) (Higham 2002, "Accuracy and Stability of Numerical
 * Algorithms", Thm 7.2), and then for a reading across nodes a, b
 * |δ(x'ₐ − x'ᵦ)| ≤ ε(|x̂ₐ| + |x̂ᵦ| + Σ|αⱼ|(|yⱼₐ| + |yⱼᵦ|)) + Σ|δαⱼ||yⱼₐ − yⱼᵦ|.
 * A reading whose bound exceeds these limits (in its own unit: V, brightness, Ω, A; plus a
 * relative part) is taken from a full solve instead.
 */
export const ROUNDING_LIMIT = { volts: 1e-11, lamp: 1e-11, ohms: 1e-11, current: 1e-13, rel: 1e-10 } as const;

/**
 * Solve the small system for a prepared fault plus an optional meter column / injection, then
 * check every relay and stabilizer still sits in the state of the base.
 */
function evaluatePrepared(base: Base, p: Prepared, meter?: { a: number; b: number; delta: number; inject: number; col: Column }, checks = true): Evaluated {
	const c = base.c;
	const nf = p.cols.length;
	const withMeter = !!meter && meter.delta !== 0;
	const m = nf + (withMeter ? 1 : 0);
	const ca = new Int32Array(m);
	const cb = new Int32Array(m);
	const cd = new Float64Array(m);
	const cy: Float64Array[] = new Array(m);
	const cc: Float64Array[] = new Array(m);
	const cm: (Float64Array | undefined)[] = new Array(m);
	for (let j = 0; j < nf; j++) {
		const col = p.cols[j];
		ca[j] = col.a;
		cb[j] = col.b;
		cd[j] = col.delta;
		cy[j] = col.col.y;
		cc[j] = col.col.c;
		cm[j] = col.col.mag;
	}
	if (withMeter) {
		ca[nf] = meter!.a;
		cb[nf] = meter!.b;
		cd[nf] = meter!.delta;
		cy[nf] = meter!.col.y;
		cc[nf] = meter!.col.c;
		cm[nf] = meter!.col.mag;
	}
	const magAt = (j: number, i: number) => (i < 0 ? 0 : cm[j] ? cm[j]![i] : Math.abs(cy[j][i]));
	const x = base.x;
	const shift = p.shift;
	const inject = meter?.inject ?? 0;
	const injectY = inject !== 0 ? meter!.col.y : null;
	const hat = (i: number) => (i < 0 ? 0 : x[i] + (shift ? shift[i] : 0) + (injectY ? inject * injectY[i] : 0));
	const alpha = new Float64Array(m);
	const eAlpha = new Float64Array(m);
	let inv: Float64Array[] | null = null;
	if (m) {
		const mat: Float64Array[] = new Array(m);
		const rhs = new Float64Array(m);
		for (let i = 0; i < m; i++) {
			const row = new Float64Array(m);
			const a = ca[i];
			const b = cb[i];
			for (let j = 0; j < m; j++) row[j] = at(cy[j], a) - at(cy[j], b);
			row[i] += 1 / cd[i];
			mat[i] = row;
			rhs[i] = -(hat(a) - hat(b));
		}
		inv = invertOrNull(mat);
		if (!inv) return failed('illConditioned');
		for (let i = 0; i < m; i++) {
			let s = 0;
			for (let k = 0; k < m; k++) s += inv[i][k] * rhs[k];
			alpha[i] = s;
		}
		// One step of refinement against the assembled system (cheap at this size).
		const res = new Float64Array(m);
		for (let i = 0; i < m; i++) {
			let s = rhs[i];
			for (let j = 0; j < m; j++) s -= mat[i][j] * alpha[j];
			res[i] = s;
		}
		for (let i = 0; i < m; i++) {
			let s = 0;
			for (let k = 0; k < m; k++) s += inv[i][k] * res[k];
			alpha[i] += s;
		}
		// Rounding bound on α (see ROUNDING_LIMIT).
		const load = new Float64Array(m);
		for (let k = 0; k < m; k++) {
			const a = ca[k];
			const b = cb[k];
			let s = Math.abs(hat(a)) + Math.abs(hat(b)) + Math.abs(alpha[k] / cd[k]);
			for (let j = 0; j < m; j++) s += (magAt(j, a) + magAt(j, b)) * Math.abs(alpha[j]);
			load[k] = s;
		}
		for (let j = 0; j < m; j++) {
			let s = 0;
			for (let k = 0; k < m; k++) s += Math.abs(inv[j][k]) * load[k];
			eAlpha[j] = EPS * s;
		}
	}
	const value = (i: number) => {
		if (i < 0) return 0;
		let v = hat(i);
		for (let j = 0; j < m; j++) v += alpha[j] * cy[j][i];
		return v;
	};
	const errorOf = (a: number, b: number) => {
		let e = Math.abs(hat(a)) + Math.abs(hat(b));
		let d = 0;
		for (let j = 0; j < m; j++) {
			const ya = at(cy[j], a);
			const yb = at(cy[j], b);
			e += Math.abs(alpha[j]) * (magAt(j, a) + magAt(j, b));
			d += eAlpha[j] * Math.abs(ya - yb);
		}
		return EPS * e + d;
	};
	const gOf = (k: number) => p.gNew.get(k) ?? base.g[k];
	if (!checks) return { ok: true, at: value, gOf, errorOf };
	// Relays keep their state?
	const relays = c.relays;
	for (let ri = 0; ri < relays.length; ri++) {
		const r = relays[ri];
		const coil = c.elements[r.coil];
		const on = base.energisedAt[ri];
		let next: boolean | null;
		if (coil.gClosed > 0 && gOf(r.coil) === 0) next = c.elements[r.normallyOpen].g > 0; // disconnected: stays as built
		else {
			const v = Math.abs(value(coil.a) - value(coil.b));
			if (!on) next = v >= r.pullIn;
			else {
				// Held in: fine above pull-in, or above drop-out when the base itself sits below pull-in
				// (it pulled in on its way to settling); between the two the full solve decides.
				const held = base.coilBelowPullIn[ri];
				next = v >= r.pullIn || (held && v >= r.dropOut) ? true : v < r.dropOut ? false : null;
			}
		}
		if (next !== on) return failed('stateFlip');
	}
	// Stabilizers keep their state?
	const regulatedIndex = base.regulatedIndex;
	for (let i = 0; i < c.stabilizers.length; i++) {
		const st = c.stabilizers[i];
		if (c.elements[st.element].g === 0 || p.stuck.has(i)) continue;
		const heater = c.polarity * (value(st.input) - value(st.earth));
		const r = regulatedIndex.get(i);
		if (r === undefined) {
			const target = p.idleTargets.get(i) ?? st.setPoint;
			const pinned = base.g[st.element] <= c.gmin * (1 + 1e-9);
			if (!(heater > target)) {
				// Below its set-point the solver closes the contacts fully.
				if (pinned) return failed('stateFlip');
				continue;
			}
			// The solver's own Sherman–Morrison step (solve.ts): its sign says which way the
			// contacts would move; at gMax they must not open, at the floor they must not close.
			const colS = base.column(st.input, st.output);
			// The same small system as the voltages, with this column as its right-hand side.
			const z = updatedColumn(colS.y, m, ca, cb, cy, inv);
			const a = value(st.input) - value(st.output);
			const b = z(st.input) - z(st.output);
			const cOut = value(st.output) - value(st.earth);
			const d = z(st.output) - z(st.earth);
			const tgt = c.polarity * target;
			const denom = d * a - (cOut - tgt) * b;
			const delta = denom !== 0 ? (cOut - tgt) / denom : 0;
			if (pinned ? delta > 0 : delta < 0) return failed('stateFlip');
			continue;
		}
		const target = p.targets.get(r) ?? st.setPoint;
		// Injection along in→out that the contacts now pass beyond the base, and the conductance that means.
		let iota = -(p.shiftC ? p.shiftC[r] : 0) - (injectY ? inject * meter!.col.c[r] : 0);
		for (let j = 0; j < m; j++) iota -= alpha[j] * cc[j][r];
		const across = value(st.input) - value(st.output);
		if (across === 0) return failed('stateFlip');
		// The contacts pass g·Δv − ι, so their conductance is now g − ι/Δv.
		const gNext = base.g[st.element] - iota / across;
		if (!(heater > target) || !(gNext > c.gmin) || !(gNext < st.gMax)) return failed('stateFlip');
	}
	return { ok: true, at: value, gOf, errorOf };
}

/** The response to a column under the Woodbury system of the given changes (for the stabilizer step), from that system's inverse. */
function updatedColumn(v: Float64Array, m: number, ca: Int32Array, cb: Int32Array, cy: Float64Array[], inv: Float64Array[] | null): (i: number) => number {
	if (!m || !inv) return (i) => (i < 0 ? 0 : v[i]);
	const al = new Float64Array(m);
	for (let i = 0; i < m; i++) {
		let t = 0;
		for (let k = 0; k < m; k++) t -= inv[i][k] * (at(v, ca[k]) - at(v, cb[k]));
		al[i] = t;
	}
	return (i: number) => {
		if (i < 0) return 0;
		let x = v[i];
		for (let j = 0; j < m; j++) x += al[j] * cy[j][i];
		return x;
	};
}

/** Inverse of a small matrix, or null when it is singular. */
function invertOrNull(m: Float64Array[]): Float64Array[] | null {
	try {
		return invert(m);
	} catch {
		return null;
	}
}

function failed(reason: Evaluated['reason']): Evaluated {
	return {
		ok: false,
		reason,
		at: () => NaN,
		gOf: () => NaN
	};
}

function meterColumn(c: Circuit, meter: Meter): { a: number; b: number; delta: number; inject: number } | undefined {
	if (meter.kind === 'current') return undefined;
	const a = probeNode(c, meter.a);
	const b = probeNode(c, meter.b);
	if (meter.kind === 'volts') return { a, b, delta: 1 / meter.inputOhms, inject: 0 };
	if (meter.kind === 'lamp') return { a, b, delta: 1 / meter.ohms, inject: 0 };
	return { a, b, delta: 0, inject: meter.testCurrent };
}

function readEvaluated(c: Circuit, ev: Evaluated, meter: Meter): Reading {
	if (meter.kind === 'current') {
		const e = c.elements[meter.element];
		return readingFrom(meter, ev.at(e.a), ev.at(e.b), ev.gOf(meter.element));
	}
	return readingFrom(meter, ev.at(probeNode(c, meter.a)), ev.at(probeNode(c, meter.b)), 0);
}

type MeterOn = { a: number; b: number; delta: number; inject: number; sparse?: SparseColumn; dense?: Column; ends?: MeterEnds; solveEach: boolean };

/**
 * The meters on a base. Their columns are taken on first use (`meterCol`) and kept: sparse
 * (entries of the inverse, no full solve) for a voltmeter or test lamp on a well-scaled part of
 * the circuit; a full solve for an ohmmeter (its circuit, battery out, hangs on the leakage),
 * where the sums are badly scaled, or for every meter when `solveEach` is set.
 */
function metersOn(b: Base, meters: readonly Meter[], solveEach = false): (MeterOn | undefined)[] {
	return meters.map((m) => meterOn(b, m, solveEach));
}

function meterOn(b: Base, m: Meter, solveEach: boolean): MeterOn | undefined {
	const mc = meterColumn(b.c, m);
	// Every field set, in one order: one shape for the pair loop.
	return mc && { a: mc.a, b: mc.b, delta: mc.delta, inject: mc.inject, sparse: undefined, dense: undefined, ends: undefined, solveEach };
}

/** A meter's column where one hypothesis's small system reads it. */
function meterCol(b: Base, mc: MeterOn, faultNodes: readonly number[]): Column {
	if (!mc.dense && !mc.sparse) {
		if (mc.inject === 0 && !mc.solveEach) {
			const sparse = b.sparseColumn(mc.a, mc.b);
			if (sparse.scale <= SPARSE_SCALE_LIMIT) mc.sparse = sparse;
		}
		if (!mc.sparse) mc.dense = b.column(mc.a, mc.b);
	}
	return mc.dense ?? b.scratch().fill(mc.sparse!, faultNodes);
}

/** Is the reading, taken incrementally, within the rounding limit? */
function exactEnough(ev: Evaluated, meter: Meter, a: number, b: number, g: number): boolean {
	if (!ev.errorOf) return true;
	const v = ev.at(a) - ev.at(b);
	const e = ev.errorOf(a, b);
	const r = readingFrom(meter, ev.at(a), ev.at(b), g);
	let err: number;
	switch (meter.kind) {
		case 'volts':
			err = e;
			break;
		case 'lamp':
			err = ((2 * Math.abs(v) + e) * e) / meter.ohms / meter.watts;
			break;
		case 'ohms':
			err = e / meter.testCurrent;
			break;
		case 'current':
			err = g * e;
			break;
	}
	return err <= ROUNDING_LIMIT[meter.kind] + ROUNDING_LIMIT.rel * Math.abs(r);
}

/**
 * One meter under one prepared hypothesis on a base: the reading, 'flip' when the meter moves a
 * relay or stabilizer (the caller solves in full), 'inexact' when rounding could exceed the limit.
 */
function readOn(b: Base, p: Prepared, changes: readonly Change[], meter: Meter, mc: MeterOn | undefined, bare: () => Evaluated): Reading | 'flip' | 'inexact' {
	if (meter.kind === 'current') {
		const ev = bare();
		if (!ev.ok) return 'flip';
		const e = b.c.elements[meter.element];
		if (!exactEnough(ev, meter, e.a, e.b, ev.gOf(meter.element))) return 'inexact';
		return readEvaluated(b.c, ev, meter);
	}
	const ev = evaluatePrepared(b, p, mc && { ...mc, col: meterCol(b, mc, p.faultNodes) });
	if (!ev.ok) return 'flip';
	// A test lamp loads the circuit: it too must leave the solver's settling path as it was.
	if (meter.kind === 'lamp' && mc && b.replayNeeded(changes) && !b.sameSettledState(changes, mc)) return 'flip';
	if (!exactEnough(ev, meter, mc!.a, mc!.b, 0)) return 'inexact';
	return readingFrom(meter, ev.at(mc!.a), ev.at(mc!.b), 0);
}

// ---------------------------------------------------------------------------------------------
// The pair loop without a state check per relay: a bound on what the meter can move

/**
 * What a hypothesis's voltmeter and test-lamp readings need, computed once per hypothesis so a
 * (hypothesis, meter) pair costs a small system and a comparison, with no allocation.
 *
 * The state bound. With no stabilizer regulating, the faulted matrix G_h = G + U D Uᵀ is symmetric
 * positive definite (every conductance ≥ 0, leakage on every node), and a meter across uₘ changes
 * any voltage difference w by α·wᵀG_h⁻¹uₘ, α the meter's current. By the Cauchy–Schwarz
 * inequality in the inner product of G_h⁻¹ (Horn & Johnson, "Matrix Analysis", 2nd ed., §7.7
 * for SPD inner products): |wᵀG_h⁻¹uₘ| ≤ √(wᵀG_h⁻¹w)·√(uₘᵀG_h⁻¹uₘ), both driving-point
 * resistances of the faulted circuit, G_h⁻¹ = G⁻¹ − Y M⁻¹ Yᵀ by Woodbury. So with each relay
 * coil's and stabilizer heater's margin μ (how far its voltage is from the threshold that would
 * change its state) and ρ its driving-point resistance, no state changes when
 * |α|·√ρₘ < Θ = min μ/√ρ. Θ is computed once per hypothesis; a pair failing it is checked one by
 * one at every relay and stabilizer, as before.
 */
interface PairKit {
	k: number;
	fa: Int32Array;
	fb: Int32Array;
	invDelta: Float64Array;
	ys: Float64Array[];
	mags: (Float64Array | undefined)[];
	/** M = D⁻¹ + UᵀY (row-major k×k), its inverse, and the term sizes |yⱼ(aᵢ)| + |yⱼ(bᵢ)| (mag where known). */
	block: Float64Array;
	blockInv: Float64Array;
	blockMag: Float64Array;
	/** x̂ across each fault pair, and |x̂(aᵢ)| + |x̂(bᵢ)|. */
	hatF: Float64Array;
	hatAbsF: Float64Array;
	shift: Float64Array | null;
	theta: number;
	/** Test lamps need solve.ts's settling replayed (`Base.replayNeeded`). */
	replay: boolean;
	mat: Float64Array;
	work: Float64Array;
	inv: Float64Array;
	rhs: Float64Array;
	alpha: Float64Array;
	res: Float64Array;
	load: Float64Array;
	eAlpha: Float64Array;
	cm: Float64Array;
	cmMag: Float64Array;
}

/** Gauss–Jordan inverse with partial pivoting of an m×m row-major matrix into `inv` (`a` is overwritten); false when singular. */
function invertFlat(a: Float64Array, inv: Float64Array, m: number): boolean {
	inv.fill(0, 0, m * m);
	for (let i = 0; i < m; i++) inv[i * m + i] = 1;
	for (let col = 0; col < m; col++) {
		let piv = col;
		for (let r = col + 1; r < m; r++) if (Math.abs(a[r * m + col]) > Math.abs(a[piv * m + col])) piv = r;
		const d = a[piv * m + col];
		if (!(Math.abs(d) > 0) || !Number.isFinite(d)) return false;
		if (piv !== col) {
			for (let q = 0; q < m; q++) {
				let t = a[col * m + q];
				a[col * m + q] = a[piv * m + q];
				a[piv * m + q] = t;
				t = inv[col * m + q];
				inv[col * m + q] = inv[piv * m + q];
				inv[piv * m + q] = t;
			}
		}
		for (let q = 0; q < m; q++) {
			a[col * m + q] /= d;
			inv[col * m + q] /= d;
		}
		for (let r = 0; r < m; r++) {
			if (r === col) continue;
			const f = a[r * m + col];
			if (f === 0) continue;
			for (let q = 0; q < m; q++) {
				a[r * m + q] -= f * a[col * m + q];
				inv[r * m + q] -= f * inv[col * m + q];
			}
		}
	}
	return true;
}

/** Rounding slack on a computed driving-point resistance (a difference of larger terms). */
const RHO_SLACK = 1e-8;

/** The kit of a prepared hypothesis whose bare state checked out, or null where the bound does not apply (a regulating stabilizer). */
function pairKit(base: Base, p: Prepared, ev: Evaluated, changes: readonly Change[], decided?: readonly (boolean | null)[]): PairKit | null {
	if (base.regulated.length) return null;
	const c = base.c;
	const k = p.cols.length;
	const m = k + 1;
	const kit: PairKit = {
		k,
		fa: Int32Array.from(p.cols, (q) => q.a),
		fb: Int32Array.from(p.cols, (q) => q.b),
		invDelta: Float64Array.from(p.cols, (q) => 1 / q.delta),
		ys: p.cols.map((q) => q.col.y),
		mags: p.cols.map((q) => q.col.mag),
		block: new Float64Array(k * k),
		blockInv: new Float64Array(k * k),
		blockMag: new Float64Array(k * k),
		hatF: new Float64Array(k),
		hatAbsF: new Float64Array(k),
		shift: p.shift,
		theta: 0,
		replay: base.replayNeeded(changes),
		mat: new Float64Array(m * m),
		work: new Float64Array(m * m),
		inv: new Float64Array(m * m),
		rhs: new Float64Array(m),
		alpha: new Float64Array(m),
		res: new Float64Array(m),
		load: new Float64Array(m),
		eAlpha: new Float64Array(m),
		cm: new Float64Array(k),
		cmMag: new Float64Array(k)
	};
	const x = base.x;
	const hat = (i: number) => (i < 0 ? 0 : x[i] + (p.shift ? p.shift[i] : 0));
	const magAt = (j: number, i: number) => (i < 0 ? 0 : kit.mags[j] ? kit.mags[j]![i] : Math.abs(kit.ys[j][i]));
	for (let i = 0; i < k; i++) {
		const a = kit.fa[i];
		const b = kit.fb[i];
		kit.hatF[i] = hat(a) - hat(b);
		kit.hatAbsF[i] = Math.abs(hat(a)) + Math.abs(hat(b));
		for (let j = 0; j < k; j++) {
			kit.block[i * k + j] = at(kit.ys[j], a) - at(kit.ys[j], b) + (i === j ? kit.invDelta[i] : 0);
			kit.blockMag[i * k + j] = magAt(j, a) + magAt(j, b);
		}
	}
	if (!invertFlat(Float64Array.from(kit.block), kit.blockInv, k)) return kit;
	// Driving-point resistance of the faulted circuit across (a, b), with its rounding slack.
	const rhoBar = (a: number, b: number) => {
		const e = base.meterEnds(a, b);
		let corr = 0;
		for (let i = 0; i < k; i++) {
			const ci = at(kit.ys[i], a) - at(kit.ys[i], b);
			if (ci === 0) continue;
			for (let j = 0; j < k; j++) corr += ci * kit.blockInv[i * k + j] * (at(kit.ys[j], a) - at(kit.ys[j], b));
		}
		const rho = e.ya - e.yb - corr;
		return Math.max(rho, 0) + RHO_SLACK * (Math.abs(e.ya) + Math.abs(e.yb) + Math.abs(corr)) + Number.MIN_VALUE;
	};
	let theta = Infinity;
	const limit = (margin: number, a: number, b: number) => {
		const mu = margin * (1 - 1e-9) - 1e-9;
		theta = mu > 0 ? Math.min(theta, mu / Math.sqrt(rhoBar(a, b))) : 0;
	};
	for (let ri = 0; ri < c.relays.length && theta > 0; ri++) {
		const r = c.relays[ri];
		const coil = c.elements[r.coil];
		if (coil.gClosed > 0 && ev.gOf(r.coil) === 0) continue; // disconnected: no voltage decides it
		const v = Math.abs(ev.at(coil.a) - ev.at(coil.b));
		// The thresholds of evaluatePrepared's relay check: released stays below pull-in; pulled in
		// stays at pull-in or above (at drop-out or above when held in).
		let margin: number;
		if (decided) {
			// solve.ts's round from this base's states: pulled in stays at drop-out or above,
			// released pulls in at pull-in; the decision taken without the meter must stand.
			const threshold = base.energisedAt[ri] ? r.dropOut : r.pullIn;
			margin = decided[ri] ? v - threshold : threshold - v;
		} else margin = base.energisedAt[ri] ? v - (base.coilBelowPullIn[ri] ? r.dropOut : r.pullIn) : r.pullIn - v;
		limit(margin, coil.a, coil.b);
	}
	for (let i = 0; i < c.stabilizers.length && theta > 0; i++) {
		const st = c.stabilizers[i];
		if (c.elements[st.element].g === 0 || p.stuck.has(i)) continue;
		const heater = c.polarity * (ev.at(st.input) - ev.at(st.earth));
		const target = p.idleTargets.get(i) ?? st.setPoint;
		const pinned = base.g[st.element] <= c.gmin * (1 + 1e-9);
		// Closed below its set-point: stays so while the heater stays at or below it. Any other
		// stabilizer state is checked one by one.
		if (pinned || heater > target) theta = 0;
		else limit(target - heater, st.input, st.earth);
	}
	kit.theta = theta;
	return kit;
}

/**
 * The first-round kit of a hypothesis, for a test lamp on a base that settled in solve.ts's second
 * round: solve.ts's first round on the faulted circuit (relays as built, stabilizers closed, from
 * the first round's own factorisation) must land on the base's relay states with every
 * stabilizer closed, and Θ is taken over the margins of that round's decisions. A lamp passing
 * this bound and the settled kit's leaves both rounds' decisions as they were without it: the
 * first round moves the relays to the base's states, the second (the settled circuit with the
 * fault and the lamp, the settled kit's check) moves nothing, so solve.ts stops there in the
 * base's states and no replay is needed. Null where this does not hold (the replay decides).
 */
function firstRoundKit(base: Base, changes: readonly Change[]): PairKit | null {
	if (!base.settledSecondRound || base.touchesContact(changes)) return null;
	const sb = base.startBase();
	const p1 = prepare(sb, changes);
	if (p1.fallback || p1.island) return null;
	const ev = evaluatePrepared(sb, p1, undefined, false);
	const c = base.c;
	const decided: (boolean | null)[] = [];
	for (let ri = 0; ri < c.relays.length; ri++) {
		const r = c.relays[ri];
		const coil = c.elements[r.coil];
		if (coil.gClosed > 0 && ev.gOf(r.coil) === 0) {
			decided.push(null); // disconnected: solve.ts leaves it as built
			continue;
		}
		const v = Math.abs(ev.at(coil.a) - ev.at(coil.b));
		const next = sb.energisedAt[ri] ? v >= r.dropOut : v >= r.pullIn;
		if (next !== base.energisedAt[ri]) return null;
		decided.push(next);
	}
	const kit = pairKit(sb, p1, ev, changes, decided);
	return kit && kit.theta > 0 ? kit : null;
}

/**
 * A voltmeter's or test lamp's reading under a kit's hypothesis: the same small system,
 * refinement and rounding bound as `evaluatePrepared`, without its allocations, with the meter's
 * column read at the fault's nodes from the fault's own columns (symmetry of G⁻¹) and at its own
 * nodes from `ends`. Returns 0 with the reading in `out[0]`, 1 when rounding could exceed the limit, 2 when
 * the pair must be read the long way (the state bound failed). A test lamp with `kit.replay` still
 * needs solve.ts's settling replayed (the caller's part).
 */
function kitReading(base: Base, kit: PairKit, meter: Meter, a: number, b: number, delta: number, e: MeterEnds, out: Float64Array): 0 | 1 | 2 {
	const { k, mat, inv, rhs, alpha, res, load, eAlpha, cm, cmMag, ys, mags } = kit;
	const m = k + 1;
	const x = base.x;
	const shift = kit.shift;
	const ya = e.ya;
	const yb = e.yb;
	const hatA = a < 0 ? 0 : x[a] + (shift ? shift[a] : 0);
	const hatB = b < 0 ? 0 : x[b] + (shift ? shift[b] : 0);
	// The meter's column at each fault pair: G⁻¹ is symmetric (no stabilizer regulating), so
	// uᵢᵀG⁻¹uₘ = uₘᵀG⁻¹uᵢ, the fault's own column read at the meter's nodes.
	for (let i = 0; i < k; i++) {
		const y = ys[i];
		const mg = mags[i];
		const yia = a >= 0 ? y[a] : 0;
		const yib = b >= 0 ? y[b] : 0;
		cm[i] = yia - yib;
		const ma = a >= 0 ? (mg ? mg[a] : Math.abs(yia)) : 0;
		const mb = b >= 0 ? (mg ? mg[b] : Math.abs(yib)) : 0;
		cmMag[i] = ma + mb;
	}
	for (let i = 0; i < k; i++) {
		for (let j = 0; j < k; j++) mat[i * m + j] = kit.block[i * k + j];
		mat[i * m + k] = cm[i];
		rhs[i] = -kit.hatF[i];
	}
	for (let j = 0; j < k; j++) mat[k * m + j] = cm[j];
	mat[k * m + k] = ya - yb + 1 / delta;
	rhs[k] = -(hatA - hatB);
	// invertFlat overwrites its input: invert a copy, keep the assembled system for the refinement.
	const work = kit.work;
	work.set(mat);
	if (!invertFlat(work, inv, m)) return 2;
	for (let i = 0; i < m; i++) {
		let s = 0;
		for (let q = 0; q < m; q++) s += inv[i * m + q] * rhs[q];
		alpha[i] = s;
	}
	for (let i = 0; i < m; i++) {
		let s = rhs[i];
		for (let j = 0; j < m; j++) s -= mat[i * m + j] * alpha[j];
		res[i] = s;
	}
	for (let i = 0; i < m; i++) {
		let s = 0;
		for (let q = 0; q < m; q++) s += inv[i * m + q] * res[q];
		alpha[i] += s;
	}
	for (let i = 0; i < k; i++) {
		let s = kit.hatAbsF[i] + Math.abs(alpha[i] * kit.invDelta[i]);
		for (let j = 0; j < k; j++) s += kit.blockMag[i * k + j] * Math.abs(alpha[j]);
		s += cmMag[i] * Math.abs(alpha[k]);
		load[i] = s;
	}
	{
		let s = Math.abs(hatA) + Math.abs(hatB) + Math.abs(alpha[k] / delta);
		for (let j = 0; j < k; j++) s += cmMag[j] * Math.abs(alpha[j]);
		s += (Math.abs(ya) + Math.abs(yb)) * Math.abs(alpha[k]);
		load[k] = s;
	}
	for (let j = 0; j < m; j++) {
		let s = 0;
		for (let q = 0; q < m; q++) s += Math.abs(inv[j * m + q]) * load[q];
		eAlpha[j] = EPS * s;
	}
	let va = hatA;
	let vb = hatB;
	let em = Math.abs(hatA) + Math.abs(hatB);
	let ed = 0;
	for (let j = 0; j < k; j++) {
		if (a >= 0) va += alpha[j] * ys[j][a];
		if (b >= 0) vb += alpha[j] * ys[j][b];
		em += Math.abs(alpha[j]) * cmMag[j];
		ed += eAlpha[j] * Math.abs(cm[j]);
	}
	if (a >= 0) va += alpha[k] * ya;
	if (b >= 0) vb += alpha[k] * yb;
	em += Math.abs(alpha[k]) * ((a >= 0 ? Math.abs(ya) : 0) + (b >= 0 ? Math.abs(yb) : 0));
	ed += eAlpha[k] * Math.abs((a >= 0 ? ya : 0) - (b >= 0 ? yb : 0));
	if (a < 0) va = 0;
	if (b < 0) vb = 0;
	const v = va - vb;
	const err = EPS * em + ed;
	let reading: number;
	let bound: number;
	if (meter.kind === 'lamp') {
		reading = (v * v) / meter.ohms / meter.watts;
		bound = ((2 * Math.abs(v) + err) * err) / meter.ohms / meter.watts;
	} else {
		reading = v;
		bound = err;
	}
	if (!(bound <= ROUNDING_LIMIT[meter.kind as 'volts' | 'lamp'] + ROUNDING_LIMIT.rel * Math.abs(reading))) return 1;
	// The state bound: |α|·√ρₘ < Θ, ρₘ the faulted driving-point resistance across the meter.
	let corr = 0;
	for (let i = 0; i < k; i++) {
		if (cm[i] === 0) continue;
		for (let j = 0; j < k; j++) corr += cm[i] * kit.blockInv[i * k + j] * cm[j];
	}
	const rho = ya - yb - corr;
	const rhoBar = Math.max(rho, 0) + RHO_SLACK * (Math.abs(ya) + Math.abs(yb) + Math.abs(corr));
	if (!(Math.abs(alpha[k]) * (1 + 1e-9) * Math.sqrt(rhoBar) < kit.theta)) return 2;
	out[0] = reading;
	return 0;
}

/**
 * Readings of every meter under every hypothesis on one setup: `readings[m][h]`.
 * Each hypothesis is prepared once (its columns solved once against the base's factorisation)
 * and each meter adds one column (solved once per base) to a system of a few unknowns.
 * A hypothesis that moves a relay or stabilizer, or whose incremental readings could carry more
 * rounding than `ROUNDING_LIMIT`, is solved in full once and its meters are added to that
 * solution incrementally; a meter that itself moves a state is read by a full solve.
 */
export function predictReadings(
	base: Base,
	hypotheses: readonly Pick<Hypothesis, 'changes'>[],
	meters: readonly Meter[],
	fallbacks: FallbackCount = emptyFallbacks(),
	options: PredictOptions = {}
): Float64Array[] {
	const c = base.c;
	const solveEach = options.solveEachMeter ?? false;
	const out = meters.map(() => new Float64Array(hypotheses.length));
	const onBase = metersOn(base, meters, solveEach);
	const got = new Float64Array(meters.length);
	const one = new Float64Array(1);
	const one1 = new Float64Array(1);
	const flipped: number[] = [];
	const later: number[] = [];
	/** One meter on a base under a prepared hypothesis: through its kit when it has one, else the long way. */
	const read = (b: Base, kit: PairKit | null, p: Prepared, changes: readonly Change[], mi: number, mc: MeterOn | undefined, bare: () => Evaluated, first?: () => PairKit | null): Reading | 'flip' | 'inexact' => {
		const meter = meters[mi];
		if (kit && mc && (meter.kind === 'volts' || meter.kind === 'lamp')) {
			const code = kitReading(b, kit, meter, mc.a, mc.b, mc.delta, (mc.ends ??= b.meterEnds(mc.a, mc.b)), one);
			// The bound stands for the settled-state check; a lamp's settling path is then the
			// first-round bound's (`firstRoundKit`), or replayed.
			if (code === 0 && meter.kind === 'lamp' && kit.replay) {
				const k1 = first?.();
				if (k1) {
					const sb = b.startBase();
					if (kitReading(sb, k1, meter, mc.a, mc.b, mc.delta, sb.meterEnds(mc.a, mc.b), one1) === 0) return one[0];
				}
				return b.sameSettledState(changes, mc) ? one[0] : 'flip';
			}
			if (code === 0) return one[0];
			if (code === 1) return 'inexact';
			fallbacks.checkedOneByOne++;
		}
		return readOn(b, p, changes, meter, mc, bare);
	};
	hypotheses.forEach((h, hi) => {
		const p = prepare(base, h.changes);
		let full = false;
		if (p.fallback) {
			fallbacks[p.fallback]++;
			full = true;
		} else {
			let bareEv: Evaluated | null = null;
			const bare = () => (bareEv ??= evaluatePrepared(base, p));
			if (!bare().ok || (base.replayNeeded(h.changes) && !base.sameSettledState(h.changes))) {
				fallbacks.stateFlips++;
				full = true;
			} else {
				const kit = solveEach ? null : pairKit(base, p, bare(), h.changes);
				let firstKit: PairKit | null | undefined;
				const first = () => (firstKit === undefined ? (firstKit = firstRoundKit(base, h.changes)) : firstKit);
				flipped.length = 0;
				later.length = 0;
				for (let mi = 0; mi < meters.length; mi++) {
					// A part's current is read on the solved fault: a part hanging on the leakage carries
					// currents of the leakage's size, differences of nearly equal voltages, and the
					// island's rank-one change agrees with a full solve on them only to about 1e-9.
					if (p.island && (meters[mi].kind === 'current' || touchesIsland(c, meters[mi], onBase[mi], p.island.nodes))) {
						const mc = onBase[mi];
						const dead = (v: number) => v < 0 || p.island!.nodes.has(v);
						// Both ends on the dead island (or one on the reference): 0 V, no current.
						if (mc && mc.inject === 0 && dead(mc.a) && dead(mc.b)) got[mi] = 0;
						else later.push(mi);
						continue;
					}
					const r = read(base, kit, p, h.changes, mi, onBase[mi], bare, first);
					if (r === 'inexact') later.push(mi);
					else if (r === 'flip') flipped.push(mi);
					else got[mi] = r;
				}
				fallbacks.incremental++;
				if (p.island) fallbacks.deadIslands++;
				for (let mi = 0; mi < meters.length; mi++) out[mi][hi] = got[mi];
				for (const mi of flipped) {
					fallbacks.meterFlips++;
					out[mi][hi] = fullReading(c, h.changes, meters[mi]);
				}
				fallbacks.onSolvedFault += later.length;
				if (later.length) onSolved(h.changes, hi, later);
				return;
			}
		}
		if (full) onSolved(h.changes, hi, null);
	});
	return out;

	/** Meters (all, or the listed ones) read on the faulted circuit solved in full; meters are then added to it incrementally. */
	function onSolved(changes: readonly Change[], hi: number, only: readonly number[] | null) {
		const local = base.localFor(changes);
		const lp = prepare(local, []);
		let bareEv: Evaluated | null = null;
		const bare = () => (bareEv ??= evaluatePrepared(local, lp));
		const kit = solveEach || !bare().ok ? null : pairKit(local, lp, bare(), []);
		let firstKit: PairKit | null | undefined;
		const first = () => (firstKit === undefined ? (firstKit = firstRoundKit(local, [])) : firstKit);
		const each = (mi: number) => {
			const r = read(local, kit, lp, [], mi, meterOn(local, meters[mi], solveEach), bare, first);
			if (typeof r === 'number') out[mi][hi] = r;
			else {
				if (r === 'flip') fallbacks.meterFlips++;
				else fallbacks.roundoff++;
				out[mi][hi] = fullReading(c, changes, meters[mi]);
			}
		};
		if (only) only.forEach(each);
		else for (let mi = 0; mi < meters.length; mi++) each(mi);
	}
}

/** Does a meter touch a dead island (either of its nodes, or the element whose current it reads)? */
function touchesIsland(c: Circuit, meter: Meter, mc: MeterOn | undefined, nodes: Set<number>): boolean {
	if (meter.kind === 'current') {
		const e = c.elements[meter.element];
		return nodes.has(e.a) || nodes.has(e.b);
	}
	return !!mc && (nodes.has(mc.a) || nodes.has(mc.b));
}

export interface PredictOptions {
	/**
	 * Take every voltmeter's and test lamp's column by a full solve on the base's factorisation
	 * and check every relay and stabilizer from it, without the state bound (`PairKit`): the
	 * straightforward way, kept for the benchmark's full re-solve per hypothesis.
	 */
	solveEachMeter?: boolean;
}

/** One hypothesis's state on a base without a meter (for fuse checks and part currents), solving in full when needed. */
export function evaluateHypothesis(base: Base, changes: readonly Change[]): Evaluated & { full: boolean } {
	const p = prepare(base, changes);
	if (!p.fallback && !p.island) {
		const ev = evaluatePrepared(base, p);
		if (ev.ok && (!base.replayNeeded(changes) || base.sameSettledState(changes))) return { ...ev, full: false };
	}
	const s = base.localFor(changes).solution;
	return { ok: true, at: (i) => s.at(i), gOf: (k) => s.g[k], full: true };
}

/** Factorisation check used by the tests: the base's matrix equals a fresh factorisation of its settled conductances. */
export function baseResidual(base: Base): number {
	const f = factorCircuit(base.c, base.g);
	const x = f.solve(sourceVector(base.c, base.g));
	let worst = 0;
	for (let i = 0; i < x.length; i++) worst = Math.max(worst, Math.abs(x[i] - base.x[i]));
	return worst;
}
