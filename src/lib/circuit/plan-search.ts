// Choosing the next probe with lookahead, and the optimal expected cost of a plan.
//
// Three rules, by the number of suspects m still in play at a point of the plan:
// - m ≤ exactUpTo: the optimal choice, by an exact search over decision trees. The value of a
//   point S (the expected cost still to pay from S, its chances renormalised) is
//   V(S) = 0 when no probe splits S, else min over probes p of c_p + Σ_b π_b V(S_b), the S_b the
//   points p's outcomes lead to and π_b their chances. Depth-first branch and bound, memoised
//   on the point (the suspects in play; with undefined readings, their weights too); the
//   probes that split S the same way are tried once (the cheapest); each point has a proven
//   lower bound (below) and the search prunes a probe once c_p + Σ π_b (lower bound of S_b)
//   reaches the best tree found. The work is capped by a budget; past it the best tree found so
//   far is kept (never worse than the one-step rule: it is tried first).
// - m ≤ rolloutUpTo: a rollout (Bertsekas, Tsitsiklis & Wu 1997, "Rollout algorithms for
//   combinatorial optimization", J. Heuristics 3:245–262). For the few probes the one-step rule
//   ranks highest, the cost of the probe plus the expected cost of finishing from each outcome
//   — with the exact search where the outcome leaves few enough suspects, else with the
//   one-step rule's own plan — and the probe of least total. Because the one-step rule's pick
//   is always among those tried, and the rule depends on the point alone, the rollout plan is
//   never worse than the one-step plan (their Proposition: by induction on m, each point's
//   realised cost is at most the estimate it was picked on, which is at most the one-step
//   plan's cost from there).
// - larger points: the one-step rule (plan.ts): most expected information per unit cost.
//
// "Cost" is the objective: the probes' reach costs, or 1 per probe to minimise the expected
// number of probes.
//
// Lower bounds of a point S (classes: the groups of S's suspects that no probe tells apart over
// S, connected components of "not separated" as in cover.ts; a plan's leaves lie within one
// class, since bins over fewer suspects are never coarser):
// - expected probes ≥ Huffman_K(class chances), K the most outcomes any probe has among S's
//   suspects (plan.ts huffmanLowerBound has the proof; it holds from any point);
// - expected cost ≥ c_min × that, c_min the least cost of a probe that splits S;
// - expected cost ≥ H(classes) / max_p (log2 K_p / c_p): along the plan, the information the
//   outcomes give sums to at least H(classes) (chain rule of entropy), and a probe with at most
//   K_p outcomes gives at most log2 K_p bits for its cost c_p.
// Any grouping coarser than the classes also gives a lower bound (a code for the finer classes
// is one for the coarser ones, taking each group's shortest word), so the children of a point
// are bounded cheaply with the parent's classes and K.
import { huffmanExpectedLength } from './huffman';
import { children, labelBins, maxOutcomesAmong, point, release, score, scratch, type Prepared, type Scratch, type State } from './plan-split';
import type { PredictionTable } from './outcomes';

export type Objective = 'cost' | 'probes';

export type SearchLimits = {
	/** Exact search on points with at most this many suspects (default 12). */
	exactUpTo?: number;
	/** Rollout on points with at most this many suspects (default 48). */
	rolloutUpTo?: number;
	/** Probes tried at a rollout point, the one-step rule's best first (default 6). */
	candidates?: number;
	/** Work for the whole plan, in suspect × probe visits (default 4 000 000: a few tenths of a second). */
	budget?: number;
};

type Entry = {
	/** Proven: V ≥ lo. */
	lo: number;
	/** The best tree found has expected cost hi (Infinity when none yet). */
	hi: number;
	/** Its first probe; −1 when hi is the one-step plan's cost (or none found). */
	choice: number;
};

const EPS = 1e-12;
const better = (a: number, b: number): boolean => (Number.isFinite(b) ? a < b - EPS * Math.max(1, Math.abs(b)) : a < b);
// Orders of search are compared on rounded figures, so that sums taken in another order (a
// mirrored harness reads its bins the other way round) explore the probes in the same order.
const round = (x: number): number => (Number.isFinite(x) ? Number(x.toPrecision(10)) : x);

export type Pick = { probe: number; gain: number };

export class PlanSearch {
	readonly cost: Float64Array;
	private readonly sc: Scratch;
	private readonly exactMemo = new Map<string, Entry>();
	private readonly greedyMemo = new Map<string, number>();
	readonly exactUpTo: number;
	readonly rolloutUpTo: number;
	readonly candidates: number;
	readonly budget: number;
	/** Work done so far (suspect × probe visits). */
	work = 0;
	/** True once the budget ran out before some search finished. */
	cut = false;

	constructor(
		private readonly table: PredictionTable,
		private readonly prep: Prepared,
		/** Usable probes, in table order. */
		private readonly probes: readonly number[],
		readonly objective: Objective,
		limits: SearchLimits = {}
	) {
		this.cost = Float64Array.from(table.probes, (p) => (objective === 'probes' ? 1 : p.cost));
		this.sc = scratch(table.suspects.length);
		this.exactUpTo = limits.exactUpTo ?? 12;
		this.rolloutUpTo = limits.rolloutUpTo ?? 48;
		this.candidates = limits.candidates ?? 6;
		this.budget = limits.budget ?? 4_000_000;
	}

	private key(s: State): string {
		const k = s.members.join(',');
		if (!this.prep.hasNull) return k;
		// Undefined readings spread a suspect's weight over the outcomes: the point is then its
		// suspects and their weights.
		return k + '|' + Array.from(s.weights, (x) => (x / s.mass).toPrecision(12)).join(',');
	}

	/**
	 * The one-step rule: most expected information per unit of the objective's cost. `counted`:
	 * whether the work goes on the lookahead's budget (not when the plan itself takes the pick).
	 */
	greedyPick(s: State, counted = true): Pick | null {
		return this.scored(s, counted).pick;
	}

	/** Every probe that splits s with its gain, and the one-step rule's pick among them. */
	private scored(s: State, counted: boolean): { pick: Pick | null; ranked: { p: number; sc: number; gain: number }[] } {
		const at = point(s.members, s.weights, this.sc);
		const ranked: { p: number; sc: number; gain: number }[] = [];
		let best = -1;
		let bestGain = 0;
		let bestScore = -Infinity;
		for (const p of this.probes) {
			const { gain, bins } = score(this.prep, p, at);
			if (bins < 2) continue;
			const c = this.cost[p];
			const sc = gain / c;
			ranked.push({ p, sc: round(sc), gain });
			const tc = this.table.probes[p].cost;
			// Most information per cost; then more information; then cheaper; then table order.
			if (
				sc > bestScore + 1e-12 ||
				(Math.abs(sc - bestScore) <= 1e-12 && (gain > bestGain + 1e-12 || (Math.abs(gain - bestGain) <= 1e-12 && tc < this.table.probes[best].cost)))
			) {
				best = p;
				bestGain = gain;
				bestScore = sc;
			}
		}
		if (counted) this.work += s.members.length * this.probes.length;
		release(at);
		return { pick: best < 0 ? null : { probe: best, gain: bestGain }, ranked };
	}

	/** The points probe p leads to from s. */
	split(s: State, p: number): State[] {
		const at = point(s.members, s.weights, this.sc);
		const kids = children(this.prep, p, at, this.sc.label);
		release(at);
		return kids;
	}

	private gainOf(s: State, p: number): number {
		const at = point(s.members, s.weights, this.sc);
		const g = score(this.prep, p, at).gain;
		release(at);
		return g;
	}

	/** Expected cost (conditional on reaching s) of the one-step rule's plan from s. */
	greedyValue(s: State): number {
		if (s.members.length < 2) return 0;
		const key = this.key(s);
		const got = this.greedyMemo.get(key);
		if (got !== undefined) return got;
		const pick = this.greedyPick(s);
		let v = 0;
		if (pick) {
			v = this.cost[pick.probe];
			for (const k of this.split(s, pick.probe)) v += (k.mass / s.mass) * this.greedyValue(k);
		}
		this.greedyMemo.set(key, v);
		return v;
	}

	/** The probe to take at s under the three rules of the file header; null when none splits s. */
	choose(s: State): Pick | null {
		const m = s.members.length;
		if (m < 2) return null;
		if (m <= this.exactUpTo) {
			const e = this.solve(s, Infinity);
			if (e.choice >= 0) return { probe: e.choice, gain: this.gainOf(s, e.choice) };
			return this.greedyPick(s, false);
		}
		if (m <= this.rolloutUpTo && this.work < this.budget) return this.rollout(s);
		return this.greedyPick(s, false);
	}

	/** Estimated cost of finishing from s, realised by `choose` (see the file header). */
	private finish(s: State): number {
		const m = s.members.length;
		if (m < 2) return 0;
		if (m <= this.exactUpTo) return this.solve(s, Infinity).hi;
		return this.greedyValue(s);
	}

	private rollout(s: State): Pick | null {
		const { pick: first, ranked } = this.scored(s, true);
		if (!first) return null;
		ranked.sort((a, b) => b.sc - a.sc || a.p - b.p);
		const tried = [first.probe, ...ranked.map((r) => r.p).filter((p) => p !== first.probe)].slice(0, this.candidates);
		let best = first;
		let bestValue = Infinity;
		for (const p of tried) {
			let v = this.cost[p];
			for (const k of this.split(s, p)) v += (k.mass / s.mass) * this.finish(k);
			if (better(v, bestValue)) {
				bestValue = v;
				best = { probe: p, gain: ranked.find((r) => r.p === p)!.gain };
			}
		}
		return best;
	}

	/**
	 * Lower bounds from a point: the bound of s itself, and what its children are bounded with
	 * (each member's class, K and the cost figures over s).
	 */
	private bounds(s: State): { lo: number; classOf: Int32Array; classes: number; K: number; cMin: number; rate: number } {
		const n = this.table.suspects.length;
		const members = s.members;
		const m = members.length;
		const at = point(members, s.weights, this.sc);
		const label = this.sc.label;
		// Class of each member: same bin on every probe (no undefined readings among them); with
		// undefined readings, union of every pair no probe separates.
		const sig: string[] = members.map(() => '');
		const labels: Int32Array[] = [];
		let K = 1;
		let cMin = Infinity;
		let rate = 0;
		for (const p of this.probes) {
			// K, c_min and the rate over every probe that tells some two of s's suspects apart:
			// one that splits nothing at s may split a point below it (bins over fewer suspects
			// can be finer).
			const kp = maxOutcomesAmong(this.prep, p, at);
			if (kp < 2) continue;
			K = Math.max(K, kp);
			cMin = Math.min(cMin, this.cost[p]);
			rate = Math.max(rate, Math.log2(kp) / this.cost[p]);
			const bins = labelBins(this.prep, p, at, label);
			if (bins < 2) continue;
			const row = new Int32Array(m);
			members.forEach((x, i) => {
				row[i] = label[x];
				sig[i] += label[x] + ',';
			});
			labels.push(row);
		}
		release(at);
		this.work += 2 * m * this.probes.length;
		const parent = Int32Array.from({ length: m }, (_, i) => i);
		const find = (i: number): number => {
			while (parent[i] !== i) i = parent[i] = parent[parent[i]];
			return i;
		};
		const bySig = new Map<string, number>();
		members.forEach((_, i) => {
			const j = bySig.get(sig[i]);
			if (j === undefined) bySig.set(sig[i], i);
			else parent[find(i)] = find(j);
		});
		if (this.prep.hasNull && sig.some((x) => x.includes('-1'))) {
			for (let i = 0; i < m; i++)
				for (let j = i + 1; j < m; j++) {
					if (find(i) === find(j)) continue;
					let apart = false;
					for (const row of labels) if (row[i] >= 0 && row[j] >= 0 && row[i] !== row[j]) apart = true;
					if (!apart) parent[find(i)] = find(j);
				}
		}
		const classOf = new Int32Array(n).fill(-1);
		const ids = new Map<number, number>();
		members.forEach((x, i) => {
			const r = find(i);
			if (!ids.has(r)) ids.set(r, ids.size);
			classOf[x] = ids.get(r)!;
		});
		const classes = ids.size;
		const lo = this.boundWith(s, classOf, classes, K, cMin, rate);
		return { lo, classOf, classes, K, cMin, rate };
	}

	/** Lower bound of s from a grouping no finer than its classes (see the file header). */
	private boundWith(s: State, classOf: Int32Array, classes: number, K: number, cMin: number, rate: number): number {
		if (K < 2 || classes < 2) return 0;
		const mass = new Float64Array(classes);
		s.members.forEach((x, i) => (mass[classOf[x]] += s.weights[i] / s.mass));
		const chances = Array.from(mass).filter((x) => x > 0);
		if (chances.length < 2) return 0;
		const huff = huffmanExpectedLength(chances, K);
		if (this.objective === 'probes') return huff;
		let h = 0;
		for (const q of chances) h -= q * Math.log2(q);
		return Math.max(cMin * huff, rate > 0 ? h / rate : 0);
	}

	/**
	 * The exact search from s: afterwards either entry.lo = entry.hi (the optimum, when it is
	 * below `limit`) or entry.lo ≥ limit; entry.hi and entry.choice hold the best tree found. When
	 * the budget runs out the entry is left unproven with the best tree found (the one-step plan
	 * when none).
	 */
	solve(s: State, limit: number): Entry {
		const key = this.key(s);
		let e = this.exactMemo.get(key);
		if (s.members.length < 2) {
			e ??= { lo: 0, hi: 0, choice: -1 };
			this.exactMemo.set(key, e);
			return e;
		}
		if (e && (e.lo >= e.hi || e.lo >= limit)) return e;
		if (this.work >= this.budget) return this.settle(s, key, e);
		const b = this.bounds(s);
		if (!e) {
			e = { lo: b.lo, hi: Infinity, choice: -1 };
			this.exactMemo.set(key, e);
		} else e.lo = Math.max(e.lo, b.lo);
		if (e.lo >= limit || e.lo >= e.hi) return e;
		// One probe per way of splitting s: the cheapest, then the one-step rule's favourite.
		const at = point(s.members, s.weights, this.sc);
		const label = this.sc.label;
		const seen = new Map<string, number>();
		type Option = { p: number; kids: State[]; lb: number[]; bound: number; sc: number };
		const options: Option[] = [];
		for (const p of this.probes) {
			const bins = labelBins(this.prep, p, at, label);
			if (bins < 2) continue;
			// Partition as first-seen labels over the members, so mirrored readings match.
			const relabel = new Map<number, number>();
			let sig = '';
			for (const x of s.members) {
				const l = label[x];
				if (l < 0) sig += '-,';
				else {
					if (!relabel.has(l)) relabel.set(l, relabel.size);
					sig += relabel.get(l) + ',';
				}
			}
			const j = seen.get(sig);
			if (j !== undefined && this.cost[options[j].p] <= this.cost[p]) continue;
			const kids = children(this.prep, p, at, label);
			const lb = kids.map((k) => {
				const q = this.exactMemo.get(this.key(k));
				return Math.max(q?.lo ?? 0, this.boundWith(k, b.classOf, b.classes, b.K, b.cMin, b.rate));
			});
			let bound = this.cost[p];
			kids.forEach((k, i) => (bound += (k.mass / s.mass) * lb[i]));
			const option = { p, kids, lb, bound, sc: round(score(this.prep, p, at).gain / this.cost[p]) };
			if (j !== undefined) options[j] = option;
			else {
				seen.set(sig, options.length);
				options.push(option);
			}
		}
		release(at);
		this.work += 3 * s.members.length * this.probes.length;
		if (!options.length) {
			// No probe splits s: a leaf.
			e.lo = e.hi = 0;
			e.choice = -1;
			return e;
		}
		// Most informative first (the first tree found is the one-step rule's), then by bound.
		options.sort((a, b) => b.sc - a.sc || a.bound - b.bound || a.p - b.p);
		const first = options.shift();
		if (first) options.sort((a, b) => round(a.bound) - round(b.bound) || b.sc - a.sc || a.p - b.p);
		const order = first ? [first, ...options] : options;
		let complete = true;
		// Proven lower bound of each option (its value once followed to the end).
		const proven = order.map((o) => o.bound);
		for (const [n, o] of order.entries()) {
			const cap = Math.min(limit, e.hi);
			if (o.bound >= cap) continue;
			if (this.work >= this.budget) {
				complete = false;
				break;
			}
			let known = o.bound;
			let hi = this.cost[o.p];
			for (let i = 0; i < o.kids.length; i++) {
				const k = o.kids[i];
				const pi = k.mass / s.mass;
				const room = (cap - (known - pi * o.lb[i])) / pi;
				const q = this.solve(k, room);
				// Settled: the child's optimum is known, or proven at or above the room left.
				if (q.lo < q.hi - EPS * Math.max(1, q.hi) && q.lo < room) complete = false;
				known += pi * (Math.max(q.lo, o.lb[i]) - o.lb[i]);
				o.lb[i] = Math.max(q.lo, o.lb[i]);
				hi += pi * q.hi;
				if (known >= cap) {
					hi = Infinity;
					break;
				}
			}
			proven[n] = known;
			if (better(hi, e.hi)) {
				e.hi = hi;
				e.choice = o.p;
			}
		}
		if (complete) {
			// Every probe was either followed to the end or bounded at or above min(limit, hi).
			if (e.hi < limit) e.lo = e.hi;
			else e.lo = Math.max(e.lo, limit);
		} else {
			// Cut short: every tree starts with one of the options, so the least of their proven
			// bounds still bounds s.
			e.lo = Math.max(e.lo, Math.min(e.hi, ...proven));
			return this.settle(s, key, e);
		}
		return e;
	}

	/** A budget-cut point keeps a tree it can realise: the best found, or the one-step plan's. */
	private settle(s: State, key: string, e: Entry | undefined): Entry {
		this.cut = true;
		if (!e) {
			e = { lo: 0, hi: Infinity, choice: -1 };
			this.exactMemo.set(key, e);
		}
		const g = this.greedyValue(s);
		if (!(e.hi <= g)) {
			e.hi = g;
			e.choice = -1;
		}
		return e;
	}

	/** The optimum from s when proven (else the best found, with `proven` false), and its lower bound. */
	optimum(s: State): { value: number; lower: number; proven: boolean } {
		const e = this.solve(s, Infinity);
		return { value: e.hi, lower: e.lo, proven: e.lo >= e.hi - EPS * Math.max(1, e.hi) };
	}
}
