// A lower bound on any plan's expected probes (or cost) from what each suspect needs: the
// fewest probes (or least cost) that tell it apart from every suspect outside its class.
//
// Why it holds. Follow the plan with suspect s the fault. Every suspect t of another ambiguity
// class (cover.ts) must be gone by the leaf s ends on (a leaf lies within one class). t leaves
// s's branch only at a step whose probe p puts them in different bins, which needs both readings
// defined and their acceptance intervals apart (outcomes.ts toldApart) — or, when s has no
// defined reading on p and follows every branch, t's reading defined. So the probes on the
// branch form a cover of the other classes' suspects by the sets
// A_p(s) = { t : p tells s and t apart } (all t read on p, when s is not), and the branch costs
// at least d(s), the least such cover (a weighted set cover, solved exactly by branch and bound
// within a budget; past it, a packing bound: suspects no single probe covers two of need a probe
// each). Where s's chance is spread over several leaves (undefined readings) every one of them
// is reached this way. Hence E[cost] ≥ Σ_s w_s d(s).
//
// Combined with the code-length argument of plan.ts huffmanLowerBound (counting probes): let
// ℓ_c be the depth of class c's shallowest leaf. The ℓ_c satisfy Kraft's inequality
// Σ_c K^(−ℓ_c) ≤ 1, ℓ_c ≥ min_{s∈c} d(s), and E[probes] ≥ Σ_c Σ_{s∈c} w_s max(ℓ_c, d(s)). For
// any λ ≥ 0 the least of Σ_c [Σ_{s∈c} w_s max(ℓ, d(s)) + λ K^(−ℓ)] over whole ℓ per class, less
// λ, is below the least of that sum over lengths meeting Kraft (weak duality of the Lagrangian
// relaxation; e.g. Boyd & Vandenberghe, "Convex Optimization", §5.1.3), hence a lower bound; it
// is maximised over λ (concave in λ, so a one-dimensional search finds its top).
import { ambiguityClasses } from './cover';
import { huffmanExpectedLength } from './huffman';
import { acceptOf, checkTable, maxOutcomes, subTable, type PredictionTable } from './outcomes';

export type SeparationBound = {
	/** Lower bound on the expected number of probes: the larger of the Huffman bound and the separation bound. */
	probes: number;
	/** Lower bound on the expected reach cost. */
	cost: number;
	/** Σ_s w_s d(s), counting probes. */
	separationProbes: number;
	/** Σ_s w_s d(s), counting cost. */
	separationCost: number;
	/** The Huffman bound (plan.ts huffmanLowerBound). */
	huffman: number;
	/** True when every d(s) was solved exactly (else some are packing bounds). */
	exact: boolean;
};

/**
 * Least number (unit costs) or cost of probes that together tell suspect s apart from every
 * suspect in `others`; exact within `budget` search nodes, else a proven lower bound.
 */
function leastCover(sets: Uint32Array[], cost: readonly number[], universe: number, budget: number): { value: number; exact: boolean } {
	const words = Math.max(1, Math.ceil(universe / 32));
	const coverers: number[][] = Array.from({ length: universe }, () => []);
	sets.forEach((set, p) => {
		for (let e = 0; e < universe; e++) if (set[e >>> 5] & (1 << (e & 31))) coverers[e].push(p);
	});
	if (coverers.some((c) => c.length === 0)) return { value: Infinity, exact: true };
	const has = (u: Uint32Array, e: number) => (u[e >>> 5] & (1 << (e & 31))) !== 0;
	// Packing bound: elements whose covering probes are pairwise disjoint need a probe each.
	const order = Array.from({ length: universe }, (_, e) => e).sort((a, b) => coverers[a].length - coverers[b].length || a - b);
	const used = new Uint8Array(sets.length);
	const packing = (u: Uint32Array): number => {
		used.fill(0);
		let lb = 0;
		for (const e of order) {
			if (!has(u, e)) continue;
			const c = coverers[e];
			if (c.some((p) => used[p])) continue;
			let least = Infinity;
			for (const p of c) {
				used[p] = 1;
				least = Math.min(least, cost[p]);
			}
			lb += least;
		}
		return lb;
	};
	const all = new Uint32Array(words);
	for (let e = 0; e < universe; e++) all[e >>> 5] |= 1 << (e & 31);
	const root = packing(all);
	let best = Infinity;
	let nodes = 0;
	let cut = false;
	const visit = (u: Uint32Array, spent: number): void => {
		if (cut) return;
		if (++nodes > budget) {
			cut = true;
			return;
		}
		let pick = -1;
		for (const e of order) if (has(u, e) && (pick < 0 || coverers[e].length < coverers[pick].length)) pick = e;
		if (pick < 0) {
			best = Math.min(best, spent);
			return;
		}
		if (spent + packing(u) >= best) return;
		// The element with the fewest covering probes must be covered by one of them.
		for (const p of coverers[pick]) {
			const next = new Uint32Array(words);
			for (let w = 0; w < words; w++) next[w] = u[w] & ~sets[p][w];
			visit(next, spent + cost[p]);
		}
	};
	visit(all, 0);
	return cut ? { value: root, exact: false } : { value: best, exact: true };
}

/** The Lagrangian bound of the file header: per-class members' chances and floors, K outcomes. */
export function floorBound(classes: readonly { w: number; d: number }[][], K: number): number {
	if (K < 2) return 0;
	const f = (members: readonly { w: number; d: number }[], l: number) => members.reduce((a, m) => a + m.w * Math.max(l, m.d), 0);
	const floors = classes.map((c) => Math.min(...c.map((m) => m.d)));
	const top = Math.max(0, ...classes.flatMap((c) => c.map((m) => m.d))) + 64;
	const g = (lambda: number): number => {
		let total = -lambda;
		classes.forEach((c, i) => {
			let least = Infinity;
			for (let l = floors[i]; l <= top; l++) {
				const v = f(c, l) + lambda * K ** -l;
				// Convex in l (a sum of convex terms): past the first rise it only rises.
				if (v < least) least = v;
				else break;
			}
			total += least;
		});
		return total;
	};
	// Unimodal in λ, hence in log λ: ternary search, with λ = 0 as a candidate.
	let lo = -60;
	let hi = Math.log(K) * (top + 2);
	for (let i = 0; i < 100; i++) {
		const a = lo + (hi - lo) / 3;
		const b = hi - (hi - lo) / 3;
		if (g(Math.exp(a)) < g(Math.exp(b))) lo = a;
		else hi = b;
	}
	return Math.max(g(0), g(Math.exp((lo + hi) / 2)));
}

/**
 * The separation bound (file header) on the expected probes and cost of any complete plan.
 * `budget` is the search nodes allowed per suspect's cover (default 2000).
 */
export function separationLowerBound(table: PredictionTable, options: { weights?: readonly number[]; budget?: number } = {}): SeparationBound {
	checkTable(table, 'separationLowerBound');
	const n = table.suspects.length;
	const raw = options.weights ? [...options.weights] : table.suspects.map((s) => s.prior);
	const total = raw.reduce((a, b) => a + b, 0);
	const w = raw.map((x) => x / total);
	const members = table.suspects.map((_, s) => s).filter((s) => w[s] > 0);
	const sub = subTable(table, members);
	const classes = ambiguityClasses(sub).map((c) => c.map((i) => members[i]));
	const classOf = new Int32Array(n).fill(-1);
	classes.forEach((c, k) => c.forEach((s) => (classOf[s] = k)));
	const budget = options.budget ?? 2000;
	const unit = table.probes.map(() => 1);
	const cost = table.probes.map((p) => p.cost);
	const dProbes = new Float64Array(n);
	const dCost = new Float64Array(n);
	let exact = true;
	const memo = new Map<string, { p: number; c: number }>();
	for (const s of members) {
		// Suspects with the same readings everywhere and the same class need the same covers.
		const key = classOf[s] + '|' + table.readings.map((r, p) => `${r[s]}~${table.bands?.[p]?.[s]?.low}~${table.bands?.[p]?.[s]?.high}`).join(',');
		let got = memo.get(key);
		if (!got) {
			const others = members.filter((t) => classOf[t] !== classOf[s]);
			const words = Math.max(1, Math.ceil(others.length / 32));
			const sets = table.probes.map((_, p) => {
				const set = new Uint32Array(words);
				const a = acceptOf(table, p, s);
				others.forEach((t, e) => {
					const b = acceptOf(table, p, t);
					if (b !== null && (a === null || b.high < a.low || a.high < b.low)) set[e >>> 5] |= 1 << (e & 31);
				});
				return set;
			});
			const byCount = leastCover(sets, unit, others.length, budget);
			const byCost = leastCover(sets, cost, others.length, budget);
			exact &&= byCount.exact && byCost.exact;
			got = { p: byCount.value, c: byCost.value };
			memo.set(key, got);
		}
		dProbes[s] = got.p;
		dCost[s] = got.c;
	}
	const separationProbes = members.reduce((a, s) => a + w[s] * dProbes[s], 0);
	const separationCost = members.reduce((a, s) => a + w[s] * dCost[s], 0);
	let K = 1;
	table.probes.forEach((p, i) => (K = Math.max(K, maxOutcomes(sub.readings[i], p.tolerance, sub.bands?.[i]))));
	const chances = classes.map((c) => c.reduce((a, s) => a + w[s], 0));
	const huffman = K > 1 ? huffmanExpectedLength(chances, K) : 0;
	const lagrange = floorBound(
		classes.map((c) => c.map((s) => ({ w: w[s], d: dProbes[s] }))),
		K
	);
	const probes = Math.max(huffman, separationProbes, lagrange);
	const cMin = Math.min(...cost);
	return { probes, cost: Math.max(separationCost, cMin * probes), separationProbes, separationCost, huffman, exact };
}
