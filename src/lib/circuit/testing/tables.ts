// Generated prediction tables for the planner's tests and benchmark. Seeded, so every case can
// be re-run. Two kinds:
// - randomTable: small tables of random readings, for checking exact algorithms against
//   enumeration;
// - harnessTable: a made-up vehicle harness (battery, fuse box, fused branches with junctions,
//   connectors, switches and loads, shared earth points, a bimetal stabilizer feeding gauges)
//   with single-fault suspects and voltage, drop and ohms probes, its readings worked out by a
//   small nodal calculation of its own. The structure, not the exact volts, is what matters:
//   faults upstream change everything downstream, shared earths link branches, and some
//   suspects (shorts behind one fuse) cannot be told apart with a meter.
import { toldApart, type PredictionTable, type Tolerance } from '../outcomes';

/**
 * Xorshift32 (Marsaglia 2003, "Xorshift RNGs", J. Stat. Softw. 8(14), shifts 13/17/5): a
 * seeded source of floats in [0, 1).
 */
export function rng(seed: number): () => number {
	let x = seed >>> 0 || 0x9e3779b9;
	return () => {
		x ^= x << 13;
		x >>>= 0;
		x ^= x >>> 17;
		x ^= x << 5;
		x >>>= 0;
		return x / 4294967296;
	};
}

const pick = <T>(random: () => number, items: readonly T[]): T => items[Math.floor(random() * items.length)];

// Readings a 12 V harness shows (dead, a few drops, stabilized, battery), so random readings
// collide and chain within tolerance as real ones do.
const LEVELS = [0, 0.05, 0.3, 2, 6, 8, 9.6, 10, 10.4, 11.8, 12.2, 12.45, 12.6];

/** Random readings for n suspects; a fraction `nullRate` is undefined. */
export function randomReadings(random: () => number, n: number, nullRate = 0): (number | null)[] {
	return Array.from({ length: n }, () => (random() < nullRate ? null : pick(random, LEVELS) + (random() - 0.5) * 0.2));
}

export type RandomTableOptions = {
	suspects: number;
	probes: number;
	/** Share of undefined readings. */
	nullRate?: number;
	/** Whole-number costs 1–5 (many ties) instead of real costs in [0.5, 5). */
	wholeCosts?: boolean;
};

/** A small table of random readings, random costs and random priors. */
export function randomTable(random: () => number, o: RandomTableOptions): PredictionTable {
	const tol: Tolerance = { abs: 0.02 + random() * 0.3, rel: 0.005, band: random() < 0.3 ? 0.5 : undefined };
	return {
		suspects: Array.from({ length: o.suspects }, (_, i) => ({ id: `s${i}`, prior: 0.1 + random() })),
		probes: Array.from({ length: o.probes }, (_, i) => ({
			id: `p${i}`,
			cost: o.wholeCosts ? 1 + Math.floor(random() * 5) : 0.5 + random() * 4.5,
			tolerance: tol,
			unit: 'V'
		})),
		readings: Array.from({ length: o.probes }, () => randomReadings(random, o.suspects, o.nullRate ?? 0))
	};
}

// ---- The made-up harness ----

type Zone = 'engine bay' | 'under dash' | 'boot' | 'fuel tank';
// Effort of reaching a spot (invented weights): the engine bay is open, under the dash means
// lying in the footwell, the tank sender means lifting the boot floor.
const REACH: Record<Zone, number> = { 'engine bay': 1, boot: 2, 'under dash': 3, 'fuel tank': 5 };

type EdgeKind = 'wire' | 'fuse' | 'switch' | 'connector' | 'stabilizer';
type Node = { label: string; zone: Zone; parent: number; children: number[]; load: number };
type Edge = { kind: EdgeKind; label: string; from: number; to: number; r: number };
type Load = { label: string; node: number; r: number; earth: number; zone: Zone };
type Fault =
	| { kind: 'open'; edge: number }
	| { kind: 'resistive'; edge: number; r: number }
	| { kind: 'load-open'; load: number }
	| { kind: 'earth-open'; earth: number }
	| { kind: 'earth-resistive'; earth: number; r: number }
	| { kind: 'short'; node: number }
	| { kind: 'stabilizer'; state: 'stuck-open' | 'stuck-closed' | 'low' }
	| { kind: 'none' };

const EMF = 12.6; // charged battery at rest (TRADE.md, BCI table)
const R_INTERNAL = 0.01;
const R_EARTH_LEAD = 0.01;
const R_EARTH_POINT = 0.005;
const R_SHORT = 0.05;
const STABILIZED = 10; // average output of a 12 V bimetal stabilizer (TRADE.md)
const LOW_OUTPUT = 8;
const OVER_RANGE = 1e7; // ohms shown for an open circuit

// Meter profiles: 20 V range ±(0.5 % + 2 counts of 10 mV); 200 Ω range ±(0.8 % + 3 counts of
// 0.1 Ω). Both figures from memory (TRADE.md says so too): they are profile settings.
const VOLTS: Tolerance = { abs: 0.02, rel: 0.005 };
const VOLTS_PULSING: Tolerance = { abs: 0.02, rel: 0.005, band: 1 };
const OHMS: Tolerance = { abs: 0.3, rel: 0.008 };

// Failure weights by kind, in the falling order of TRADE.md "Fault frequency" (common
// practice); the numbers themselves are invented.
const WEIGHT = { earth: 3, connector: 2.5, switch: 2, fuse: 1.5, part: 1.5, stabilizer: 1.5, wire: 0.5, short: 0.7 };

export type HarnessOptions = {
	suspects: number;
	probes?: number;
	/**
	 * Take the suspects from the faults that explain one symptom (every part on one fuse
	 * misbehaving: feed or earth terminal off its healthy reading), as the symptom marks of
	 * DESIGN.md §7 would, instead of from the whole harness. The harness is made larger so that
	 * enough faults explain it; fewer suspects are returned if fewer do.
	 */
	symptom?: boolean;
};
export type HarnessTable = {
	table: PredictionTable;
	/** Voltage probes in the order of a point-by-point walk from the battery along the feed. */
	walkOrder: string[];
};

/** A made-up harness with `suspects` single-fault suspects (sampled from all it has). */
export function harnessTable(random: () => number, o: HarnessOptions): HarnessTable {
	const loadsWanted = Math.max(4, Math.round(o.suspects / (o.symptom ? 0.9 : 2.4)));
	const nodes: Node[] = [];
	const edges: Edge[] = [];
	const loads: Load[] = [];
	const addNode = (label: string, zone: Zone, parent: number): number => {
		nodes.push({ label, zone, parent, children: [], load: -1 });
		return nodes.length - 1;
	};
	const addEdge = (kind: EdgeKind, label: string, from: number, zone: Zone, r: number, nodeLabel: string): number => {
		const to = addNode(nodeLabel, zone, edges.length);
		edges.push({ kind, label, from, to, r });
		nodes[from].children.push(edges.length - 1);
		return to;
	};
	const battery = addNode('battery +', 'engine bay', -1);
	const fuseBox = addEdge('wire', 'main feed wire', battery, 'under dash', 0.01, 'fuse box');
	const fuseCount = Math.max(2, Math.round(loadsWanted / 4));
	const branchNodes: number[][] = [];
	for (let f = 0; f < fuseCount; f++) {
		const n = addEdge('fuse', `fuse ${f + 1}`, fuseBox, 'under dash', 0.005, `fuse ${f + 1} out`);
		branchNodes.push([n]);
	}
	const earthCount = Math.max(2, Math.round(loadsWanted / 4));
	const earthZones: Zone[] = Array.from({ length: earthCount }, (_, i) => (i === 0 ? 'engine bay' : pick(random, ['engine bay', 'under dash', 'boot'] as Zone[])));
	const zones: Zone[] = ['engine bay', 'engine bay', 'under dash', 'boot'];
	let junctions = 0;
	const addLoad = (at: number, zone: Zone, r: number, kind: string): void => {
		const i = loads.length;
		const node = addEdge('wire', `${kind} ${i + 1} lead`, at, zone, 0.02 + random() * 0.04, `${kind} ${i + 1} feed`);
		loads.push({ label: `${kind} ${i + 1}`, node, r, earth: Math.floor(random() * earthCount), zone });
		nodes[node].load = i;
	};
	// Gauges behind a stabilizer on fuse 1: heater ≈ 58 Ω plus a sender of 21–145 Ω (TRADE.md).
	const stab = addEdge('stabilizer', 'voltage stabilizer', branchNodes[0][0], 'under dash', 0.01, 'stabilizer out');
	for (let g = 0; g < 2; g++) addLoad(stab, 'under dash', 58 + 21 + random() * 124, 'gauge');
	while (loads.length < loadsWanted) {
		const f = Math.floor(random() * fuseCount);
		let at = pick(random, branchNodes[f]);
		if (random() < 0.45) {
			const kind = pick(random, ['wire', 'wire', 'connector', 'switch'] as const);
			const r = kind === 'wire' ? 0.02 + random() * 0.06 : kind === 'connector' ? 0.005 : 0.01;
			junctions++;
			at = addEdge(kind, `${kind} ${junctions}`, at, pick(random, zones), r, `junction ${junctions}`);
			branchNodes[f].push(at);
		}
		// Hot resistance V²/P at 12 V of a 21 W, 5 W lamp, or a small motor (invented loads).
		const [kind, r] = pick(random, [
			['lamp', 144 / 21],
			['lamp', 144 / 5],
			['motor', 3]
		] as const);
		addLoad(at, nodes[at].zone, r, kind);
	}

	// ---- Suspects ----
	const faults: { fault: Fault; id: string; label: string; weight: number }[] = [];
	edges.forEach((e, i) => {
		if (e.kind === 'stabilizer') return;
		const w = e.kind === 'fuse' ? WEIGHT.fuse : e.kind === 'connector' ? WEIGHT.connector : e.kind === 'switch' ? WEIGHT.switch : WEIGHT.wire;
		faults.push({ fault: { kind: 'open', edge: i }, id: `open:${i}`, label: `${e.label} open`, weight: w });
		faults.push({ fault: { kind: 'resistive', edge: i, r: pick(random, [0.5, 1, 2, 3]) }, id: `res:${i}`, label: `${e.label} high resistance`, weight: w });
	});
	loads.forEach((l, i) => faults.push({ fault: { kind: 'load-open', load: i }, id: `part:${i}`, label: `${l.label} open`, weight: WEIGHT.part }));
	for (let e = 0; e < earthCount; e++) {
		faults.push({ fault: { kind: 'earth-open', earth: e }, id: `earth-open:${e}`, label: `earth point ${e + 1} open`, weight: WEIGHT.earth });
		faults.push({ fault: { kind: 'earth-resistive', earth: e, r: 1 + random() * 2 }, id: `earth-res:${e}`, label: `earth point ${e + 1} resistive`, weight: WEIGHT.earth });
	}
	nodes.forEach((n, i) => {
		if (i > fuseBox && n.load < 0 && random() < 0.6) faults.push({ fault: { kind: 'short', node: i }, id: `short:${i}`, label: `short to earth at ${n.label}`, weight: WEIGHT.short });
	});
	for (const state of ['stuck-open', 'stuck-closed', 'low'] as const)
		faults.push({ fault: { kind: 'stabilizer', state }, id: `stab:${state}`, label: `stabilizer ${state.replace('-', ' ')}`, weight: WEIGHT.stabilizer });
	const circuit: Circuit = { nodes, edges, loads, earthCount, stab, fuseOuts: branchNodes.map((b) => b[0]) };
	let pool = faults;
	// Points a person walks: every point, or with a symptom those on the way to the marked parts.
	let onWalk = (_n: number): boolean => true;
	if (o.symptom) {
		// The fuse (other than the gauges') with the most parts; its parts are the ones marked.
		const fuseOf = (n: number): number => {
			for (; n > 0; n = edges[nodes[n].parent].from) if (edges[nodes[n].parent].kind === 'fuse') return branchNodes.findIndex((b) => b[0] === n);
			return -1;
		};
		const counts = branchNodes.map((_, f) => loads.filter((l) => fuseOf(l.node) === f).length);
		const f = counts.reduce((best, c, i) => (i > 0 && c > counts[best] ? i : best), counts.length > 1 ? 1 : 0);
		const marked = loads.map((l, i) => i).filter((i) => fuseOf(loads[i].node) === f);
		const way = new Set<number>();
		for (const i of marked) for (let n = loads[i].node; ; n = edges[nodes[n].parent].from) {
			way.add(n);
			if (n === 0) break;
		}
		onWalk = (n) => way.has(n);
		const healthy = solveHarness(circuit, { kind: 'none' });
		pool = faults.filter(({ fault }) => {
			const s = solveHarness(circuit, fault);
			return marked.some(
				(i) => toldApart(VOLTS, s.volts[loads[i].node], healthy.volts[loads[i].node]) || toldApart(VOLTS, s.earthTerminal[i], healthy.earthTerminal[i])
			);
		});
	}
	const chosen = sample(random, pool, o.suspects);

	// ---- Probes ----
	type Probe = { id: string; label: string; cost: number; tolerance: Tolerance; unit: string; read: (s: Solution) => number };
	const stabilized = new Set<number>();
	const mark = (n: number): void => {
		stabilized.add(n);
		for (const e of nodes[n].children) mark(edges[e].to);
	};
	mark(stab);
	const probes: Probe[] = [];
	nodes.forEach((n, i) =>
		probes.push({
			id: `v:${i}`,
			label: `volts at ${n.label} (${n.zone})`,
			cost: REACH[n.zone],
			tolerance: stabilized.has(i) ? VOLTS_PULSING : VOLTS,
			unit: 'V',
			read: (s) => s.volts[i]
		})
	);
	loads.forEach((l, i) =>
		probes.push({ id: `ve:${i}`, label: `volts at ${l.label} earth terminal (${l.zone})`, cost: REACH[l.zone], tolerance: stabilized.has(l.node) ? VOLTS_PULSING : VOLTS, unit: 'V', read: (s) => s.earthTerminal[i] })
	);
	edges.forEach((e, i) => {
		if (e.kind === 'stabilizer') return;
		probes.push({
			id: `drop:${i}`,
			label: `volt drop across ${e.label} under load`,
			cost: Math.max(REACH[nodes[e.from].zone], REACH[nodes[e.to].zone]) + 1,
			tolerance: stabilized.has(e.to) ? VOLTS_PULSING : VOLTS,
			unit: 'V',
			read: (s) => s.volts[e.from] - s.volts[e.to]
		});
	});
	branchNodes.forEach((b, f) =>
		probes.push({ id: `ohm:${f}`, label: `ohms to earth at fuse ${f + 1} out, fuse pulled, battery off`, cost: REACH['under dash'] + 2, tolerance: OHMS, unit: 'Ω', read: (s) => s.ohms[f] })
	);
	const keptProbes = o.probes !== undefined ? sample(random, probes, o.probes) : probes;

	const solutions = chosen.map((f) => solveHarness(circuit, f.fault));
	const table: PredictionTable = {
		suspects: chosen.map((f) => ({ id: f.id, label: f.label, prior: f.weight })),
		probes: keptProbes.map(({ id, label, cost, tolerance, unit }) => ({ id, label, cost, tolerance, unit })),
		readings: keptProbes.map((p) => solutions.map((s) => round(p.read(s))))
	};
	// Walk: depth first from the battery, each point's volts, then the part's earth terminal.
	const walk: string[] = [];
	const visit = (n: number): void => {
		if (!onWalk(n)) return;
		walk.push(`v:${n}`);
		if (nodes[n].load >= 0) walk.push(`ve:${nodes[n].load}`);
		for (const e of nodes[n].children) visit(edges[e].to);
	};
	visit(battery);
	const kept = new Set(keptProbes.map((p) => p.id));
	return { table, walkOrder: walk.filter((id) => kept.has(id)) };
}

const round = (x: number): number => Math.round(x * 1e6) / 1e6;

function sample<T>(random: () => number, items: readonly T[], count: number): T[] {
	if (count >= items.length) return [...items];
	const idx = items.map((_, i) => i);
	for (let i = idx.length - 1; i > 0; i--) {
		const j = Math.floor(random() * (i + 1));
		[idx[i], idx[j]] = [idx[j], idx[i]];
	}
	return idx
		.slice(0, count)
		.sort((a, b) => a - b)
		.map((i) => items[i]);
}

type Circuit = { nodes: Node[]; edges: Edge[]; loads: Load[]; earthCount: number; stab: number; fuseOuts: number[] };
type Solution = { volts: number[]; earthTerminal: number[]; ohms: number[] };

// The harness is a feed tree from the battery with each part returning to an earth point. For
// given earth-point voltages the feed tree is solved exactly bottom-up with Norton equivalents
// (current into a subtree I = G·V − J; a series resistor R turns (G, J) into
// (G, J)/(1 + R·G)); the earth-point voltages then follow from one small linear system by
// superposition. The stabilizer output is an ideal source of its average voltage, drawing its
// subtree's current from its input.
function solveHarness(c: Circuit, fault: Fault): Solution {
	const { nodes, edges, loads } = c;
	const edgeR = (i: number): number => {
		if (fault.kind === 'open' && fault.edge === i) return Infinity;
		return edges[i].r + (fault.kind === 'resistive' && fault.edge === i ? fault.r : 0);
	};
	const earthR = (e: number): number =>
		fault.kind === 'earth-open' && fault.earth === e ? Infinity : R_EARTH_POINT + (fault.kind === 'earth-resistive' && fault.earth === e ? fault.r : 0);
	const loadOn = (l: number): boolean => !(fault.kind === 'load-open' && fault.load === l) && earthR(loads[l].earth) !== Infinity;
	const loadG = (l: number): number => (loadOn(l) ? 1 / (loads[l].r + R_EARTH_LEAD) : 0);
	const shorted = (n: number): boolean => fault.kind === 'short' && fault.node === n;
	// A short behind a fuse blows it: model the fuse feeding the short as open.
	let blown = -1;
	if (fault.kind === 'short') {
		for (let n = fault.node; n > 0; n = edges[nodes[n].parent].from) {
			const e = nodes[n].parent;
			if (edges[e].kind === 'fuse') blown = e;
		}
	}
	const stabState = fault.kind === 'stabilizer' ? fault.state : 'ok';

	// Downward Norton equivalents and node voltages for given earth voltages.
	const stabV = stabState === 'stuck-open' ? 0 : stabState === 'low' ? LOW_OUTPUT : STABILIZED;
	const solveFeed = (earthV: number[], regulating: boolean) => {
		const G = new Array<number>(nodes.length).fill(0);
		const J = new Array<number>(nodes.length).fill(0);
		const passes = (e: number): 'open' | 'source' | 'series' => {
			if (e === blown || edgeR(e) === Infinity) return 'open';
			if (edges[e].kind === 'stabilizer' && stabState === 'stuck-open') return 'open';
			if (edges[e].kind !== 'stabilizer' || stabState === 'stuck-closed' || !regulating) return 'series';
			return stabState === 'stuck-open' ? 'open' : 'source';
		};
		const down = (n: number): void => {
			let g = 0;
			let j = 0;
			const l = nodes[n].load;
			if (l >= 0) {
				const gl = loadG(l);
				g += gl;
				j += gl * earthV[loads[l].earth];
			}
			if (shorted(n)) g += 1 / R_SHORT;
			for (const e of nodes[n].children) {
				const to = edges[e].to;
				down(to);
				const how = passes(e);
				if (how === 'open') continue;
				if (how === 'source') {
					// Fed from its own source: seen from its input as a fixed current draw I, so
					// I_in = G·V − (J − I).
					j -= G[to] * stabV - J[to];
					continue;
				}
				const r = edgeR(e);
				g += G[to] / (1 + r * G[to]);
				j += J[to] / (1 + r * G[to]);
			}
			G[n] = g;
			J[n] = j;
		};
		down(0);
		const volts = new Array<number>(nodes.length).fill(0);
		// Battery: V = EMF − R_int·I with I = G·V − J.
		volts[0] = (EMF + R_INTERNAL * J[0]) / (1 + R_INTERNAL * G[0]);
		const up = (n: number): void => {
			for (const e of nodes[n].children) {
				const to = edges[e].to;
				const how = passes(e);
				if (how === 'source') volts[to] = stabV;
				else if (how === 'open') volts[to] = G[to] > 0 ? J[to] / G[to] : 0; // floating: settles at the earth side
				else {
					const r = edgeR(e);
					volts[to] = (volts[n] + r * J[to]) / (1 + r * G[to]);
				}
				up(to);
			}
		};
		up(0);
		return { volts, G, J };
	};

	// Earth-point voltages by superposition: v_k = R_k · Σ current of the loads on earth k.
	const E = c.earthCount;
	const currents = (earthV: number[], volts: number[]): number[] => {
		const sum = new Array<number>(E).fill(0);
		loads.forEach((l, i) => {
			if (loadOn(i)) sum[l.earth] += (volts[l.node] - earthV[l.earth]) * loadG(i);
		});
		return sum;
	};
	const solveAll = (regulating: boolean) => {
		const zero = new Array<number>(E).fill(0);
		const base = solveFeed(zero, regulating);
		const i0 = currents(zero, base.volts);
		// Residual f(v) = v − R·I(v) is affine in v: build its matrix column by column.
		const A: number[][] = Array.from({ length: E }, () => new Array<number>(E).fill(0));
		const b = new Array<number>(E).fill(0);
		for (let k = 0; k < E; k++) {
			const rk = earthR(k);
			b[k] = rk === Infinity ? 0 : rk * i0[k];
		}
		for (let m = 0; m < E; m++) {
			const unit = zero.map((_, i) => (i === m ? 1 : 0));
			const s = solveFeed(unit, regulating);
			const im = currents(unit, s.volts);
			for (let k = 0; k < E; k++) {
				const rk = earthR(k);
				A[k][m] = (k === m ? 1 : 0) - (rk === Infinity ? 0 : rk * (im[k] - i0[k]));
			}
		}
		const earthV = gauss(A, b);
		return { earthV, ...solveFeed(earthV, regulating) };
	};
	let s = solveAll(true);
	const stabIn = edges[nodes[c.stab].parent].from;
	// Below its set-point the stabilizer stays closed and passes its input through.
	if (stabState !== 'stuck-open' && s.volts[stabIn] < STABILIZED) s = solveAll(false);
	const earthTerminal = loads.map((l, i) => {
		// An open earth leaves the terminal floating, pulled up through the part to its feed.
		if (earthR(l.earth) === Infinity) return s.volts[l.node];
		return s.earthV[l.earth] + (s.volts[l.node] - s.earthV[l.earth]) * loadG(i) * R_EARTH_LEAD;
	});

	// Ohms with the battery off and the fuse pulled, from the fuse's load side to earth. A
	// cold stabilizer's contacts rest closed, so it passes unless stuck open.
	const ohmsBelow = (n: number): number => {
		let g = 0;
		const l = nodes[n].load;
		if (l >= 0 && loadOn(l)) g += 1 / (loads[l].r + R_EARTH_LEAD + earthR(loads[l].earth));
		if (shorted(n)) g += 1 / R_SHORT;
		for (const e of nodes[n].children) {
			const r = edgeR(e);
			if (r === Infinity || (edges[e].kind === 'stabilizer' && stabState === 'stuck-open')) continue;
			const gc = ohmsBelow(edges[e].to);
			g += gc / (1 + r * gc);
		}
		return g;
	};
	const ohms = c.fuseOuts.map((n) => {
		const g = ohmsBelow(n);
		return g < 1 / OVER_RANGE ? OVER_RANGE : 1 / g;
	});
	return { volts: s.volts, earthTerminal, ohms };
}

/** Gaussian elimination with partial pivoting (small dense systems). */
function gauss(A: number[][], b: number[]): number[] {
	const n = b.length;
	const M = A.map((row, i) => [...row, b[i]]);
	for (let col = 0; col < n; col++) {
		let p = col;
		for (let r = col + 1; r < n; r++) if (Math.abs(M[r][col]) > Math.abs(M[p][col])) p = r;
		[M[col], M[p]] = [M[p], M[col]];
		const d = M[col][col];
		if (Math.abs(d) < 1e-15) continue;
		for (let r = 0; r < n; r++) {
			if (r === col) continue;
			const f = M[r][col] / d;
			if (f !== 0) for (let k = col; k <= n; k++) M[r][k] -= f * M[col][k];
		}
	}
	return M.map((row, i) => (Math.abs(row[i]) < 1e-15 ? 0 : row[n] / row[i]));
}
