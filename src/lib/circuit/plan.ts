// The step-by-step probe plan: a decision tree over the suspects, its printed checklist, what
// it costs on average, and the yardsticks the benchmark compares it with.
//
// At each step (a set of remaining suspects with their chances, the priors renormalised) the
// next probe is chosen by plan-search.ts: where few suspects are left, the probe that starts
// the cheapest tree (an exact search); where a few dozen are, a rollout that finishes each
// outcome with the rule below and keeps the probe of least total (never worse than the rule
// alone); above that, the one-step rule: the most expected information per unit of cost (the
// entropy of the suspects' distribution minus its expected entropy after reading the probe's
// outcome bin, divided by the probe's cost). Finding the cheapest decision tree is NP-hard in
// general (Hyafil & Rivest 1976, "Constructing optimal binary decision trees is NP-complete",
// Inf. Process. Lett. 5(1):15–17), hence the limits. The cost is the probes' reach cost
// (`objective: 'cost'`, the default) or one per probe (`'probes'`). Bins are worked out again
// over the suspects still in play at each step, which can be finer than the table-wide bins
// (outcomes.ts: tolerance chains break when suspects drop out).
//
// A suspect with no defined reading on the chosen probe cannot be ruled out by it: it goes on
// into every branch, and is taken to be equally likely to show any of the K bins (weight ÷ K
// in each branch), which keeps the branch chances summing to one. replan() weighs real
// readings the same way.
//
// A step ends the plan with one suspect left ("found"), or with several that no probe tells
// apart any more ("cannot be told apart with a meter: replace or inspect"). Depth and size are
// bounded; branches cut short are "unresolved" and are planned again from real readings.
import { ambiguityClasses } from './cover';
import { huffmanExpectedLength } from './huffman';
import { PlanSearch, type Objective, type SearchLimits } from './plan-search';
import { prepare, type State } from './plan-split';
import {
	acceptOf,
	binReadings,
	planningView,
	subTable,
	checkTable,
	beyond,
	toleranceAt,
	formatRange,
	maxOutcomes,
	type OutcomeBin,
	type PredictionTable,
	type ReadingRange
} from './outcomes';

export type PlanOptions = {
	/** Probe ids that cannot be used. */
	exclude?: readonly string[];
	/** Chance weight of each suspect instead of its prior (0 = ruled out); renormalised. */
	weights?: readonly number[];
	/** Most probes along any branch (default 30). */
	maxDepth?: number;
	/** Most steps in the whole plan (default 2000); the likeliest branches are planned first. */
	maxSteps?: number;
	/** What the plan keeps low: the expected reach cost of its probes (default) or their expected number. */
	objective?: Objective;
	/** Limits of the lookahead (plan-search.ts); false for the one-step rule alone. */
	lookahead?: SearchLimits | false;
	/** A probe id the plan takes first whatever it tells apart (the battery's own voltage). */
	first?: string;
};

export { huffmanExpectedLength };
export type { Objective, SearchLimits };

type NodeBase = {
	/** Suspect indices still in play here. */
	suspects: number[];
	/** Chance of reaching this point, from the start of the plan. */
	mass: number;
	/** Probes taken before this point. */
	depth: number;
	/** Cost of the probes taken before this point. */
	spent: number;
};

export type PlanStep = NodeBase & {
	kind: 'probe';
	probe: number;
	/** Chance of each suspect here (same order as `suspects`), summing to one. */
	chances: number[];
	/** Expected information from this probe, in bits. */
	gain: number;
	outcomes: PlanOutcome[];
	/** Suspects with no defined reading on this probe: they follow every outcome. */
	unread: number[];
};

export type PlanOutcome = {
	bin: OutcomeBin;
	/** Chance of this outcome given that the step is reached. */
	chance: number;
	next: PlanNode;
};

export type PlanLeaf = NodeBase &
	(
		| { kind: 'found'; suspect: number }
		| { kind: 'ambiguous' }
		| { kind: 'unresolved'; reason: 'depth limit' | 'size limit' }
	);

export type PlanNode = PlanStep | PlanLeaf;

export type Plan = {
	root: PlanNode;
	/** Number of probe steps in the tree. */
	steps: number;
	/** Expected number of probes until a leaf, under the suspects' chances. */
	expectedProbes: number;
	expectedCost: number;
	/** Chance of ending on an unresolved leaf (0 for a complete plan). */
	unresolvedMass: number;
	/** What the plan was built to keep low. */
	objective: Objective;
	/** The lookahead's work (suspect × probe visits), and whether its budget ran out. */
	lookahead: { work: number; cut: boolean } | null;
};

function availability(table: PredictionTable, exclude: readonly string[] | undefined, where: string): boolean[] {
	const available = table.probes.map(() => true);
	(exclude ?? []).forEach((id, i) => {
		const p = table.probes.findIndex((q) => q.id === id);
		if (p < 0) throw new Error(`${where}: exclude[${i}] names probe "${id}", which is not in the table`);
		available[p] = false;
	});
	return available;
}

function startWeights(table: PredictionTable, weights: readonly number[] | undefined, where: string): number[] {
	const w = weights ? [...weights] : table.suspects.map((s) => s.prior);
	if (w.length !== table.suspects.length) throw new Error(`${where}: weights has ${w.length} entries, expected one per suspect (${table.suspects.length})`);
	w.forEach((x, i) => {
		if (!(Number.isFinite(x) && x >= 0)) throw new Error(`${where}: weights[${i}] must be a finite number ≥ 0, got ${x}`);
	});
	const total = w.reduce((a, b) => a + b, 0);
	if (!(total > 0)) throw new Error(`${where}: weights are all zero: no suspect left to plan for`);
	return w.map((x) => x / total);
}

/**
 * Builds the plan: a decision tree whose every step takes the probe plan-search.ts chooses
 * (see the file header).
 *
 * @example
 * const plan = buildPlan(table);
 * const steps = checklist(table, plan); // "12.52–12.68 V: go to step 2" …
 */
export function buildPlan(table: PredictionTable, options: PlanOptions = {}): Plan {
	checkTable(table, 'buildPlan');
	const maxDepth = options.maxDepth ?? 30;
	const maxSteps = options.maxSteps ?? 2000;
	const objective = options.objective ?? 'cost';
	if (objective !== 'cost' && objective !== 'probes') throw new Error(`buildPlan: objective must be "cost" or "probes", got ${JSON.stringify(objective)}`);
	const available = availability(table, options.exclude, 'buildPlan');
	const start = startWeights(table, options.weights, 'buildPlan');
	const prep = prepare(table);
	const probes = table.probes.map((_, p) => p).filter((p) => available[p]);
	const search = new PlanSearch(table, prep, probes, objective, options.lookahead || {});
	const firstProbe = options.first !== undefined && available[table.probes.findIndex((q) => q.id === options.first)] ? table.probes.findIndex((q) => q.id === options.first) : -1;
	const pick = (s: State) => (options.lookahead === false ? search.greedyPick(s, false) : search.choose(s));

	// Weights are absolute chances of (suspect, reaching this point), in the order of `members`.
	type Pending = State & { depth: number; spent: number; place: (n: PlanNode) => void; seq: number };
	const heap: Pending[] = [];
	// Max-heap on mass, first come first served among equals (keeps the plan deterministic).
	const before = (a: Pending, b: Pending): boolean => a.mass > b.mass || (a.mass === b.mass && a.seq < b.seq);
	const push = (x: Pending): void => {
		heap.push(x);
		for (let i = heap.length - 1; i > 0; ) {
			const q = (i - 1) >> 1;
			if (!before(heap[i], heap[q])) break;
			[heap[i], heap[q]] = [heap[q], heap[i]];
			i = q;
		}
	};
	const pop = (): Pending => {
		const top = heap[0];
		const last = heap.pop()!;
		if (heap.length > 0) {
			heap[0] = last;
			for (let i = 0; ; ) {
				const l = 2 * i + 1;
				const r = l + 1;
				let m = i;
				if (l < heap.length && before(heap[l], heap[m])) m = l;
				if (r < heap.length && before(heap[r], heap[m])) m = r;
				if (m === i) break;
				[heap[i], heap[m]] = [heap[m], heap[i]];
				i = m;
			}
		}
		return top;
	};

	let root: PlanNode | null = null;
	let seq = 0;
	const members0 = table.suspects.map((_, s) => s).filter((s) => start[s] > 0);
	const w0 = Float64Array.from(members0, (s) => start[s]);
	push({ members: members0, weights: w0, mass: w0.reduce((a, b) => a + b, 0), depth: 0, spent: 0, place: (n) => (root = n), seq: seq++ });
	let steps = 0;
	while (heap.length > 0) {
		const at = pop();
		const mass = at.mass;
		const base: NodeBase = { suspects: at.members, mass, depth: at.depth, spent: at.spent };
		if (at.members.length === 1) {
			at.place({ ...base, kind: 'found', suspect: at.members[0] });
			continue;
		}
		// The depth and size limits are checked before the lookahead, which is the costly part.
		const limited = at.depth >= maxDepth || steps >= maxSteps;
		const chosen = firstProbe >= 0 && at.depth === 0 && !limited ? { probe: firstProbe, gain: 0 } : limited ? search.greedyPick(at, false) : pick(at);
		if (!chosen) {
			at.place({ ...base, kind: 'ambiguous' });
			continue;
		}
		if (limited) {
			at.place({ ...base, kind: 'unresolved', reason: at.depth >= maxDepth ? 'depth limit' : 'size limit' });
			continue;
		}
		const best = chosen.probe;
		steps++;
		const { bins, unread } = binReadings(table.readings[best], table.probes[best].tolerance, at.members, table.bands?.[best]);
		const kids = search.split(at, best);
		if (kids.length !== bins.length) throw new Error(`buildPlan: internal error: ${kids.length} outcomes against ${bins.length} bins on probe "${table.probes[best].id}"`);
		const step: PlanStep = {
			...base,
			kind: 'probe',
			probe: best,
			chances: Array.from(at.weights, (x) => x / mass),
			gain: chosen.gain,
			outcomes: [],
			unread
		};
		bins.forEach((bin, b) => {
			const outcome: PlanOutcome = { bin, chance: 0, next: null as unknown as PlanNode };
			const k = kids[b];
			const child: Pending = { ...k, depth: at.depth + 1, spent: at.spent + table.probes[best].cost, place: (n) => (outcome.next = n), seq: seq++ };
			outcome.chance = k.mass / mass;
			step.outcomes.push(outcome);
			push(child);
		});
		at.place(step);
	}
	const tree = root as unknown as PlanNode;
	return { root: tree, steps, ...expectedProbes(tree), objective, lookahead: options.lookahead === false ? null : { work: search.work, cut: search.cut } };
}

/**
 * Expected number of probes and cost of a plan under the suspects' chances: Σ over leaves of
 * (chance of ending there) × (probes, cost on the way). Unresolved leaves count what was spent
 * up to them, so a cut plan's figures are lower bounds on what finishing it takes.
 */
export function expectedProbes(root: PlanNode): { expectedProbes: number; expectedCost: number; unresolvedMass: number } {
	let probes = 0;
	let cost = 0;
	let unresolvedMass = 0;
	for (const leaf of leaves(root)) {
		probes += leaf.mass * leaf.depth;
		cost += leaf.mass * leaf.spent;
		if (leaf.kind === 'unresolved') unresolvedMass += leaf.mass;
	}
	return { expectedProbes: probes, expectedCost: cost, unresolvedMass };
}

/** The leaves of a plan, depth first. */
export function leaves(node: PlanNode): PlanLeaf[] {
	if (node.kind !== 'probe') return [node];
	return node.outcomes.flatMap((o) => leaves(o.next));
}

// ---- The printed checklist ----

export type ChecklistThen =
	| { kind: 'step'; step: number }
	| { kind: 'found'; suspect: string }
	| { kind: 'ambiguous'; suspects: string[] }
	| { kind: 'unresolved'; suspects: string[] };

export type ChecklistOutcome = {
	accepts: ReadingRange;
	/** The reading range as printed, with the probe's unit. */
	reading: string;
	chance: number;
	then: ChecklistThen;
	/** One line for the page: "12.52–12.68 V: go to step 3". */
	text: string;
};

export type ChecklistStep = {
	step: number;
	probe: string;
	label: string;
	cost: number;
	/** What each remaining suspect predicts here, likeliest first. */
	expected: { suspect: string; label: string; reading: number | null; chance: number }[];
	outcomes: ChecklistOutcome[];
	/** What to do when the reading falls in none of the ranges. */
	otherwise: string;
};

export const NO_BIN_MATCHES =
	'No range matches: no suspect predicts this reading. Check the probe contact, the meter setting and the diagram, then enter the reading to plan again.';

/**
 * Flattens a plan into numbered steps (depth first, outcomes in rising order of reading), each
 * outcome saying where to go next or what was found.
 */
export function checklist(table: PredictionTable, plan: Plan, digits = 2): ChecklistStep[] {
	const steps: ChecklistStep[] = [];
	const names = (ids: number[]) => ids.map((s) => table.suspects[s].label ?? table.suspects[s].id);
	const visit = (node: PlanStep): number => {
		const number = steps.length + 1;
		const probe = table.probes[node.probe];
		const step: ChecklistStep = {
			step: number,
			probe: probe.id,
			label: probe.label ?? probe.id,
			cost: probe.cost,
			expected: node.suspects
				.map((s, i) => ({ suspect: table.suspects[s].id, label: table.suspects[s].label ?? table.suspects[s].id, reading: table.readings[node.probe][s], chance: node.chances[i] }))
				.sort((a, b) => b.chance - a.chance),
			outcomes: [],
			otherwise: NO_BIN_MATCHES
		};
		steps.push(step);
		for (const o of node.outcomes) {
			const reading = formatRange(o.bin.accepts, probe.unit ?? '', digits);
			const next = o.next;
			let then: ChecklistThen;
			let text: string;
			if (next.kind === 'probe') {
				then = { kind: 'step', step: visit(next) };
				text = `${reading}: go to step ${then.step}`;
			} else if (next.kind === 'found') {
				then = { kind: 'found', suspect: table.suspects[next.suspect].id };
				text = `${reading}: found — ${names([next.suspect])[0]}`;
			} else if (next.kind === 'ambiguous') {
				then = { kind: 'ambiguous', suspects: next.suspects.map((s) => table.suspects[s].id) };
				text = `${reading}: cannot be told apart with a meter: replace or inspect — ${names(next.suspects).join(', ')}`;
			} else {
				then = { kind: 'unresolved', suspects: next.suspects.map((s) => table.suspects[s].id) };
				text = `${reading}: enter the readings so far to plan again — ${names(next.suspects).join(', ')}`;
			}
			step.outcomes.push({ accepts: o.bin.accepts, reading, chance: o.chance, then, text });
		}
		return number;
	};
	if (plan.root.kind === 'probe') visit(plan.root);
	return steps;
}

// ---- Yardsticks ----

export type LowerBound = {
	/** No strategy's expected probe count is below this. */
	probes: number;
	/** H of the chances of the ambiguity classes, in bits. */
	entropyBits: number;
	/** K: the most outcomes any one probe can tell apart. */
	maxOutcomes: number;
};

/**
 * The information-theoretic lower bound on the expected number of probes of any plan.
 *
 * Statement: let C be the ambiguity class of the true suspect (cover.ts; no meter reading can
 * split a class, and each class has its chance, the sum of its suspects' chances) and K the
 * largest number of pairwise told-apart readings of any one probe (outcomes.ts maxOutcomes).
 * Any plan that takes one probe at a time, branches into at most K outcomes per probe and
 * ends each branch inside one class takes on average at least H(C) / log2 K probes.
 * Why: the outcomes read along a branch form a K-ary prefix-free code for the leaf reached,
 * and the leaf determines C, so E[probes] ≥ H(leaf)/log2 K ≥ H(C)/log2 K (Shannon 1948, "A
 * Mathematical Theory of Communication", Bell Syst. Tech. J. 27, the noiseless coding theorem;
 * with the Kraft–McMillan inequality for K-ary prefix codes). When every suspect is its own
 * class this is H(priors)/log2 K. It does not bound plans cut short (unresolved leaves).
 */
export function expectedProbesLowerBound(table: PredictionTable, options: Pick<PlanOptions, 'exclude' | 'weights'> = {}): LowerBound {
	checkTable(table, 'expectedProbesLowerBound');
	const available = availability(table, options.exclude, 'expectedProbesLowerBound');
	const w = startWeights(table, options.weights, 'expectedProbesLowerBound');
	const members = table.suspects.map((_, s) => s).filter((s) => w[s] > 0);
	const sub = subTable(table, members);
	const exclude = table.probes.filter((_, p) => !available[p]).map((p) => p.id);
	const classes = ambiguityClasses(sub, { exclude });
	let h = 0;
	for (const c of classes) {
		const m = c.reduce((a, i) => a + w[members[i]], 0);
		if (m > 0) h -= m * Math.log2(m);
	}
	let K = 1;
	sub.probes.forEach((p, i) => {
		if (available[i]) K = Math.max(K, maxOutcomes(sub.readings[i], p.tolerance, sub.bands?.[i]));
	});
	return { probes: K > 1 ? h / Math.log2(K) : 0, entropyBits: h, maxOutcomes: K };
}

export type HuffmanBound = {
	/** No probe-at-a-time plan's expected probe count is below this. */
	probes: number;
	/** K, as in `expectedProbesLowerBound`. */
	maxOutcomes: number;
	/** Number of ambiguity classes with a chance above zero. */
	classes: number;
};

/**
 * A tighter lower bound on the expected number of probes: the expected length of an optimal
 * K-ary Huffman code over the chances of the ambiguity classes (K and the classes as in
 * `expectedProbesLowerBound`).
 *
 * Proof. Take any plan that takes one probe at a time, has at most K outcomes per probe and ends
 * every branch inside one class. Label each probe's outcomes with distinct digits 0..K−1; the
 * digits read from the start to a leaf form a word, and since no leaf lies on the way to another
 * the words of the leaves form a K-ary prefix-free code. Several leaves may belong to one class
 * c (and a suspect with no reading follows every branch, so its chance may be spread over many
 * leaves); all that ends in class c, chance p_c, ends at leaves no shallower than c's shallowest
 * leaf, of depth ℓ_c. So E[probes] ≥ Σ_c p_c ℓ_c. Keeping just one shallowest leaf per class
 * still gives a prefix-free code (a subset of one), with one word per class of length ℓ_c, and no
 * K-ary prefix code does better on average than Huffman's; hence E[probes] ≥ Huffman_K(p). The
 * Huffman length is itself ≥ H(p)/log2 K (Shannon's bound), so this bound is never below
 * `expectedProbesLowerBound`. Like that one it does not bound plans cut short.
 */
export function huffmanLowerBound(table: PredictionTable, options: Pick<PlanOptions, 'exclude' | 'weights'> = {}): HuffmanBound {
	checkTable(table, 'huffmanLowerBound');
	const available = availability(table, options.exclude, 'huffmanLowerBound');
	const w = startWeights(table, options.weights, 'huffmanLowerBound');
	const members = table.suspects.map((_, s) => s).filter((s) => w[s] > 0);
	const sub = subTable(table, members);
	const exclude = table.probes.filter((_, p) => !available[p]).map((p) => p.id);
	const chances = ambiguityClasses(sub, { exclude })
		.map((c) => c.reduce((a, i) => a + w[members[i]], 0))
		.filter((m) => m > 0);
	let K = 1;
	sub.probes.forEach((p, i) => {
		if (available[i]) K = Math.max(K, maxOutcomes(sub.readings[i], p.tolerance, sub.bands?.[i]));
	});
	return { probes: K > 1 ? huffmanExpectedLength(chances, K) : 0, maxOutcomes: K, classes: chances.length };
}

export type Optimum = {
	/** Expected cost (or probes) of the best plan found; the optimum when `proven`. */
	value: number;
	/** Proven lower bound on the optimum (equal to `value` when proven). */
	lower: number;
	proven: boolean;
	/** Search work (suspect × probe visits). */
	work: number;
};

/**
 * The least expected cost (objective "cost") or number of probes ("probes") of any complete
 * plan, by the exact search of plan-search.ts over every point, within a work budget (default
 * 10⁸ suspect × probe visits); past it, the best plan found and a proven lower bound.
 */
export function optimalExpected(table: PredictionTable, options: Pick<PlanOptions, 'exclude' | 'weights' | 'objective'> & { budget?: number } = {}): Optimum {
	checkTable(table, 'optimalExpected');
	const available = availability(table, options.exclude, 'optimalExpected');
	const start = startWeights(table, options.weights, 'optimalExpected');
	const probes = table.probes.map((_, p) => p).filter((p) => available[p]);
	const search = new PlanSearch(table, prepare(table), probes, options.objective ?? 'cost', { exactUpTo: Infinity, budget: options.budget ?? 1e8 });
	const members = table.suspects.map((_, s) => s).filter((s) => start[s] > 0);
	const r = search.optimum({ members, weights: Float64Array.from(members, (s) => start[s]), mass: 1 });
	return { ...r, work: search.work };
}

export type WalkResult = {
	expectedProbes: number;
	expectedCost: number;
	/** Chance that the walk ends without locating the fault. */
	unlocatedMass: number;
};

/**
 * The point-by-point walk a person makes without a plan: take the probes in the given order
 * (along the feed from the battery), drop the suspects each reading rules out, and stop once
 * the remaining suspects lie within the true suspect's ambiguity class (located as far as a
 * meter can). Readings are taken to be exactly as predicted for the true suspect.
 */
export function pointByPointWalk(table: PredictionTable, order: readonly string[], options: Pick<PlanOptions, 'weights'> = {}): WalkResult {
	checkTable(table, 'pointByPointWalk');
	const w = startWeights(table, options.weights, 'pointByPointWalk');
	const seq = order.map((id, i) => {
		const p = table.probes.findIndex((q) => q.id === id);
		if (p < 0) throw new Error(`pointByPointWalk: order[${i}] names probe "${id}", which is not in the table`);
		return p;
	});
	const members = table.suspects.map((_, s) => s).filter((s) => w[s] > 0);
	const classOf = new Int32Array(table.suspects.length).fill(-1);
	ambiguityClasses(subTable(table, members)).forEach((c, k) => c.forEach((i) => (classOf[members[i]] = k)));
	let expectedProbes = 0;
	let expectedCost = 0;
	let unlocatedMass = 0;
	for (const s of members) {
		let left = members;
		let taken = 0;
		let spent = 0;
		const located = () => left.every((t) => classOf[t] === classOf[s]);
		for (const p of seq) {
			if (located()) break;
			taken++;
			spent += table.probes[p].cost;
			const x = acceptOf(table, p, s);
			if (x === null) continue;
			// Suspect s's readings span x; the walk keeps whoever could show some reading of it.
			left = left.filter((t) => {
				const r = acceptOf(table, p, t);
				return r === null || (r.low <= x.high && x.low <= r.high);
			});
		}
		if (!located()) unlocatedMass += w[s];
		expectedProbes += w[s] * taken;
		expectedCost += w[s] * spent;
	}
	return { expectedProbes, expectedCost, unlocatedMass };
}

export { subTable };

// ---- Planning again from real readings ----

export type ReadingTaken = { probe: string; reading: number } | { probe: string; unreachable: true };

/** A suspect whose fit to a reading falls below this is ruled out by it (a reading about 3.7 tolerances beyond its span). */
export const DROP_FIT = 1e-3;

export type ReplanResult = {
	/** Suspects still in play with their chances (renormalised), likeliest first; `outside` when a reading lies beyond its span. */
	remaining: { suspect: string; chance: number; outside?: boolean }[];
	/** Suspects ruled out, and by which reading. */
	dropped: { suspect: string; probe: string; reading: number }[];
	/** Readings no remaining suspect's span holds: kept and weighed against the nearest suspects, never used to rule them all out. */
	unexplained: { probe: string; reading: number; reason: 'no suspect predicts it' | 'contradicts the earlier readings'; nearest: string[] }[];
	/** Probes reported as not reachable; the new plan does without them. */
	unavailable: string[];
	/** The table of the remaining suspects, which the new plan's indices refer to. */
	table: PredictionTable;
	/** The new plan from here (a single leaf when one suspect or one class is left). */
	plan: Plan;
};

/**
 * Weighs the suspects by the readings taken so far and plans again from the ones left.
 *
 * Each reading x multiplies a suspect's weight by its fit: 1 anywhere inside its acceptance
 * interval (its span widened by the meter's tolerance), and beyond it exp(−z²/2) with z the
 * distance past the nearer end over σ = the meter's accuracy at x (without a pulsing band, which
 * the interval holds already) plus 1 % of x for the model's own error. So a reading near an edge lowers a suspect, one about 3.7 σ beyond rules it out
 * (DROP_FIT), and two suspects whose spans both hold the reading keep their prior odds: nothing
 * becomes certain on a difference the meter and the model cannot tell.
 *
 * A reading that no remaining suspect's interval holds is information, not an error: it is
 * reported with the nearest suspects, and the model is taken to be off by at least the nearest
 * one's distance d₀ (σ widened to d₀), so the suspects are weighed by how much farther they are
 * and the diagnosis goes on with the nearest ones, marked `outside`. Suspects with no defined
 * reading stay, at weight ÷ K as in the plan. A probe reported unreachable is left out.
 */
export function replan(table: PredictionTable, readingsTaken: readonly ReadingTaken[], options: PlanOptions = {}): ReplanResult {
	checkTable(table, 'replan');
	const w = startWeights(table, options.weights, 'replan');
	const unavailable = new Set(options.exclude ?? []);
	const dropped: ReplanResult['dropped'] = [];
	const unexplained: ReplanResult['unexplained'] = [];
	const outside = new Set<number>();
	readingsTaken.forEach((taken, i) => {
		const p = table.probes.findIndex((q) => q.id === taken?.probe);
		if (p < 0) throw new Error(`replan: readingsTaken[${i}].probe names probe "${taken?.probe}", which is not in the table`);
		if ('unreachable' in taken) {
			unavailable.add(taken.probe);
			return;
		}
		const x = taken.reading;
		if (!Number.isFinite(x)) throw new Error(`replan: readingsTaken[${i}].reading must be a finite number, got ${x}`);
		const { abs, rel } = table.probes[p].tolerance;
		// The meter's accuracy plus 1 % of the reading for the model's own error (bands.ts is first order).
		const meter = abs + rel * Math.abs(x) + 0.01 * Math.abs(x);
		const live = table.suspects.map((_, s) => s).filter((s) => w[s] > 0);
		const far = new Map<number, { d: number; sigma: number }>();
		for (const s of live) {
			const a = acceptOf(table, p, s);
			if (a) far.set(s, { d: beyond(a, x), sigma: meter });
		}
		if (!far.size) return;
		const d0 = Math.min(...[...far.values()].map((f) => f.d));
		const z = (f: { d: number; sigma: number }) => f.d / Math.max(f.sigma, d0, 1e-12);
		const z0 = Math.min(...[...far.values()].map(z));
		const fit = (s: number) => Math.exp(-0.5 * (z(far.get(s)!) ** 2 - z0 * z0));
		if (d0 > 0) {
			const anyone = table.suspects.some((_, s) => {
				const a = acceptOf(table, p, s);
				return a !== null && beyond(a, x) === 0;
			});
			const nearest = [...far.keys()].filter((s) => fit(s) >= 0.5);
			unexplained.push({ probe: taken.probe, reading: x, reason: anyone ? 'contradicts the earlier readings' : 'no suspect predicts it', nearest: nearest.map((s) => table.suspects[s].id) });
		}
		const K = binReadings(table.readings[p], table.probes[p].tolerance, live, table.bands?.[p]).bins.length;
		for (const s of live) {
			if (!far.has(s)) {
				w[s] /= Math.max(1, K);
				continue;
			}
			const f = fit(s);
			if (f < DROP_FIT) {
				w[s] = 0;
				dropped.push({ suspect: table.suspects[s].id, probe: taken.probe, reading: x });
			} else {
				w[s] *= f;
				if (d0 > 0) outside.add(s);
			}
		}
	});
	const members = table.suspects.map((_, s) => s).filter((s) => w[s] > 0);
	const total = members.reduce((a, s) => a + w[s], 0);
	const sub = subTable(table, members);
	// A probe already read tells nothing more (take it again by entering a new reading).
	const read = readingsTaken.filter((t) => !('unreachable' in t)).map((t) => t.probe);
	const plan = buildPlan(planningView(sub), { ...options, exclude: [...new Set([...unavailable, ...read])], weights: members.map((s) => w[s] / total) });
	return {
		remaining: members
			.map((s) => ({ suspect: table.suspects[s].id, chance: w[s] / total, ...(outside.has(s) ? { outside: true } : {}) }))
			.sort((a, b) => b.chance - a.chance),
		dropped,
		unexplained,
		unavailable: [...unavailable],
		table: sub,
		plan
	};
}
