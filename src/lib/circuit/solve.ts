/**
 * DC operating point by nodal analysis (modified nodal analysis with every source in Norton
 * form, so no extra unknowns): G v = J, G symmetric positive definite thanks to the leakage
 * gmin on every node; solved by the sparse LDLᵀ of `sparse.ts`.
 *
 * Two parts are not linear, and are settled by a bounded iteration that reports when it
 * does not settle:
 * - a relay pulls in when its coil voltage reaches pull-in, and drops out below drop-out;
 * - a stabilizer holds its output at the set-point above its own earth while its heater
 *   voltage (input to earth) is above the set-point, else passes its input through its closed
 *   contacts. In the averaged model the contacts are a conductance from input to output whose
 *   value is found exactly each round by a Sherman–Morrison step: the voltages are a rational
 *   function of that one conductance, so the set-point equation has a closed-form solution.
 */
import { buildCircuit, ownerOf, type Circuit } from './circuit';
import type { Scenario } from './scenario';
import type { HarnessDocument } from './schema';
import { analyse, factorize, slotOf, symmetricPattern, type Factorization, type Symbolic } from './sparse';

export interface Solution {
	circuit: Circuit;
	/** Voltage per node index, relative to the reference. */
	voltages: Float64Array;
	/** Final conductance per element (relay contacts and stabilizers settled). */
	g: Float64Array;
	/** Current per element from its node a to its node b (A). */
	currents: Float64Array;
	/** Power taken per part or wire (W); a source delivering power is negative. */
	power: Map<string, number>;
	/** Energised relays. */
	energised: Set<string>;
	/** Stabilizers regulating (true) or passing their input through (false). */
	regulating: Map<string, boolean>;
	converged: boolean;
	iterations: number;
	warnings: string[];
	/** The factorisation of the final matrix, for reuse (e.g. rank-one updates). */
	factor: Factorization;
	/** Voltage at a node index (−1 = reference = 0). */
	at(node: number): number;
}

export interface SolveOptions {
	/** Most rounds of the relay/stabilizer iteration; default 40. */
	maxIterations?: number;
}

/** The stamping plan: for each element, where its four entries go in the values array. */
interface Stamp {
	sym: Symbolic;
	diag: Int32Array;
	aa: Int32Array;
	bb: Int32Array;
	ab: Int32Array;
	ba: Int32Array;
}

/**
 * Plans of recently seen circuit structures. Every scenario of a document has the same
 * elements (open ones kept at g = 0), so the ordering and symbolic analysis are reused;
 * a hit is checked against the full list of element ends, so a stale plan is never used.
 */
const plans: { n: number; ends: Int32Array; stamp: Stamp }[] = [];
const PLAN_CACHE = 8;

/** Forget the cached plans (for timing a cold solve). */
export function clearPlanCache(): void {
	plans.length = 0;
}

function plan(c: Circuit): Stamp {
	const n = c.nodeNames.length;
	const ends = new Int32Array(2 * c.elements.length);
	c.elements.forEach((e, k) => {
		ends[2 * k] = e.a;
		ends[2 * k + 1] = e.b;
	});
	for (let i = 0; i < plans.length; i++) {
		const p = plans[i];
		if (p.n !== n || p.ends.length !== ends.length) continue;
		let same = true;
		for (let k = 0; k < ends.length && same; k++) same = p.ends[k] === ends[k];
		if (same) {
			if (i > 0) plans.unshift(...plans.splice(i, 1));
			return p.stamp;
		}
	}
	// A circuit with elements added at the end (a fault's short, a meter) keeps the ordering of
	// the circuit it came from: only the symbolic analysis is redone, not the minimum degree.
	let perm: Int32Array | undefined;
	for (const p of plans) {
		if (p.n !== n || p.ends.length >= ends.length) continue;
		let prefix = true;
		for (let k = 0; k < p.ends.length && prefix; k++) prefix = p.ends[k] === ends[k];
		if (prefix) {
			perm = p.stamp.sym.perm;
			break;
		}
	}
	const stamp = freshPlan(c, perm);
	// Derived plans are not kept, so the many faults of one circuit never push its own plan out.
	if (perm) return stamp;
	plans.unshift({ n, ends, stamp });
	if (plans.length > PLAN_CACHE) plans.pop();
	return stamp;
}

function freshPlan(c: Circuit, perm?: Int32Array): Stamp {
	const n = c.nodeNames.length;
	const pairs: [number, number][] = c.elements.map((e) => [e.a, e.b]);
	const pattern = symmetricPattern(n, pairs);
	const sym = analyse(pattern, perm);
	const m = c.elements.length;
	const aa = new Int32Array(m).fill(-1);
	const bb = new Int32Array(m).fill(-1);
	const ab = new Int32Array(m).fill(-1);
	const ba = new Int32Array(m).fill(-1);
	c.elements.forEach((e, k) => {
		if (e.a >= 0) aa[k] = slotOf(pattern, e.a, e.a);
		if (e.b >= 0) bb[k] = slotOf(pattern, e.b, e.b);
		if (e.a >= 0 && e.b >= 0 && e.a !== e.b) {
			ab[k] = slotOf(pattern, e.a, e.b);
			ba[k] = slotOf(pattern, e.b, e.a);
		}
	});
	const diag = new Int32Array(n);
	for (let i = 0; i < n; i++) diag[i] = slotOf(pattern, i, i);
	return { sym, diag, aa, bb, ab, ba };
}

function assemble(c: Circuit, s: Stamp, g: Float64Array): Float64Array {
	const values = new Float64Array(s.sym.pattern.rowIdx.length);
	for (let i = 0; i < s.diag.length; i++) values[s.diag[i]] = c.gmin;
	for (let k = 0; k < g.length; k++) {
		const gk = g[k];
		if (gk === 0) continue;
		if (s.aa[k] >= 0) values[s.aa[k]] += gk;
		if (s.bb[k] >= 0) values[s.bb[k]] += gk;
		if (s.ab[k] >= 0) {
			values[s.ab[k]] -= gk;
			values[s.ba[k]] -= gk;
		}
	}
	return values;
}

/** Right-hand side: Norton currents into each node. */
export function sourceVector(c: Circuit, g: ArrayLike<number>): Float64Array {
	const j = new Float64Array(c.nodeNames.length);
	for (const s of c.sources) {
		const current = s.element !== undefined ? (s.emf ?? 0) * g[s.element] : (s.current ?? 0);
		if (s.a >= 0) j[s.a] += current;
		if (s.b >= 0) j[s.b] -= current;
	}
	return j;
}

/** Factorise the nodal matrix of a circuit with given element conductances. */
export function factorCircuit(c: Circuit, g: Float64Array = Float64Array.from(c.elements, (e) => e.g)): Factorization {
	const s = plan(c);
	return factorize(s.sym, assemble(c, s, g), c.gmin);
}

const volt = (v: Float64Array, i: number) => (i < 0 ? 0 : v[i]);

/** a + b as a double and its rounding error (Knuth's TwoSum). */
function twoSum(a: number, b: number, out: Float64Array): void {
	const s = a + b;
	const bb = s - a;
	out[0] = s;
	out[1] = a - (s - bb) + (b - bb);
}

/** a · b as a double and its rounding error (Dekker's TwoProduct with Veltkamp splitting). */
function twoProd(a: number, b: number, out: Float64Array): void {
	const p = a * b;
	const A = 134217729 * a;
	const ah = A - (A - a);
	const al = a - ah;
	const B = 134217729 * b;
	const bh = B - (B - b);
	const bl = b - bh;
	out[0] = p;
	out[1] = ah * bh - p + ah * bl + al * bh + al * bl;
}

/**
 * Voltages by iterative refinement with the residual in double-double arithmetic
 * (Higham 2002, §12.1, mixed-precision refinement; Dekker 1971, Knuth TAOCP 2 §4.2.2 for the
 * error-free sums and products). A part of the circuit that hangs on the leakage alone, yet sits
 * at a feed's potential, is read as the small difference of two nearly equal voltages; the plain
 * LDLᵀ solve leaves an absolute error near 1e-9 V there, and a current read there (or a fault
 * update computed from these voltages) inherits it. Two refinement steps bring it to the
 * rounding of the voltages themselves.
 */
export function refineVoltages(c: Circuit, g: ArrayLike<number>, factor: Factorization, v: Float64Array): Float64Array {
	// A pivot raised to the floor means the factors are not of this matrix: nothing to refine against.
	if (factor.raisedPivots > 0) return v;
	const n = c.nodeNames.length;
	const x = Float64Array.from(v);
	const j = sourceVector(c, g);
	const hi = new Float64Array(n);
	const lo = new Float64Array(n);
	const t = new Float64Array(2);
	const add = (i: number, v: number, e: number) => {
		twoSum(hi[i], v, t);
		hi[i] = t[0];
		lo[i] += t[1] + e;
	};
	for (let step = 0; step < 2; step++) {
		hi.set(j);
		lo.fill(0);
		for (let i = 0; i < n; i++) {
			twoProd(c.gmin, x[i], t);
			add(i, -t[0], -t[1]);
		}
		for (let k = 0; k < c.elements.length; k++) {
			const gk = g[k];
			if (gk === 0) continue;
			const e = c.elements[k];
			twoSum(volt(x, e.a), -volt(x, e.b), t);
			const d = t[0];
			const de = t[1];
			twoProd(gk, d, t);
			const flow = t[0];
			const fe = t[1] + gk * de;
			if (e.a >= 0) add(e.a, -flow, -fe);
			if (e.b >= 0) add(e.b, flow, fe);
		}
		const r = new Float64Array(n);
		for (let i = 0; i < n; i++) r[i] = hi[i] + lo[i];
		const d = factor.solve(r);
		for (let i = 0; i < n; i++) x[i] += d[i];
	}
	return x;
}

/** Solve a built circuit, settling relays and stabilizers. */
export function solveCircuit(c: Circuit, options: SolveOptions = {}): Solution {
	const maxIterations = options.maxIterations ?? 40;
	const n = c.nodeNames.length;
	const g = Float64Array.from(c.elements, (e) => e.g);
	const stamp = plan(c);
	const energised = new Set<string>();
	for (const r of c.relays) if (g[r.normallyOpen] > 0) energised.add(r.part);
	const regulating = new Map<string, boolean>();
	const warnings: string[] = [];
	let v: Float64Array = new Float64Array(n);
	let factor!: Factorization;
	let converged = false;
	let iterations = 0;
	let unsettled: string[] = [];
	while (iterations < maxIterations) {
		iterations++;
		factor = factorize(stamp.sym, assemble(c, stamp, g), c.gmin);
		v = refineVoltages(c, g, factor, factor.solve(sourceVector(c, g)));
		unsettled = [];
		for (const r of c.relays) {
			const el = c.elements[r.coil];
			if (el.gClosed > 0 && g[r.coil] === 0) continue; // coil disconnected
			const coilVolts = Math.abs(volt(v, el.a) - volt(v, el.b));
			const on = energised.has(r.part);
			const next = on ? coilVolts >= r.dropOut : coilVolts >= r.pullIn;
			if (next !== on) {
				unsettled.push(r.part);
				if (next) energised.add(r.part);
				else energised.delete(r.part);
				// The coil is connected, so the part is not unplugged: its contacts can move.
				g[r.normallyOpen] = next ? c.elements[r.normallyOpen].gClosed : 0;
				g[r.normallyClosed] = next ? 0 : c.elements[r.normallyClosed].gClosed;
			}
		}
		for (const st of c.stabilizers) {
			const el = c.elements[st.element];
			if (el.g === 0) continue; // unplugged in this scenario
			const heater = c.polarity * (volt(v, st.input) - volt(v, st.earth));
			const gNow = g[st.element];
			let gNext = st.gMax;
			if (heater > st.setPoint) {
				// Sherman–Morrison: with G' = G + δ u uᵀ (u = e_in − e_out),
				// x' = x − z δ (uᵀx) / (1 + δ uᵀz), z = G⁻¹u. Solve wᵀx' = T for δ (w = e_out − e_earth).
				const u = new Float64Array(n);
				if (st.input >= 0) u[st.input] += 1;
				if (st.output >= 0) u[st.output] -= 1;
				const z = factor.solve(u);
				const a = volt(v, st.input) - volt(v, st.output);
				const b = volt(z, st.input) - volt(z, st.output);
				const cOut = volt(v, st.output) - volt(v, st.earth);
				const d = volt(z, st.output) - volt(z, st.earth);
				const target = c.polarity * st.setPoint;
				const denom = d * a - (cOut - target) * b;
				const delta = denom !== 0 ? (cOut - target) / denom : 0;
				gNext = Math.min(st.gMax, Math.max(c.gmin, gNow + delta));
			}
			regulating.set(st.part, gNext < st.gMax);
			// A relative change below 1e-10 moves the output by well under a microvolt: settled.
			if (Math.abs(gNext - gNow) > 1e-10 * Math.max(gNow, gNext)) {
				unsettled.push(st.part);
				g[st.element] = gNext;
			}
		}
		if (!unsettled.length) {
			converged = true;
			break;
		}
	}
	if (!converged) {
		const keys = unsettled.map((id) => c.doc.parts.find((p) => p.id === id)?.key ?? id);
		warnings.push(
			`did not settle after ${maxIterations} rounds: ${keys.join(', ')} kept changing (a relay that drops out as soon as it pulls in chatters)`
		);
		factor = factorize(stamp.sym, assemble(c, stamp, g), c.gmin);
		v = refineVoltages(c, g, factor, factor.solve(sourceVector(c, g)));
	}
	const currents = new Float64Array(c.elements.length);
	const power = new Map<string, number>();
	const addPower = (id: string, w: number) => power.set(id, (power.get(id) ?? 0) + w);
	c.elements.forEach((e, k) => {
		const dv = volt(v, e.a) - volt(v, e.b);
		currents[k] = g[k] * dv;
		addPower(ownerOf(e.ref), g[k] * dv * dv);
	});
	for (const s of c.sources) {
		const current = s.element !== undefined ? (s.emf ?? 0) * g[s.element] : (s.current ?? 0);
		addPower(ownerOf(s.ref), -current * (volt(v, s.a) - volt(v, s.b)));
		if (s.element !== undefined) currents[s.element] -= current;
	}
	const voltages = v;
	return {
		circuit: c,
		voltages,
		g,
		currents,
		power,
		energised,
		regulating,
		converged,
		iterations,
		warnings,
		factor,
		at: (node) => volt(voltages, node)
	};
}

/** Build and solve a document in a scenario. */
export function solve(doc: HarnessDocument, scenario: Scenario, options?: SolveOptions): Solution {
	return solveCircuit(buildCircuit(doc, scenario), options);
}

/** Relays energised in a scenario (for tracing which relay contacts are closed). */
export function relayStates(doc: HarnessDocument, scenario: Scenario): Set<string> {
	const c = buildCircuit(doc, scenario);
	if (!c.relays.length) return new Set();
	return solveCircuit(c).energised;
}
