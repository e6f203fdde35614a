import { describe, expect, it } from 'vitest';
import { ambiguityClasses } from './cover';
import { binReadings, placeReading, type PredictionTable, type Tolerance } from './outcomes';
import { buildPlan, checklist, expectedProbesLowerBound, huffmanExpectedLength, huffmanLowerBound, leaves, optimalExpected, pointByPointWalk, replan, type Objective, type PlanNode } from './plan';
import { floorBound, separationLowerBound } from './plan-bounds';
import { harnessTable, randomTable, rng } from './testing/tables';

const dmm20V: Tolerance = { abs: 0.02, rel: 0.005 }; // ±(0.5 % + 2 counts of 10 mV), from memory (TRADE.md)

/** Four equally likely suspects; P1 and P2 split them in halves, Q4 reads four levels. */
function fourSuspects(q4Cost: number): PredictionTable {
	return {
		suspects: ['A', 'B', 'C', 'D'].map((id) => ({ id, prior: 1 })),
		probes: [
			{ id: 'P1', cost: 1, tolerance: dmm20V, unit: 'V' },
			{ id: 'P2', cost: 1, tolerance: dmm20V, unit: 'V' },
			{ id: 'Q4', cost: q4Cost, tolerance: dmm20V, unit: 'V' }
		],
		readings: [
			[0, 0, 12, 12],
			[0, 12, 0, 12],
			[0, 4, 8, 12]
		]
	};
}

/** Follows the plan with the readings a suspect predicts; returns the leaf reached. */
function follow(t: PredictionTable, node: PlanNode, s: number): PlanNode {
	while (node.kind === 'probe') {
		const r = t.readings[node.probe][s];
		expect(r).not.toBeNull();
		const bins = { bins: node.outcomes.map((o) => o.bin), unread: node.unread };
		const k = placeReading(bins, r!);
		expect(k).not.toBeNull();
		node = node.outcomes[k!].next;
	}
	return node;
}

describe('buildPlan (worked by hand)', () => {
	// Four equally likely suspects hold H = log2 4 = 2 bits. Q4 yields all 2 bits, P1 or P2
	// yields 1 bit (two equal halves). Information per cost: Q4 = 2 / cost, P1 = P2 = 1 / 1.
	it('takes the four-way probe when its information per cost is higher', () => {
		// Q4 at cost 1.5: 2 / 1.5 = 1.33 bits per unit > 1 → one probe, which meets the lower
		// bound H / log2 K = 2 / log2 4 = 1 exactly.
		const t = fourSuspects(1.5);
		const plan = buildPlan(t);
		expect(plan.root.kind === 'probe' && t.probes[plan.root.probe].id).toBe('Q4');
		expect(plan.root.kind === 'probe' && plan.root.gain).toBeCloseTo(2, 12);
		expect(plan.expectedProbes).toBeCloseTo(1, 12);
		expect(plan.expectedCost).toBeCloseTo(1.5, 12);
		expect(expectedProbesLowerBound(t)).toEqual({ probes: 1, entropyBits: 2, maxOutcomes: 4 });
	});

	it('prefers two cheap halving probes when the four-way probe costs too much', () => {
		// Q4 at cost 3: 2 / 3 = 0.67 < 1 → P1 first (ties with P2 in gain and cost; table order).
		// Each half then holds A, B or C, D: P2 gives 1 bit for 1, Q4 1 bit for 3 → P2.
		// Two probes for cost 2 always, cheaper than Q4's 3.
		const t = fourSuspects(3);
		const plan = buildPlan(t);
		expect(plan.steps).toBe(3);
		expect(plan.expectedProbes).toBeCloseTo(2, 12);
		expect(plan.expectedCost).toBeCloseTo(2, 12);
		const steps = checklist(t, plan, 2);
		// ±0.02 V at 0 V; ±(0.06 + 0.02) V at 12 V.
		expect(steps.map((s) => [s.step, s.probe, s.outcomes.map((o) => o.text)])).toEqual([
			[1, 'P1', ['\u22120.02 to 0.02 V: go to step 2', '11.92–12.08 V: go to step 3']],
			[2, 'P2', ['\u22120.02 to 0.02 V: found — A', '11.92–12.08 V: found — B']],
			[3, 'P2', ['\u22120.02 to 0.02 V: found — C', '11.92–12.08 V: found — D']]
		]);
		expect(steps[0].outcomes.map((o) => o.chance)).toEqual([0.5, 0.5]);
		expect(steps[1].expected.map((e) => [e.suspect, e.reading, e.chance])).toEqual([
			['A', 0, 0.5],
			['B', 12, 0.5]
		]);
	});

	it('meets the bound exactly for dyadic priors', () => {
		// Priors 1/2, 1/4, 1/8, 1/8: H = 1.75 bits. Each probe isolates one suspect (K = 2), so the
		// bound is 1.75 probes. Information first: isolating A splits 1/2 | 1/2 (1 bit), better
		// than B (H(1/4) = 0.81) or C (H(1/8) = 0.54). Then B among B, C, D (1/2 | 1/2), then C.
		// Expected probes 1/2·1 + 1/4·2 + 1/4·3 = 1.75: Shannon's bound is tight for dyadic
		// chances (Cover & Thomas, "Elements of Information Theory", 2nd ed., §5.3).
		const t: PredictionTable = {
			suspects: [
				{ id: 'A', prior: 0.5 },
				{ id: 'B', prior: 0.25 },
				{ id: 'C', prior: 0.125 },
				{ id: 'D', prior: 0.125 }
			],
			probes: ['isolates C', 'isolates B', 'isolates A'].map((id) => ({ id, cost: 1, tolerance: dmm20V })),
			readings: [
				[12, 12, 0, 12],
				[12, 0, 12, 12],
				[0, 12, 12, 12]
			]
		};
		const plan = buildPlan(t);
		expect(plan.expectedProbes).toBeCloseTo(1.75, 12);
		const lb = expectedProbesLowerBound(t);
		expect(lb.entropyBits).toBeCloseTo(1.75, 12);
		expect(lb.probes).toBeCloseTo(1.75, 12);
		expect(checklist(t, plan).map((s) => s.probe)).toEqual(['isolates A', 'isolates B', 'isolates C']);
	});

	it('ends on an ambiguity group when no probe tells the rest apart', () => {
		// Two shorts behind one fuse read the same everywhere (see cover.spec.ts).
		const t: PredictionTable = {
			suspects: ['fuse blown', 'short at junction 1', 'short at junction 2'].map((id) => ({ id, prior: 1 })),
			probes: [{ id: 'ohms', cost: 5, tolerance: { abs: 0.3, rel: 0.008 }, unit: 'Ω' }],
			readings: [[2.4, 0.06, 0.08]]
		};
		const plan = buildPlan(t);
		const kinds = leaves(plan.root).map((l) => [l.kind, l.suspects]);
		expect(kinds).toEqual([
			['ambiguous', [1, 2]],
			['found', [0]]
		]);
		expect(checklist(t, plan, 1)[0].outcomes[0].text).toBe(
			'\u22120.2 to 0.4 Ω: cannot be told apart with a meter: replace or inspect — short at junction 1, short at junction 2'
		);
		// Lower bound: classes {fuse} 1/3 and {shorts} 2/3 → H = 0.918 bits, K = 2.
		expect(expectedProbesLowerBound(t).probes).toBeCloseTo(-(1 / 3) * Math.log2(1 / 3) - (2 / 3) * Math.log2(2 / 3), 12);
	});

	it('cuts branches at the depth limit and marks them unresolved', () => {
		const t = fourSuspects(3);
		const plan = buildPlan(t, { maxDepth: 1 });
		expect(leaves(plan.root).map((l) => l.kind)).toEqual(['unresolved', 'unresolved']);
		expect(plan.unresolvedMass).toBeCloseTo(1, 12);
		expect(checklist(t, plan)[0].outcomes[0].text).toBe('\u22120.02 to 0.02 V: enter the readings so far to plan again — A, B');
	});

	it('rejects bad options with the field named', () => {
		const t = fourSuspects(3);
		expect(() => buildPlan(t, { exclude: ['P9'] })).toThrow(/buildPlan: exclude\[0\] names probe "P9"/);
		expect(() => buildPlan(t, { weights: [1, 1, 1] })).toThrow(/weights has 3 entries, expected one per suspect \(4\)/);
		expect(() => buildPlan(t, { weights: [1, -1, 1, 1] })).toThrow(/weights\[1\] must be a finite number ≥ 0/);
	});
});

describe('buildPlan on generated tables', () => {
	// Checked by definition on every case: the plan's expected probe count is at least Shannon's
	// bound; each suspect, read as predicted, ends on a leaf that holds it; leaf chances sum to 1.
	it('is sound and never beats the lower bound', () => {
		const random = rng(1948);
		for (let k = 0; k < 120; k++) {
			const withNulls = k % 3 === 2;
			const t = randomTable(random, { suspects: 2 + Math.floor(random() * 14), probes: 1 + Math.floor(random() * 8), nullRate: withNulls ? 0.15 : 0 });
			const plan = buildPlan(t, { maxDepth: 100 });
			expect(plan.unresolvedMass).toBe(0);
			const lb = expectedProbesLowerBound(t);
			expect(plan.expectedProbes).toBeGreaterThanOrEqual(lb.probes - 1e-9);
			expect(leaves(plan.root).reduce((a, l) => a + l.mass, 0)).toBeCloseTo(1, 9);
			if (!withNulls) t.suspects.forEach((_, s) => expect(follow(t, plan.root, s).suspects).toContain(s));
		}
	});

	it('plans a 40-suspect harness with fewer probes than the point-by-point walk', () => {
		const { table, walkOrder } = harnessTable(rng(2), { suspects: 40 });
		const plan = buildPlan(table, { maxDepth: 100 });
		expect(plan.unresolvedMass).toBe(0);
		table.suspects.forEach((_, s) => expect(follow(table, plan.root, s).suspects).toContain(s));
		const walk = pointByPointWalk(table, walkOrder);
		expect(plan.expectedProbes).toBeGreaterThanOrEqual(expectedProbesLowerBound(table).probes);
		expect(plan.expectedProbes).toBeLessThan(walk.expectedProbes);
	});
});

describe('pointByPointWalk (worked by hand)', () => {
	it('counts the probes taken in order until the fault is located', () => {
		const t = fourSuspects(3);
		// P1 then P2: two readings locate any of the four; Q4 is never needed.
		expect(pointByPointWalk(t, ['P1', 'P2', 'Q4'])).toEqual({ expectedProbes: 2, expectedCost: 2, unlocatedMass: 0 });
		// Q4 first locates everything at once.
		expect(pointByPointWalk(t, ['Q4', 'P1'])).toEqual({ expectedProbes: 1, expectedCost: 3, unlocatedMass: 0 });
		// P1 alone leaves each suspect with its partner.
		expect(pointByPointWalk(t, ['P1'])).toEqual({ expectedProbes: 1, expectedCost: 1, unlocatedMass: 1 });
		expect(() => pointByPointWalk(t, ['P1', 'nope'])).toThrow(/order\[1\] names probe "nope"/);
	});
});

describe('replan', () => {
	// Gauges behind a bimetal stabilizer (TRADE.md): healthy ≈ 10 V average, stuck closed =
	// battery voltage, stuck open = 0, a tired bimetal reads low (8 V, invented). The swing of
	// ±1 V on the display is an invented band. t(10) = 1.07, t(8) = 1.06, t(12.6) = 1.083.
	const gauges: PredictionTable = {
		suspects: ['healthy', 'stuck closed', 'stuck open', 'low output', 'gauge open'].map((id) => ({ id, prior: 1 })),
		probes: [
			{ id: 'gauge feed', cost: 3, tolerance: { ...dmm20V, band: 1 }, unit: 'V' },
			{ id: 'sender wire', cost: 1, tolerance: dmm20V, unit: 'V' }
		],
		readings: [
			[10, 12.6, 0, 8, null],
			[6, 7, 0, 5, 0]
		]
	};

	it('drops suspects whose prediction is far outside tolerance of the reading', () => {
		// 10.4 V: healthy |0.4| ≤ 1.07 stays. Low output's interval ends at 9.06 V: 1.34 V short,
		// σ = 0.072 (meter at 10.4 V) + 1 % of 10.4 V (model) = 0.176, z = 7.6, fit ≈ 10⁻¹³;
		// stuck closed (from 11.517 V) and stuck open go the same way. "Gauge open" has no defined
		// feed reading: it stays, at weight ÷ K, K = 3 bins (healthy and low output overlap).
		// Chances 1 : 1/3 → 0.75 and 0.25.
		const r = replan(gauges, [{ probe: 'gauge feed', reading: 10.4 }]);
		expect(r.remaining).toEqual([
			{ suspect: 'healthy', chance: expect.closeTo(0.75, 12) },
			{ suspect: 'gauge open', chance: expect.closeTo(0.25, 12) }
		]);
		expect(r.dropped.map((d) => d.suspect)).toEqual(['stuck closed', 'stuck open', 'low output']);
		expect(r.unexplained).toEqual([]);
		// The sender wire (6 V vs 0 V) tells the two apart next.
		expect(r.plan.root.kind === 'probe' && r.table.probes[r.plan.root.probe].id).toBe('sender wire');
		expect(r.table.suspects.map((s) => s.id)).toEqual(['healthy', 'gauge open']);
	});

	it('keeps both suspects a reading cannot split, at their prior odds', () => {
		// 9.0 V: healthy |1.0| ≤ 1.07 and low output |1.0| ≤ 1.06 both hold it: neither is favoured.
		const r = replan(gauges, [{ probe: 'gauge feed', reading: 9 }]);
		expect(r.remaining.map((s) => s.suspect)).toEqual(['healthy', 'low output', 'gauge open']);
		expect(r.remaining[0].chance).toBeCloseTo(r.remaining[1].chance, 12);
	});

	it('lowers a suspect a reading falls just beyond, without removing it', () => {
		// Sender wire 6.08 V: healthy (6 V, accepts 5.95–6.05) is 0.03 V short. σ = 0.0504 (meter)
		// + 1 % of 6.08 = 0.111, z = 0.27; stuck closed (7 V, from 6.945) is 0.865 V off, z = 7.8.
		// No interval holds the reading, so it is reported, and the suspects are weighed against
		// the nearest: healthy keeps fit 1, stuck closed is out.
		const r = replan(gauges, [{ probe: 'sender wire', reading: 6.08 }]);
		expect(r.remaining[0]).toEqual({ suspect: 'healthy', chance: 1, outside: true });
		expect(r.unexplained).toEqual([{ probe: 'sender wire', reading: 6.08, reason: 'no suspect predicts it', nearest: ['healthy'] }]);
		// Inside the interval near its edge: 6.04 V is held, and 7 V's suspect is ruled out.
		const inside = replan(gauges, [{ probe: 'sender wire', reading: 6.04 }]);
		expect(inside.unexplained).toEqual([]);
		expect(inside.remaining.map((x) => x.suspect)).toEqual(['healthy']);
	});

	it('weighs a reading inside a suspect\'s band as fully consistent (bands widen the interval)', () => {
		// A battery at rest spans 11.89–12.65 V (BCI table at 80 °F, TRADE.md); a run-down one
		// reads 10.8–11.2 V (invented band). 12.2 V lies inside the first band: no longer refused,
		// and 0.92 V beyond the second (σ = 0.203 V, z = 4.5): that one is ruled out.
		const t: PredictionTable = {
			suspects: [{ id: 'healthy', prior: 1 }, { id: 'run down', prior: 1 }],
			probes: [{ id: 'battery', cost: 1, tolerance: dmm20V, unit: 'V' }],
			readings: [[12.6, 11]],
			bands: [[{ low: 11.89, high: 12.65 }, { low: 10.8, high: 11.2 }]]
		};
		const r = replan(t, [{ probe: 'battery', reading: 12.2 }]);
		expect(r.unexplained).toEqual([]);
		expect(r.remaining.map((x) => x.suspect)).toEqual(['healthy']);
		// Without the band, 12.2 V is 0.32 V from 12.6 V (t = 0.083): the reading would be outside.
		const point = replan({ ...t, bands: undefined }, [{ probe: 'battery', reading: 12.2 }]);
		expect(point.unexplained).toHaveLength(1);
	});

	it('reports a reading no suspect predicts and goes on with the nearest suspects', () => {
		// 3 V on the sender wire: predictions are 0, 5, 6, 7 V (±0.02–0.055 V). The nearest, low
		// output at 5 V, is 1.955 V away; σ widens to that, so healthy (2.95 V) keeps fit 0.53,
		// stuck closed (3.945 V) 0.21: nobody is ruled out by a reading the model cannot place.
		const r = replan(gauges, [{ probe: 'sender wire', reading: 3 }]);
		expect(r.unexplained).toEqual([{ probe: 'sender wire', reading: 3, reason: 'no suspect predicts it', nearest: ['healthy', 'stuck open', 'low output', 'gauge open'] }]);
		expect(r.remaining).toHaveLength(5);
		expect(r.remaining[0].suspect).toBe('low output');
		expect(r.remaining.every((x) => x.outside)).toBe(true);
		expect(r.dropped).toEqual([]);
		// 7 V on the sender wire is what "stuck closed" predicts, ruled out by 10.4 V already.
		const later = replan(gauges, [
			{ probe: 'gauge feed', reading: 10.4 },
			{ probe: 'sender wire', reading: 7 }
		]);
		expect(later.unexplained).toEqual([{ probe: 'sender wire', reading: 7, reason: 'contradicts the earlier readings', nearest: ['healthy'] }]);
	});

	it('plans without a probe reported unreachable', () => {
		const first = buildPlan(gauges);
		expect(first.root.kind === 'probe' && gauges.probes[first.root.probe].id).toBe('sender wire');
		const r = replan(gauges, [{ probe: 'sender wire', unreachable: true }]);
		expect(r.unavailable).toEqual(['sender wire']);
		const used = new Set<string>();
		const walk = (n: PlanNode): void => {
			if (n.kind !== 'probe') return;
			used.add(r.table.probes[n.probe].id);
			n.outcomes.forEach((o) => walk(o.next));
		};
		walk(r.plan.root);
		expect([...used]).toEqual(['gauge feed']);
		expect(() => replan(gauges, [{ probe: 'tank sender', reading: 1 }])).toThrow(/readingsTaken\[0\]\.probe names probe "tank sender"/);
	});
});

describe('Huffman lower bound', () => {
	// Worked by hand (the merging rule of Huffman 1952): chances 0.4, 0.3, 0.2, 0.1 with K = 2
	// merge 0.1 + 0.2 = 0.3, then 0.3 + 0.3 = 0.6, then 0.4 + 0.6 = 1: lengths 1, 2, 3, 3 and an
	// expected length of 0.4 + 0.6 + 0.9 + 0.3 = 1.9 = 0.3 + 0.6 + 1.
	it('expected length of a worked binary example', () => {
		expect(huffmanExpectedLength([0.4, 0.3, 0.2, 0.1], 2)).toBeCloseTo(1.9, 12);
		// K = 3 on five equal chances: pad to 5 (already 5 − 1 = 4, a multiple of 2), merge three
		// of 0.2 (0.6), then 0.2, 0.2, 0.6 → 1: lengths 1, 1, 2, 2, 2 → 1.6.
		expect(huffmanExpectedLength([0.2, 0.2, 0.2, 0.2, 0.2], 3)).toBeCloseTo(1.6, 12);
	});

	// Against enumeration: the least Σ pᵢℓᵢ over whole lengths with Σ K^−ℓᵢ ≤ 1 (Kraft–McMillan:
	// exactly the lengths a K-ary prefix code can have; Cover & Thomas, "Elements of Information
	// Theory", Thm 5.2.1 and 5.5.1).
	it('equals the best prefix code found by enumeration on 200 random small distributions', () => {
		const random = rng(4242);
		for (let c = 0; c < 200; c++) {
			const n = 2 + Math.floor(random() * 5);
			const K = 2 + Math.floor(random() * 3);
			const p = Array.from({ length: n }, () => 0.05 + random());
			const total = p.reduce((a, b) => a + b, 0);
			const q = p.map((x) => x / total);
			let best = Infinity;
			const len = new Array(n).fill(1);
			const walk = (i: number) => {
				if (i === n) {
					if (len.reduce((a, l) => a + K ** -l, 0) <= 1 + 1e-12) best = Math.min(best, len.reduce((a, l, j) => a + l * q[j], 0));
					return;
				}
				for (let l = 1; l <= n; l++) {
					len[i] = l;
					walk(i + 1);
				}
			};
			walk(0);
			expect(huffmanExpectedLength(q, K)).toBeCloseTo(best, 9);
		}
	});

	// Against the best plan found by enumeration (every probe at every point, all suspects read):
	// the bound is never above it, and never below the entropy bound.
	it('is at most the optimal plan and at least the entropy bound on 150 random small tables', () => {
		const random = rng(99);
		for (let c = 0; c < 150; c++) {
			const t = randomTable(random, { suspects: 2 + Math.floor(random() * 5), probes: 1 + Math.floor(random() * 4) });
			const n = t.suspects.length;
			const total = t.suspects.reduce((a, s) => a + s.prior, 0);
			const w = t.suspects.map((s) => s.prior / total);
			const classOf = new Int32Array(n);
			ambiguityClasses(t).forEach((cl, k) => cl.forEach((s) => (classOf[s] = k)));
			const memo = new Map<number, number>();
			// E(S): expected probes from point S, weighted by the absolute chance of reaching it.
			const best = (members: number[]): number => {
				const key = members.reduce((m, s) => m | (1 << s), 0);
				const got = memo.get(key);
				if (got !== undefined) return got;
				let value = 0;
				if (!members.every((s) => classOf[s] === classOf[members[0]])) {
					const mass = members.reduce((a, s) => a + w[s], 0);
					let least = Infinity;
					t.probes.forEach((probe, p) => {
						const { bins } = binReadings(t.readings[p], probe.tolerance, members);
						if (bins.length < 2) return;
						least = Math.min(least, mass + bins.reduce((a, b) => a + best(b.suspects), 0));
					});
					value = Number.isFinite(least) ? least : 0;
				}
				memo.set(key, value);
				return value;
			};
			const optimal = best(t.suspects.map((_, s) => s));
			const h = huffmanLowerBound(t);
			expect(h.probes).toBeLessThanOrEqual(optimal + 1e-9);
			expect(h.probes).toBeGreaterThanOrEqual(expectedProbesLowerBound(t).probes - 1e-9);
			expect(buildPlan(t).expectedProbes).toBeGreaterThanOrEqual(h.probes - 1e-9);
		}
	});
});

/**
 * Least expected cost of any complete plan, by enumerating every probe at every point: bins from
 * outcomes.ts binReadings, unread suspects at weight ÷ K into every branch (as plan.ts
 * describes), a point with no probe of two or more bins a leaf. Absolute weights in, so the
 * root's value is the expectation.
 */
function enumeratedOptimum(t: PredictionTable, objective: Objective): number {
	const memo = new Map<string, number>();
	const total = t.suspects.reduce((a, s) => a + s.prior, 0);
	const rec = (members: number[], w: number[]): number => {
		const key = members.map((s, i) => `${s}:${w[i]}`).join(',');
		const got = memo.get(key);
		if (got !== undefined) return got;
		const mass = w.reduce((a, b) => a + b, 0);
		const weightOf = new Map(members.map((s, i) => [s, w[i]]));
		let least = Infinity;
		t.probes.forEach((probe, p) => {
			const { bins, unread } = binReadings(t.readings[p], probe.tolerance, members);
			if (bins.length < 2) return;
			let v = (objective === 'probes' ? 1 : probe.cost) * mass;
			for (const b of bins) {
				const next = [...b.suspects, ...unread].sort((x, y) => x - y);
				v += rec(
					next,
					next.map((s) => (unread.includes(s) ? weightOf.get(s)! / bins.length : weightOf.get(s)!))
				);
			}
			least = Math.min(least, v);
		});
		const value = Number.isFinite(least) ? least : 0;
		memo.set(key, value);
		return value;
	};
	return rec(
		t.suspects.map((_, s) => s),
		t.suspects.map((s) => s.prior / total)
	);
}

describe('exact search and lookahead', () => {
	// The exact search (plan-search.ts) against the enumeration above, on both objectives, with
	// and without undefined readings.
	it('the exact optimum equals the enumerated optimum on 150 random tables of up to 7 suspects', () => {
		const random = rng(1976);
		for (let c = 0; c < 150; c++) {
			const t = randomTable(random, { suspects: 2 + Math.floor(random() * 6), probes: 1 + Math.floor(random() * 5), nullRate: c % 4 === 3 ? 0.15 : 0, wholeCosts: c % 5 === 0 });
			for (const objective of ['probes', 'cost'] as const) {
				const want = enumeratedOptimum(t, objective);
				const got = optimalExpected(t, { objective });
				expect(got.proven).toBe(true);
				expect(got.value).toBeCloseTo(want, 9);
				expect(got.lower).toBeCloseTo(want, 9);
			}
		}
	});

	// Bound ≤ optimum ≤ plan; on tables no larger than the exact search's limit the plan is the
	// optimum; everywhere the lookahead plan is no worse than the one-step plan on the figure it
	// was built for (the rollout's cost-improvement property: plan-search.ts header).
	it('bound ≤ optimum ≤ plan, and the lookahead plan is never worse than the one-step plan, on 150 random tables', () => {
		const random = rng(1997);
		for (let c = 0; c < 150; c++) {
			const withNulls = c % 3 === 2;
			const n = 2 + Math.floor(random() * 15);
			const t = randomTable(random, { suspects: n, probes: 1 + Math.floor(random() * 8), nullRate: withNulls ? 0.15 : 0, wholeCosts: c % 4 === 0 });
			const huffman = huffmanLowerBound(t).probes;
			const separation = separationLowerBound(t);
			for (const objective of ['probes', 'cost'] as const) {
				const figure = (p: ReturnType<typeof buildPlan>) => (objective === 'probes' ? p.expectedProbes : p.expectedCost);
				const opt = optimalExpected(t, { objective });
				expect(opt.proven).toBe(true);
				const oneStep = buildPlan(t, { objective, lookahead: false, maxDepth: 100 });
				// Small limits so that exact points, rollout points and one-step points all occur.
				const mixed = buildPlan(t, { objective, lookahead: { exactUpTo: 4, rolloutUpTo: 9, candidates: 3 }, maxDepth: 100 });
				const full = buildPlan(t, { objective, maxDepth: 100 });
				for (const p of [oneStep, mixed, full]) {
					expect(p.unresolvedMass).toBe(0);
					expect(figure(p)).toBeGreaterThanOrEqual(opt.value - 1e-9);
				}
				expect(figure(mixed)).toBeLessThanOrEqual(figure(oneStep) + 1e-9);
				expect(figure(full)).toBeLessThanOrEqual(figure(oneStep) + 1e-9);
				if (n <= 12) expect(figure(full)).toBeCloseTo(opt.value, 9);
				if (objective === 'probes') {
					expect(huffman).toBeLessThanOrEqual(opt.value + 1e-9);
					expect(separation.probes).toBeLessThanOrEqual(opt.value + 1e-9);
				} else expect(separation.cost).toBeLessThanOrEqual(opt.value + 1e-9);
				// Read as predicted, every suspect still ends on a leaf that holds it.
				if (!withNulls) t.suspects.forEach((_, s) => expect(follow(t, full.root, s).suspects).toContain(s));
			}
		}
	});

	it('keeps the hand-worked choices: the four-way probe at cost 1.5, the halving pair at cost 3', () => {
		// Worked above: at cost 1.5 one Q4 reading (cost 1.5) beats two halving probes (cost 2);
		// at cost 3 the halving pair (cost 2) wins. Counting probes, Q4 wins at any cost (1 < 2).
		expect(buildPlan(fourSuspects(1.5)).expectedCost).toBeCloseTo(1.5, 12);
		expect(buildPlan(fourSuspects(3)).expectedCost).toBeCloseTo(2, 12);
		const byProbes = buildPlan(fourSuspects(3), { objective: 'probes' });
		expect(byProbes.root.kind === 'probe' && fourSuspects(3).probes[byProbes.root.probe].id).toBe('Q4');
		expect(byProbes.expectedProbes).toBeCloseTo(1, 12);
		expect(byProbes.expectedCost).toBeCloseTo(3, 12);
		expect(() => buildPlan(fourSuspects(3), { objective: 'time' as Objective })).toThrow(/objective must be "cost" or "probes"/);
	});

	it('beats the one-step rule where the most informative probe leaves an awkward rest (worked by hand)', () => {
		// Six equally likely suspects. "first" reads B C F 0 V, A E 6 V, D 12 V (groups of 3, 2, 1:
		// H = 1/2 + 1/3·log2 3 + 1/6·log2 6 = 1.459 bits); "second" reads A 0 V, C D E F 6 V, B 12 V
		// (1, 4, 1: H = 1/3·log2 6 + 2/3·log2 1.5 = 1.252 bits). C and F read alike on both.
		// One-step: "first" (more bits), then "second" on B C F and on A E: 1 + 5/6 = 1.833 probes.
		// Better: "second" first finds A or B at once, then "first" on C D E F: 1 + 4/6 = 1.667.
		// Huffman bound, K = 3, classes A B D E (1/6 each) and C F (1/3): merge 1/6·3 = 1/2, then
		// 1/6 + 1/3 + 1/2 = 1: 1.5 probes.
		const t: PredictionTable = {
			suspects: ['A', 'B', 'C', 'D', 'E', 'F'].map((id) => ({ id, prior: 1 })),
			probes: ['first', 'second'].map((id) => ({ id, cost: 1, tolerance: dmm20V })),
			readings: [
				[6, 0, 0, 12, 6, 0],
				[0, 12, 6, 6, 6, 6]
			]
		};
		expect(buildPlan(t, { lookahead: false }).expectedProbes).toBeCloseTo(11 / 6, 12);
		const plan = buildPlan(t);
		expect(plan.root.kind === 'probe' && t.probes[plan.root.probe].id).toBe('second');
		expect(plan.expectedProbes).toBeCloseTo(10 / 6, 12);
		expect(optimalExpected(t, { objective: 'probes' }).value).toBeCloseTo(10 / 6, 12);
		expect(enumeratedOptimum(t, 'probes')).toBeCloseTo(10 / 6, 12);
		expect(huffmanLowerBound(t).probes).toBeCloseTo(1.5, 12);
	});
});

describe('separation bound', () => {
	// Worked by hand: five equally likely suspects, each told apart from all the others by its
	// own probe only (0 V for it, 12 V for the rest). Each needs one probe (its own): Σ w d = 1.
	// Huffman, K = 2, five chances of 1/5: merges 2/5, 2/5, 3/5, 1 → 2.4. Any plan is a chain
	// (each probe finds one suspect): depths 1, 2, 3, 4, 4 → 2.8, the optimum.
	const chain: PredictionTable = {
		suspects: ['a', 'b', 'c', 'd', 'e'].map((id) => ({ id, prior: 1 })),
		probes: ['a', 'b', 'c', 'd', 'e'].map((id) => ({ id: `isolates ${id}`, cost: 1, tolerance: dmm20V })),
		readings: [0, 1, 2, 3, 4].map((k) => [0, 1, 2, 3, 4].map((s) => (s === k ? 0 : 12)))
	};
	it('lies between the Huffman bound and the optimum on a worked chain', () => {
		const b = separationLowerBound(chain);
		expect(b.separationProbes).toBeCloseTo(1, 12);
		expect(b.huffman).toBeCloseTo(2.4, 12);
		expect(b.probes).toBeGreaterThanOrEqual(2.4 - 1e-12);
		expect(b.probes).toBeLessThanOrEqual(2.8 + 1e-12);
		expect(enumeratedOptimum(chain, 'probes')).toBeCloseTo(2.8, 12);
		expect(optimalExpected(chain, { objective: 'probes' }).value).toBeCloseTo(2.8, 12);
	});

	// Worked by hand: a (chance 1/2), b and c (1/4 each). "sees b" reads b 0 V, a and c 12 V;
	// "sees c" reads c 0 V, a and b 12 V. b needs one probe ("sees b" tells it from both), so
	// does c; a needs both (each tells it from one of them): Σ w d = 1/2·2 + 1/4 + 1/4 = 1.5,
	// as is Huffman on 1/2, 1/4, 1/4. With the floors, lengths (2, ≥1, ≥1) must meet Kraft:
	// (2, 1, 1) gives 1/4 + 1/2 + 1/2 > 1, so the least is (2, 1, 2) or (2, 2, 1): 1.75; the
	// Lagrangian reaches it at λ = 1 (a: min over ℓ ≥ 2 of ℓ/2 + 2^−ℓ = 1.25; b, c: min over
	// ℓ ≥ 1 of ℓ/4 + 2^−ℓ = 0.75 each; 1.25 + 1.5 − 1 = 1.75). The optimum: "sees b", then
	// "sees c" on a and c: 1/4·1 + 3/4·2 = 1.75. The bound is tight here.
	it('counts a suspect that needs two probes at two, and meets Kraft with the floors (worked by hand)', () => {
		const t: PredictionTable = {
			suspects: [
				{ id: 'a', prior: 2 },
				{ id: 'b', prior: 1 },
				{ id: 'c', prior: 1 }
			],
			probes: [
				{ id: 'sees b', cost: 1, tolerance: dmm20V },
				{ id: 'sees c', cost: 2, tolerance: dmm20V }
			],
			readings: [
				[12, 0, 12],
				[12, 12, 0]
			]
		};
		const b = separationLowerBound(t);
		expect(b.separationProbes).toBeCloseTo(1.5, 12);
		expect(b.huffman).toBeCloseTo(1.5, 12);
		expect(b.probes).toBeCloseTo(1.75, 6);
		expect(enumeratedOptimum(t, 'probes')).toBeCloseTo(1.75, 12);
		// Costs 1 and 2: a needs both (3), b "sees b" (1), c "sees c" (2): 1/2·3 + 1/4 + 1/4·2 = 2.25.
		// The cheapest plan: "sees b" (1) then "sees c" (2) on a, c: 1 + 3/4·2 = 2.5.
		expect(b.separationCost).toBeCloseTo(2.25, 12);
		expect(enumeratedOptimum(t, 'cost')).toBeCloseTo(2.5, 12);
		expect(b.cost).toBeLessThanOrEqual(2.5 + 1e-12);
	});

	it('the Lagrangian bound of the floors (worked by hand)', () => {
		// No floors, chances 1/2, 1/4, 1/4, K = 2: at λ = 1, min ℓ/2 + 2^−ℓ = 1 and min ℓ/4 + 2^−ℓ
		// = 0.75 twice, less 1: 1.5, the Kraft optimum (lengths 1, 2, 2).
		expect(floorBound([[{ w: 0.5, d: 0 }], [{ w: 0.25, d: 0 }], [{ w: 0.25, d: 0 }]], 2)).toBeCloseTo(1.5, 6);
		// Floors 3 and 3 on two halves: lengths (3, 3) meet Kraft (1/8 + 1/8 ≤ 1): 3.
		expect(floorBound([[{ w: 0.5, d: 3 }], [{ w: 0.5, d: 3 }]], 2)).toBeCloseTo(3, 9);
	});
});
