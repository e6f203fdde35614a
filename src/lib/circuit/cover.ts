// The minimal probe set: the cheapest set of probes that tells apart every pair of suspects
// that any probe can tell apart, and the ambiguity groups no probe splits.
//
// "Told apart" uses each probe's table-wide outcome bins (outcomes.ts): suspects a and b are
// separated by probe p when both have a defined reading on p and they fall in different bins.
// Bins make this a partition per probe, so "not separated by any probe" is an equivalence and
// the ambiguity groups are true classes (suspects with the same bin on every probe). With
// undefined (null) readings it no longer is: a suspect nobody can read on p is separated by p
// from no one. The groups are then the connected components of "not separated by any probe",
// so a group may hold a pair some probe separates; pairs across groups are always separated.
//
// The search works on suspect pairs as the elements of a weighted set cover (each probe covers
// the pairs it separates), after merging suspects with identical bins on every probe (pairs
// inside such a class can never be separated, and the class's pairs with others are separated
// by the same probes). This is the test-cover problem (Garey & Johnson 1979, "Computers and
// Intractability", problem [SP6] Minimum Test Set: NP-hard), hence:
// - Exact: depth-first branch and bound. It branches on the uncovered pair with the fewest
//   separating probes (one branch per such probe, excluding the earlier ones, so branches are
//   disjoint) and prunes with the larger of two lower bounds: a dual-feasible bound of the
//   set-cover LP by dual ascent (pairs with the fewest separating probes first, each priced at
//   the least slack left among its probes) and a counting bound (q suspects that must all be
//   told apart by probes with at most k outcomes among them need at least ⌈log_k q⌉ further
//   probes). Probes that are the only ones left for some pair are taken without branching, and
//   probes whose reduced cost alone lifts the bound past the best cover are set aside
//   (reduced-cost fixing, as in LP-based branch and bound).
// - Greedy beyond a size limit, or when the search exceeds its node budget: repeatedly take
//   the probe of least cost per newly separated pair (Chvátal 1979, "A greedy heuristic for the
//   set-covering problem", Math. Oper. Res. 4(3):233–235), then drop probes made redundant.
//   Chvátal's bound: cost ≤ H(d) × optimum, d the most pairs one probe separates, H the
//   harmonic number; as d ≤ m (the number of pairs to separate), also ≤ H(m) × optimum.
//   Dropping redundant probes only lowers the cost, so the bound still holds.
import { checkTable, probeOutcomes, type PredictionTable } from './outcomes';

export type CoverOptions = {
	/** Probe ids that cannot be used. */
	exclude?: readonly string[];
	/** Largest number of distinct suspect classes for which the exact search is tried (default 128). */
	exactLimit?: number;
	/** Search nodes before the exact search gives up proving optimality (default 20 000). */
	maxNodes?: number;
};

export type CoverBound = {
	/** Chvátal's ratio H(d): cost ≤ ratio × optimum. */
	ratio: number;
	/** d: the most suspect pairs (of merged classes) any single probe separates. */
	maxPairsOneProbe: number;
	/** H(m) for m the pairs to separate; the looser form of the same bound. */
	ratioByPairs: number;
	/** A proven lower bound on the optimum cost. */
	lowerBound: number;
};

export type CoverResult = {
	/** Chosen probe ids, in table order. */
	probes: string[];
	probeIndices: number[];
	cost: number;
	/** True when the cost is proven minimal. */
	exact: boolean;
	/** When not exact: how far from the optimum the cost can be. */
	bound?: CoverBound;
	/** Groups of two or more suspects (ids) that no probe tells apart. */
	ambiguityGroups: string[][];
	/** Suspect pairs the chosen probes separate. */
	pairsSeparated: number;
	/** Suspect pairs some available probe separates. */
	pairsSeparable: number;
	/** All suspect pairs, n(n − 1)/2. */
	pairsTotal: number;
	/** Branch-and-bound nodes visited (0 when greedy only). */
	searchNodes: number;
};

/**
 * Bin index of every suspect on every probe (`labels[p][s]`), −1 for no defined reading or for
 * an excluded probe.
 */
export function outcomeLabels(table: PredictionTable, available?: readonly boolean[]): Int32Array[] {
	return table.probes.map((_, p) => {
		const labels = new Int32Array(table.suspects.length).fill(-1);
		if (available && !available[p]) return labels;
		probeOutcomes(table, p).bins.forEach((b, k) => {
			for (const s of b.suspects) labels[s] = k;
		});
		return labels;
	});
}

/** Harmonic number H(n) = 1 + 1/2 + … + 1/n. */
export function harmonic(n: number): number {
	let h = 0;
	for (let k = 1; k <= n; k++) h += 1 / k;
	return h;
}

// Suspects merged by identical labels on every probe, and the separable pairs between classes.
type Reduced = {
	/** Suspect indices of each class. */
	classes: number[][];
	/** Label of each class on each available probe. */
	labels: Int32Array[];
	/** Element (pair) index for class pair (i, j), i < j, at i·R + j; −1 when not separable. */
	pairIndex: Int32Array;
	pairs: [number, number][];
	/** Suspect pairs each element stands for: |class i| × |class j|. */
	weight: number[];
	/** Bitset of the elements each probe separates. */
	sets: Uint32Array[];
	words: number;
	/** Union-find parent over classes for "not separated by any probe". */
	groupOf: Int32Array;
};

function reduce(table: PredictionTable, available: boolean[]): Reduced {
	const all = outcomeLabels(table, available);
	const P = table.probes.length;
	const byKey = new Map<string, number[]>();
	for (let s = 0; s < table.suspects.length; s++) {
		let key = '';
		for (let p = 0; p < P; p++) key += all[p][s] + ',';
		const c = byKey.get(key);
		if (c) c.push(s);
		else byKey.set(key, [s]);
	}
	const classes = [...byKey.values()];
	const R = classes.length;
	const labels = all.map((row) => Int32Array.from(classes, (c) => row[c[0]]));
	const hasNull = new Uint8Array(R);
	for (let i = 0; i < R; i++) for (let p = 0; p < P; p++) if (available[p] && labels[p][i] < 0) hasNull[i] = 1;
	const pairIndex = new Int32Array(R * R).fill(-1);
	const pairs: [number, number][] = [];
	const weight: number[] = [];
	const parent = Int32Array.from({ length: R }, (_, i) => i);
	const find = (i: number): number => {
		while (parent[i] !== i) i = parent[i] = parent[parent[i]];
		return i;
	};
	for (let i = 0; i < R; i++)
		for (let j = i + 1; j < R; j++) {
			// Distinct classes without nulls differ somewhere, so some probe separates them.
			let separable = !hasNull[i] && !hasNull[j];
			if (!separable)
				for (let p = 0; p < P && !separable; p++) {
					const a = labels[p][i];
					const b = labels[p][j];
					separable = a >= 0 && b >= 0 && a !== b;
				}
			if (separable) {
				pairIndex[i * R + j] = pairs.length;
				pairs.push([i, j]);
				weight.push(classes[i].length * classes[j].length);
			} else parent[find(i)] = find(j);
		}
	const words = Math.max(1, Math.ceil(pairs.length / 32));
	// Pairs across two bins of a probe are exactly the pairs it separates: enumerate those
	// rather than testing every pair against every probe.
	const sets = labels.map((row, p) => {
		const set = new Uint32Array(words);
		if (!available[p]) return set;
		const bins: number[][] = [];
		for (let i = 0; i < R; i++) if (row[i] >= 0) (bins[row[i]] ??= []).push(i);
		const full = bins.filter((b) => b !== undefined);
		for (let k = 0; k < full.length; k++)
			for (let l = k + 1; l < full.length; l++)
				for (const i of full[k])
					for (const j of full[l]) {
						const e = i < j ? pairIndex[i * R + j] : pairIndex[j * R + i];
						set[e >>> 5] |= 1 << (e & 31);
					}
		return set;
	});
	const groupOf = Int32Array.from({ length: R }, (_, i) => find(i));
	return { classes, labels, pairIndex, pairs, weight, sets, words, groupOf };
}

function popcount(x: number): number {
	x -= (x >>> 1) & 0x55555555;
	x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
	return Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24;
}

function countAnd(a: Uint32Array, b: Uint32Array): number {
	let n = 0;
	for (let w = 0; w < a.length; w++) n += popcount(a[w] & b[w]);
	return n;
}

function forEachBit(a: Uint32Array, b: Uint32Array, fn: (e: number) => void): void {
	for (let w = 0; w < a.length; w++) {
		let x = a[w] & b[w];
		while (x !== 0) {
			const low = x & -x;
			fn((w << 5) + 31 - Math.clz32(low));
			x ^= low;
		}
	}
}

/**
 * The ambiguity classes: all suspects (indices) partitioned into groups that no probe tells
 * apart (see the file header for the rule with undefined readings). Singletons included.
 */
export function ambiguityClasses(table: PredictionTable, options: Pick<CoverOptions, 'exclude'> = {}): number[][] {
	checkTable(table, 'ambiguityClasses');
	const red = reduce(table, availability(table, options.exclude, 'ambiguityClasses'));
	return groupsOf(red);
}

function groupsOf(red: Reduced): number[][] {
	const groups = new Map<number, number[]>();
	red.classes.forEach((c, i) => {
		const g = red.groupOf[i];
		groups.set(g, [...(groups.get(g) ?? []), ...c]);
	});
	return [...groups.values()].map((g) => g.sort((a, b) => a - b)).sort((a, b) => a[0] - b[0]);
}

function availability(table: PredictionTable, exclude: readonly string[] | undefined, where: string): boolean[] {
	const available = table.probes.map(() => true);
	for (const id of exclude ?? []) {
		const p = table.probes.findIndex((q) => q.id === id);
		if (p < 0) throw new Error(`${where}: exclude names probe "${id}", which is not in the table`);
		available[p] = false;
	}
	return available;
}

/**
 * The cheapest set of probes that separates every separable pair of suspects: exact by branch
 * and bound up to `exactLimit` suspect classes, greedy with Chvátal's bound beyond.
 *
 * @example
 * const { probes, cost, exact, ambiguityGroups } = minimalProbeSet(table);
 */
export function minimalProbeSet(table: PredictionTable, options: CoverOptions = {}): CoverResult {
	checkTable(table, 'minimalProbeSet');
	const exactLimit = options.exactLimit ?? 128;
	const maxNodes = options.maxNodes ?? 20_000;
	const available = availability(table, options.exclude, 'minimalProbeSet');
	const red = reduce(table, available);
	const n = table.suspects.length;
	const cost = table.probes.map((p) => p.cost);
	const E = red.pairs.length;
	const universe = new Uint32Array(red.words);
	for (let e = 0; e < E; e++) universe[e >>> 5] |= 1 << (e & 31);
	const candidates = table.probes.map((_, p) => p).filter((p) => available[p] && countAnd(red.sets[p], universe) > 0);

	const greedy = greedyCover(red, candidates, cost, universe);
	let chosen = greedy;
	let exact = E === 0;
	let nodes = 0;
	let lowerBound = 0;
	if (E > 0) {
		const tryExact = red.classes.length <= exactLimit;
		const search = new Search(red, candidates, cost, universe, tryExact);
		lowerBound = search.rootBound();
		if (tryExact) {
			const found = search.run(greedy, maxNodes);
			chosen = found.best;
			exact = found.complete;
			nodes = found.nodes;
		}
	}
	chosen = [...chosen].sort((a, b) => a - b);
	const total = chosen.reduce((s, p) => s + cost[p], 0);
	const covered = new Uint32Array(red.words);
	for (const p of chosen) for (let w = 0; w < red.words; w++) covered[w] |= red.sets[p][w];
	let separated = 0;
	let separable = 0;
	red.weight.forEach((wt, e) => {
		separable += wt;
		if ((covered[e >>> 5] >>> (e & 31)) & 1) separated += wt;
	});
	let d = 0;
	for (const p of candidates) d = Math.max(d, countAnd(red.sets[p], universe));
	const result: CoverResult = {
		probes: chosen.map((p) => table.probes[p].id),
		probeIndices: chosen,
		cost: total,
		exact,
		ambiguityGroups: groupsOf(red)
			.filter((g) => g.length > 1)
			.map((g) => g.map((s) => table.suspects[s].id)),
		pairsSeparated: separated,
		pairsSeparable: separable,
		pairsTotal: (n * (n - 1)) / 2,
		searchNodes: nodes
	};
	if (!exact) result.bound = { ratio: harmonic(d), maxPairsOneProbe: d, ratioByPairs: harmonic(E), lowerBound };
	return result;
}

/** Chvátal's greedy, evaluated lazily (a probe's cost per new pair only grows), then pruned. */
function greedyCover(red: Reduced, candidates: number[], cost: number[], universe: Uint32Array): number[] {
	const uncovered = universe.slice();
	let left = red.pairs.length;
	// Min-heap on (cost per new pair, probe index), with possibly stale ratios.
	const heap: [number, number][] = candidates.map((p) => [cost[p] / countAnd(red.sets[p], uncovered), p]);
	const less = (a: [number, number], b: [number, number]) => a[0] < b[0] || (a[0] === b[0] && a[1] < b[1]);
	const sift = (i: number): void => {
		for (;;) {
			const l = 2 * i + 1;
			const r = l + 1;
			let m = i;
			if (l < heap.length && less(heap[l], heap[m])) m = l;
			if (r < heap.length && less(heap[r], heap[m])) m = r;
			if (m === i) return;
			[heap[i], heap[m]] = [heap[m], heap[i]];
			i = m;
		}
	};
	const up = (i: number): void => {
		while (i > 0) {
			const q = (i - 1) >> 1;
			if (!less(heap[i], heap[q])) return;
			[heap[i], heap[q]] = [heap[q], heap[i]];
			i = q;
		}
	};
	for (let i = (heap.length >> 1) - 1; i >= 0; i--) sift(i);
	const pop = (): [number, number] => {
		const top = heap[0];
		const last = heap.pop()!;
		if (heap.length > 0) {
			heap[0] = last;
			sift(0);
		}
		return top;
	};
	const chosen: number[] = [];
	while (left > 0 && heap.length > 0) {
		const [, p] = pop();
		const gain = countAnd(red.sets[p], uncovered);
		if (gain === 0) continue;
		const fresh: [number, number] = [cost[p] / gain, p];
		if (heap.length > 0 && less(heap[0], fresh)) {
			heap.push(fresh);
			up(heap.length - 1);
			continue;
		}
		chosen.push(p);
		for (let w = 0; w < uncovered.length; w++) uncovered[w] &= ~red.sets[p][w];
		left -= gain;
	}
	return dropRedundant(red, chosen, cost);
}

/** Drops probes whose pairs the others already separate, dearest first. */
function dropRedundant(red: Reduced, chosen: number[], cost: number[]): number[] {
	const times = new Int32Array(red.pairs.length);
	const all = new Uint32Array(red.words).fill(0xffffffff);
	for (const p of chosen) forEachBit(red.sets[p], all, (e) => times[e]++);
	const order = [...chosen].sort((a, b) => cost[b] - cost[a] || b - a);
	const keep = new Set(chosen);
	for (const p of order) {
		let needed = false;
		forEachBit(red.sets[p], all, (e) => {
			if (times[e] === 1) needed = true;
		});
		if (!needed) {
			keep.delete(p);
			forEachBit(red.sets[p], all, (e) => times[e]--);
		}
	}
	return chosen.filter((p) => keep.has(p));
}

class Search {
	private readonly probes: number[];
	/** Separating probes of each pair (after the dominance filter). */
	private readonly elemProbes: Int32Array[];
	private readonly excluded: Uint8Array;
	private best: number[] = [];
	private bestCost = Infinity;
	private nodes = 0;
	private aborted = false;
	private readonly y: Float64Array;
	private readonly slack: Float64Array;
	private readonly gain: Int32Array;
	private readonly ascentOrder: Int32Array;
	/** Probes with new pairs at the last bound; `slack` holds their reduced costs. */
	private live: number[] = [];
	private lastDual = 0;

	constructor(
		private readonly red: Reduced,
		candidates: number[],
		private readonly cost: number[],
		private readonly universe: Uint32Array,
		filter: boolean
	) {
		// The dominance filter costs (probes)² set comparisons: worth it only for the search.
		this.probes = filter ? dominanceFilter(red, candidates, cost) : candidates;
		const lists: number[][] = red.pairs.map(() => []);
		for (const p of this.probes) forEachBit(red.sets[p], universe, (e) => lists[e].push(p));
		this.elemProbes = lists.map((l) => Int32Array.from(l));
		this.excluded = new Uint8Array(cost.length);
		// Pairs with few separating probes first: their prices are the ones the bound needs.
		this.ascentOrder = Int32Array.from(red.pairs.keys()).sort((a, b) => lists[a].length - lists[b].length || a - b);
		this.y = new Float64Array(red.pairs.length);
		this.slack = new Float64Array(cost.length);
		this.gain = new Int32Array(cost.length);
	}

	rootBound(): number {
		return Math.max(0, this.bound(this.universe, new Int32Array(this.red.classes.length)));
	}

	run(start: number[], maxNodes: number): { best: number[]; complete: boolean; nodes: number } {
		this.best = start;
		this.bestCost = start.reduce((s, p) => s + this.cost[p], 0);
		this.nodes = 0;
		this.aborted = false;
		this.visit(this.universe.slice(), new Int32Array(this.red.classes.length), [], 0, maxNodes);
		return { best: this.best, complete: !this.aborted, nodes: this.nodes };
	}

	/** Separating probes of pair e still allowed, and the count of them. */
	private allowed(e: number): number {
		const ps = this.elemProbes[e];
		let k = 0;
		for (let i = 0; i < ps.length; i++) if (!this.excluded[ps[i]]) k++;
		return k;
	}

	private visit(uncovered: Uint32Array, classes: Int32Array, chosen: number[], spent: number, maxNodes: number): void {
		if (this.aborted) return;
		if (++this.nodes > maxNodes) {
			this.aborted = true;
			return;
		}
		const depth = chosen.length;
		const fixed: number[] = [];
		const finish = (): void => {
			for (const p of fixed) this.excluded[p] = 0;
			chosen.length = depth;
		};
		const limit = (): number => this.bestCost - 1e-9 * Math.max(1, this.bestCost);
		let pick = -1;
		for (;;) {
			if (isEmpty(uncovered)) {
				if (spent < this.bestCost) {
					this.bestCost = spent;
					this.best = [...chosen];
				}
				return finish();
			}
			const lb = this.bound(uncovered, classes);
			if (lb === Infinity || spent + lb >= limit()) return finish();
			// Reduced-cost fixing: with dual prices y, any cover x costs at least
			// Σy + Σ_{p∈x} slack_p, so a probe whose slack alone lifts the bound past the best
			// known cover cannot be in a better one below this node.
			for (const p of this.live) {
				if (spent + this.lastDual + this.slack[p] >= limit()) {
					this.excluded[p] = 1;
					fixed.push(p);
				}
			}
			// Take every probe that is now the only one left for some pair, without branching;
			// otherwise branch on the pair with the fewest separating probes left.
			let forced = -1;
			let fewest = Infinity;
			pick = -1;
			for (let w = 0; w < uncovered.length && forced < 0; w++) {
				let x = uncovered[w];
				while (x !== 0) {
					const low = x & -x;
					const e = (w << 5) + 31 - Math.clz32(low);
					x ^= low;
					const k = this.allowed(e);
					if (k === 0) return finish();
					if (k === 1) {
						for (const p of this.elemProbes[e]) if (!this.excluded[p]) forced = p;
						break;
					}
					if (k < fewest) {
						fewest = k;
						pick = e;
					}
				}
			}
			if (forced < 0) break;
			chosen.push(forced);
			spent += this.cost[forced];
			const set = this.red.sets[forced];
			uncovered = uncovered.slice();
			for (let w = 0; w < uncovered.length; w++) uncovered[w] &= ~set[w];
			classes = this.refine(classes, forced);
		}
		const gain = this.gain;
		const cost = this.cost;
		const branch = Array.from(this.elemProbes[pick])
			.filter((p) => !this.excluded[p])
			.sort((a, b) => cost[a] / gain[a] - cost[b] / gain[b] || cost[a] - cost[b] || a - b);
		const done: number[] = [];
		for (const p of branch) {
			const next = uncovered.slice();
			const set = this.red.sets[p];
			for (let w = 0; w < next.length; w++) next[w] &= ~set[w];
			chosen.push(p);
			this.visit(next, this.refine(classes, p), chosen, spent + cost[p], maxNodes);
			chosen.pop();
			// Later branches leave p out, so no cover is searched twice.
			this.excluded[p] = 1;
			done.push(p);
			if (this.aborted) break;
		}
		for (const p of done) this.excluded[p] = 0;
		finish();
	}

	private refine(classes: Int32Array, p: number): Int32Array {
		const labels = this.red.labels[p];
		const ids = new Map<number, number>();
		const out = new Int32Array(classes.length);
		for (let i = 0; i < classes.length; i++) {
			const key = classes[i] * 65536 + (labels[i] + 1);
			let id = ids.get(key);
			if (id === undefined) ids.set(key, (id = ids.size));
			out[i] = id;
		}
		return out;
	}

	/** Lower bound on the cost still to pay; Infinity when some pair can no longer be separated. */
	private bound(uncovered: Uint32Array, classes: Int32Array): number {
		const { y, slack, gain, cost, red, excluded } = this;
		const live: number[] = [];
		for (const p of this.probes) {
			if (excluded[p]) continue;
			gain[p] = countAnd(red.sets[p], uncovered);
			if (gain[p] > 0) {
				live.push(p);
				slack[p] = cost[p];
			}
		}
		this.live = live;
		// Dual ascent on the set-cover LP: in turn, price each pair at the least slack left
		// among the probes that separate it. Prices stay dual feasible, so Σ prices is a bound.
		let dual = 0;
		const order = this.ascentOrder;
		for (let i = 0; i < order.length; i++) {
			const e = order[i];
			if (!((uncovered[e >>> 5] >>> (e & 31)) & 1)) continue;
			let delta = Infinity;
			const ps = this.elemProbes[e];
			for (let k = 0; k < ps.length; k++) if (!excluded[ps[k]] && slack[ps[k]] < delta) delta = slack[ps[k]];
			if (delta === Infinity) return Infinity;
			y[e] = delta;
			if (delta > 0) for (let k = 0; k < ps.length; k++) if (!excluded[ps[k]]) slack[ps[k]] -= delta;
			dual += delta;
		}
		this.lastDual = dual;
		// Counting bound per class of suspects not yet split by the chosen probes.
		let counting = 0;
		const members = new Map<number, number[]>();
		for (let i = 0; i < classes.length; i++) {
			const m = members.get(classes[i]);
			if (m) m.push(i);
			else members.set(classes[i], [i]);
		}
		const R = red.classes.length;
		for (const group of members.values()) {
			if (group.length < 2) continue;
			// A clique of classes whose every pair must still be separated.
			const q: number[] = [];
			for (const i of group) if (q.every((j) => red.pairIndex[j * R + i] >= 0)) q.push(i);
			if (q.length < 2) continue;
			const ks: number[] = [];
			const cs: number[] = [];
			const seen = new Set<number>();
			for (const p of live) {
				seen.clear();
				for (const i of q) if (red.labels[p][i] >= 0) seen.add(red.labels[p][i]);
				if (seen.size >= 2) {
					ks.push(seen.size);
					cs.push(cost[p]);
				}
			}
			// q suspects told apart by t probes of at most k_i outcomes each need Π k_i ≥ q.
			ks.sort((a, b) => b - a);
			let t = 0;
			for (let prod = 1; prod < q.length; t++) {
				if (t >= ks.length) return Infinity;
				prod *= ks[t];
			}
			cs.sort((a, b) => a - b);
			let sum = 0;
			for (let i = 0; i < t; i++) sum += cs[i];
			if (sum > counting) counting = sum;
		}
		return Math.max(dual, counting);
	}
}

function isEmpty(a: Uint32Array): boolean {
	for (let w = 0; w < a.length; w++) if (a[w] !== 0) return false;
	return true;
}

/** Drops probes whose pairs a no-dearer probe also separates. */
function dominanceFilter(red: Reduced, candidates: number[], cost: number[]): number[] {
	const order = [...candidates].sort((a, b) => cost[a] - cost[b] || a - b);
	const kept: number[] = [];
	for (const q of order) {
		const sq = red.sets[q];
		const dominated = kept.some((p) => {
			const sp = red.sets[p];
			for (let w = 0; w < sq.length; w++) if ((sq[w] & ~sp[w]) !== 0) return false;
			return true;
		});
		if (!dominated) kept.push(q);
	}
	return kept;
}
