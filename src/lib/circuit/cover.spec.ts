import { describe, expect, it } from 'vitest';
import { ambiguityClasses, harmonic, minimalProbeSet } from './cover';
import { binReadings, type PredictionTable, type Tolerance } from './outcomes';
import { harnessTable, randomTable, rng } from './testing/tables';

const dmm20V: Tolerance = { abs: 0.02, rel: 0.005 }; // ±(0.5 % + 2 counts of 10 mV), from memory (TRADE.md)

// The definition, computed here independently of cover.ts: probe p separates suspects a and b
// when both have a defined reading and they fall in different bins of p.
function binOf(t: PredictionTable): number[][] {
	return t.probes.map((pr, p) => {
		const label = t.suspects.map(() => -1);
		binReadings(t.readings[p], pr.tolerance).bins.forEach((b, k) => b.suspects.forEach((s) => (label[s] = k)));
		return label;
	});
}
const separates = (label: number[][], p: number, a: number, b: number) => label[p][a] >= 0 && label[p][b] >= 0 && label[p][a] !== label[p][b];

function separablePairs(t: PredictionTable): [number, number][] {
	const label = binOf(t);
	const out: [number, number][] = [];
	for (let a = 0; a < t.suspects.length; a++)
		for (let b = a + 1; b < t.suspects.length; b++) if (t.probes.some((_, p) => separates(label, p, a, b))) out.push([a, b]);
	return out;
}

function coversAll(t: PredictionTable, probes: number[]): boolean {
	const label = binOf(t);
	return separablePairs(t).every(([a, b]) => probes.some((p) => separates(label, p, a, b)));
}

/** Cheapest cover by enumerating every subset of probes. */
function bruteForce(t: PredictionTable): number {
	let best = Infinity;
	const P = t.probes.length;
	const label = binOf(t);
	const pairs = separablePairs(t);
	for (let mask = 0; mask < 1 << P; mask++) {
		let c = 0;
		for (let p = 0; p < P; p++) if ((mask >> p) & 1) c += t.probes[p].cost;
		if (c >= best) continue;
		if (pairs.every(([a, b]) => t.probes.some((_, p) => (mask >> p) & 1 && separates(label, p, a, b)))) best = c;
	}
	return best;
}

describe('minimalProbeSet', () => {
	it('solves a four-suspect case worked by hand', () => {
		// Suspects A, B, C, D. X splits AB | CD (cost 1), Y splits AC | BD (cost 1), Z reads four
		// different values (cost 3), W splits A | BCD (cost 0.5). The 6 pairs: {X, Y} separates
		// all of them for 2; Z alone costs 3; W needs both X and Y for BC, BD, CD (2.5).
		// So the optimum is {X, Y} = 2.
		// Greedy first takes W (0.5 for 3 pairs, 0.17 a pair), then X (2 new pairs for 1), then Y
		// (CD for 1): 2.5; W is then redundant (AB by Y, AC and AD by X) and is dropped → 2.
		const table: PredictionTable = {
			suspects: ['A', 'B', 'C', 'D'].map((id) => ({ id, prior: 1 })),
			probes: [
				{ id: 'X', cost: 1, tolerance: dmm20V },
				{ id: 'Y', cost: 1, tolerance: dmm20V },
				{ id: 'Z', cost: 3, tolerance: dmm20V },
				{ id: 'W', cost: 0.5, tolerance: dmm20V }
			],
			readings: [
				[0, 0, 12, 12],
				[0, 12, 0, 12],
				[0, 4, 8, 12],
				[0, 12, 12, 12]
			]
		};
		const exact = minimalProbeSet(table);
		expect(exact).toMatchObject({ probes: ['X', 'Y'], cost: 2, exact: true, ambiguityGroups: [], pairsSeparated: 6, pairsSeparable: 6, pairsTotal: 6 });
		const greedy = minimalProbeSet(table, { exactLimit: 0 });
		expect(greedy.probes).toEqual(['X', 'Y']);
		expect(greedy.exact).toBe(false);
		// d = 6 (Z separates all pairs): Chvátal's ratio H(6) = 49/20.
		expect(greedy.bound?.ratio).toBeCloseTo(49 / 20, 12);
		// Without X and Y only Z separates B from C and D: Z alone (3) is cheaper than W + Z.
		expect(minimalProbeSet(table, { exclude: ['X', 'Y'] })).toMatchObject({ probes: ['Z'], cost: 3, exact: true });
	});

	it('names suspects with the same readings everywhere as one ambiguity group', () => {
		// Two shorts to earth behind one fuse: every powered probe reads 0 V beyond the blown fuse
		// for both, and the ohms reading differs by less than the meter resolves (common practice:
		// such shorts are found by inspecting the wiring).
		const table: PredictionTable = {
			suspects: ['fuse blown', 'short at junction 1', 'short at junction 2', 'lamp open'].map((id) => ({ id, prior: 1 })),
			probes: [
				{ id: 'volts at fuse out', cost: 3, tolerance: dmm20V },
				{ id: 'ohms at fuse out', cost: 5, tolerance: { abs: 0.3, rel: 0.008 } }
			],
			readings: [
				[0, 0, 0, 12.5],
				[2.4, 0.06, 0.08, 28.9]
			]
		};
		const r = minimalProbeSet(table);
		expect(r.ambiguityGroups).toEqual([['short at junction 1', 'short at junction 2']]);
		// The ohms reading alone separates all five other pairs (2.4 Ω, ≈0.07 Ω, 28.9 Ω bins).
		expect(r.probes).toEqual(['ohms at fuse out']);
		expect(r.pairsSeparable).toBe(5);
		expect(r.pairsSeparated).toBe(5);
	});

	// 240 generated tables: exact equals enumeration, greedy stays within Chvátal's bound, and
	// every result separates every separable pair (checked by the definition above).
	it('matches a brute-force minimum on 240 generated tables', () => {
		const random = rng(1979);
		let greedyWorse = 0;
		for (let k = 0; k < 240; k++) {
			const t = randomTable(random, {
				suspects: 2 + Math.floor(random() * 8),
				probes: 1 + Math.floor(random() * 10),
				nullRate: k % 2 === 0 ? 0 : 0.15,
				wholeCosts: k % 3 === 0
			});
			const opt = bruteForce(t);
			const pairs = separablePairs(t).length;
			const exact = minimalProbeSet(t);
			expect(exact.exact).toBe(true);
			expect(exact.cost).toBeCloseTo(opt, 9);
			expect(exact.cost).toBeCloseTo(exact.probeIndices.reduce((s, p) => s + t.probes[p].cost, 0), 9);
			expect(coversAll(t, exact.probeIndices)).toBe(true);
			expect(exact.pairsSeparable).toBe(pairs);
			expect(exact.pairsSeparated).toBe(pairs);
			const greedy = minimalProbeSet(t, { exactLimit: 0 });
			expect(coversAll(t, greedy.probeIndices)).toBe(true);
			// Chvátal 1979: greedy ≤ H(d) · OPT ≤ H(m) · OPT, m the separable pairs.
			if (pairs > 0) {
				expect(greedy.bound).toBeDefined();
				expect(greedy.cost).toBeLessThanOrEqual(greedy.bound!.ratio * opt + 1e-9);
				expect(greedy.cost).toBeLessThanOrEqual(harmonic(pairs) * opt + 1e-9);
				expect(greedy.bound!.lowerBound).toBeLessThanOrEqual(opt + 1e-9);
			}
			if (greedy.cost > opt + 1e-9) greedyWorse++;
		}
		// The generator must produce cases where greedy is not optimal, or the bound is untested.
		expect(greedyWorse).toBeGreaterThan(0);
	});

	it('falls back to the best cover found, with its bound, when the search runs out of nodes', () => {
		const t = randomTable(rng(7), { suspects: 9, probes: 10 });
		const opt = bruteForce(t);
		const r = minimalProbeSet(t, { maxNodes: 1 });
		expect(r.exact).toBe(false);
		expect(coversAll(t, r.probeIndices)).toBe(true);
		expect(r.cost).toBeLessThanOrEqual(r.bound!.ratio * opt + 1e-9);
		expect(r.bound!.lowerBound).toBeLessThanOrEqual(opt + 1e-9);
	});

	it('finishes exactly on a 40-suspect harness', () => {
		const { table } = harnessTable(rng(1), { suspects: 40 });
		expect(table.suspects.length).toBe(40);
		const r = minimalProbeSet(table);
		expect(r.exact).toBe(true);
		expect(coversAll(table, r.probeIndices)).toBe(true);
		expect(r.pairsSeparated).toBe(separablePairs(table).length);
		// The greedy cover is never cheaper than a proven minimum.
		expect(minimalProbeSet(table, { exactLimit: 0 }).cost).toBeGreaterThanOrEqual(r.cost - 1e-9);
	});

	it('finishes exactly on 40 suspects that explain one symptom, with 120 probes', () => {
		const { table } = harnessTable(rng(4), { suspects: 40, symptom: true, probes: 120 });
		expect(table.probes.length).toBe(120);
		const r = minimalProbeSet(table);
		expect(r.exact).toBe(true);
		expect(coversAll(table, r.probeIndices)).toBe(true);
	});

	it('rejects an unknown probe id in exclude, and a bad table with the path', () => {
		const t = randomTable(rng(3), { suspects: 3, probes: 2 });
		expect(() => minimalProbeSet(t, { exclude: ['nope'] })).toThrow(/minimalProbeSet: exclude names probe "nope"/);
		t.readings[1][2] = Number.NaN;
		expect(() => minimalProbeSet(t)).toThrow(/readings\[1\]\[2\]: must be a finite number or null/);
	});
});

describe('ambiguityClasses', () => {
	// By definition: the classes partition the suspects; across classes every pair is separated
	// by some probe; inside a class suspects are linked by pairs no probe separates, and with no
	// undefined readings no pair inside a class is separated at all.
	it('agrees with the definition on 200 generated tables', () => {
		const random = rng(60757);
		for (let k = 0; k < 200; k++) {
			const withNulls = k % 2 === 1;
			const t = randomTable(random, { suspects: 2 + Math.floor(random() * 10), probes: 1 + Math.floor(random() * 6), nullRate: withNulls ? 0.2 : 0 });
			const label = binOf(t);
			const apart = (a: number, b: number) => t.probes.some((_, p) => separates(label, p, a, b));
			const classes = ambiguityClasses(t);
			expect(classes.flat().sort((a, b) => a - b)).toEqual(t.suspects.map((_, i) => i));
			const classOf = new Map<number, number>();
			classes.forEach((c, i) => c.forEach((s) => classOf.set(s, i)));
			for (let a = 0; a < t.suspects.length; a++)
				for (let b = a + 1; b < t.suspects.length; b++) {
					if (classOf.get(a) !== classOf.get(b)) expect(apart(a, b)).toBe(true);
					else if (!withNulls) expect(apart(a, b)).toBe(false);
				}
			// Connected: inside each class, "not separated" links every member to the first.
			for (const c of classes) {
				const reached = new Set([c[0]]);
				for (let grew = true; grew; ) {
					grew = false;
					for (const s of c) if (!reached.has(s) && [...reached].some((r) => !apart(r, s))) (reached.add(s), (grew = true));
				}
				expect(reached.size).toBe(c.length);
			}
		}
	});
});
