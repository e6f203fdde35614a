/**
 * Benchmark of the fault reasoning (not a test).
 *
 * 1. On generated harnesses of about 400 and 1,600 parts with about 100 and 400 suspects (single
 *    faults of the region around a few marked loads, one sweep value per resistive site): time of
 *    all predictions (every suspect × every candidate probe) incrementally, with the fallbacks
 *    counted, against a full re-solve per hypothesis computing the same readings (see the
 *    comment in `timing`), and beside it the old lower bound (one solve per suspect, ideal
 *    readings); minimal-set and plan times.
 * 2. On generated fault cases: plant a fault, derive the marks a person would make from its
 *    predicted behaviour, compute the suspects of those marks and their plan as the app does
 *    (`diagnose`: built to keep the expected reach cost low), and compare the plan's expected
 *    number of probes with (a) the information-theoretic lower bounds from the suspects'
 *    priors and the number of outcome bins (entropy, Huffman, Huffman with the separation
 *    floors of plan-bounds.ts), (b) the optimum found by exact search where it finishes, and
 *    (c) the point-by-point walk along the feed from the battery. A plan built to keep the
 *    number of probes low, and the one-step rule without lookahead, are printed beside it;
 *    the expected reach cost against its own bound and optimum too.
 *
 * Targets: ratio ≥ 10× at 1,600 parts; plan within 1.25× of the bound; at most half the walk.
 * Run: `npx tsx scripts/bench/faults.ts` (or `npm run bench -- faults`); `BENCH_FAULTS=quality`
 * or `BENCH_FAULTS=timing` runs one part only.
 */
import { availableParallelism, loadavg } from 'node:os';
import { buildCircuit } from '../../src/lib/circuit/circuit';
import { minimalProbeSet } from '../../src/lib/circuit/cover';
import { diagnose } from '../../src/lib/circuit/diagnose';
import { generateHypotheses, regionOf } from '../../src/lib/circuit/faults';
import { ENTRY_DMM, tableReading } from '../../src/lib/circuit/meter';
import { buildPlan, expectedProbesLowerBound, huffmanLowerBound, optimalExpected, pointByPointWalk } from '../../src/lib/circuit/plan';
import { separationLowerBound } from '../../src/lib/circuit/plan-bounds';
import { Base, emptyFallbacks, faultedCircuit, predictReadings, type Meter } from '../../src/lib/circuit/predict';
import { probeNode } from '../../src/lib/circuit/meters';
import { candidateProbes, feedWalkOrder } from '../../src/lib/circuit/probes';
import type { PredictionTable } from '../../src/lib/circuit/outcomes';
import { solveCircuit } from '../../src/lib/circuit/solve';
import { marksSeen } from '../../src/lib/circuit/testing/worlds';
import { generateHarness, prng } from '../../src/lib/circuit/testing/generate';

const now = () => performance.now();

/** A probe's nodes on a circuit (the meter's two points; a part current's element ends). */
function meterNodes(c: ReturnType<typeof buildCircuit>, m: Meter): [number, number] {
	if (m.kind === 'current') return [c.elements[m.element].a, c.elements[m.element].b];
	return [probeNode(c, m.a), probeNode(c, m.b)];
}

/** Relative difference of two readings with the floor of predict.spec.ts (1 V, full lamp brightness). */
const relDiff = (x: number, y: number) => Math.abs(x - y) / Math.max(Math.abs(x), Math.abs(y), 1);

export async function timing(): Promise<void> {
	// Every suspect × every candidate probe is timed incrementally. The two full re-solve baselines
	// are timed on `fullSample` and `fastSample` suspects spread evenly, on every probe, and scaled
	// to all suspects; the ideal-reading lower bound on `idealSample`.
	for (const [size, marked, suspects, fullSample, fastSample, idealSample] of [[400, 2, 100, 12, 20, 100], [1600, 6, 400, 3, 12, 60]] as const) {
		const { doc, scenario } = generateHarness(4040 + size, { parts: size, crossLinks: 0.05, floating: 0.02 });
		const c = buildCircuit(doc, scenario);
		let t = now();
		const base = new Base(c);
		const baseMs = now() - t;
		const r = prng(size);
		const loads = doc.parts.filter((p) => ['lamp', 'gauge', 'motor', 'load'].includes(p.kind));
		const picked = Array.from({ length: marked }, () => r.pick(loads).id);
		const region = regionOf(doc, scenario, picked);
		const all = generateHypotheses(c, { region, sweep: [20] });
		// About `suspects` of them, drawn evenly (the no-fault hypothesis kept).
		const step = Math.max(1, all.length / suspects);
		const hyps = Array.from({ length: Math.min(suspects, all.length) }, (_, i) => all[Math.floor(i * step)]);
		const allSpecs = candidateProbes(doc, scenario, c, base.solution, region, { profile: ENTRY_DMM, tools: ['volts', 'lamp', 'drop'] });
		const specs = allSpecs;
		const meters = specs.map((s) => s.meter);
		const lamps = meters.filter((m) => m.kind === 'lamp').length;
		const fb = emptyFallbacks();
		t = now();
		const rows = predictReadings(base, hyps, meters, fb);
		const incMs = now() - t + baseMs;
		// Full re-solve per hypothesis, like for like: for each suspect, its faulted circuit built
		// and solved on its own (solveCircuit: factorised, relays and stabilizers settled; only the
		// ordering of the healthy circuit's cached plan is reused, no numbers), then every probe read
		// with the same meter model as the incremental path, from that suspect's own factorisation:
		// (full) one more solve per probe (the meter's column G_h⁻¹u), the meter's conductance
		// added by Sherman–Morrison (the 10 MΩ voltmeter's and the test lamp's load), every relay
		// and stabilizer checked from that column, a test lamp's settling replayed on the suspect's
		// own first-round factorisation where solve.ts took more than one round, and any meter that
		// moves a state solved in full with the meter in (solveCircuit); (fast) the same, but the
		// meter's column taken only where it is read (entries of G_h⁻¹ from the suspect's own
		// factors) and the relays checked by the same state bound as the incremental path.
		// Both are `predictReadings` on a base built from the faulted circuit, with the no-fault
		// hypothesis only. They must agree with the incremental readings within 1e-9 relative.
		const spread = (count: number) => Array.from({ length: Math.min(count, hyps.length) }, (_, i) => Math.floor((i * hyps.length) / Math.min(count, hyps.length)));
		const baseline = (solveEachMeter: boolean, picks: number[]) => {
			let ms = 0;
			let worst = 0;
			for (const hi of picks) {
				const t0 = now();
				const own = new Base(faultedCircuit(c, hyps[hi].changes));
				const got = predictReadings(own, [{ changes: [] }], meters, emptyFallbacks(), { solveEachMeter });
				ms += now() - t0;
				for (let mi = 0; mi < meters.length; mi++) worst = Math.max(worst, relDiff(got[mi][0], rows[mi][hi]));
			}
			if (!(worst <= 1e-9)) throw new Error(`faults bench: a full re-solve per hypothesis differs from the incremental readings by ${worst.toExponential(2)} relative (${size} parts)`);
			return { sample: picks.length, perHyp: ms / picks.length, totalMs: (ms / picks.length) * hyps.length, worst };
		};
		const full = baseline(true, spread(fullSample));
		const fast = baseline(false, spread(fastSample));
		// The old lower bound: one solve per suspect and every probe's nodes read from it, ideal
		// meters (no load, no settling with the meter): less than any method computing the same
		// readings must do, so the ratio against it only says what a non-incremental method
		// could at best cost.
		const nodes = allSpecs.map((s) => meterNodes(c, s.meter));
		let sink = 0;
		const idealPicks = spread(idealSample);
		t = now();
		for (const hi of idealPicks) {
			const s = solveCircuit(faultedCircuit(c, hyps[hi].changes));
			for (const [a, b] of nodes) sink += s.at(a) - s.at(b);
		}
		const idealPer = (now() - t) / idealPicks.length;
		const idealMs = idealPer * hyps.length;
		void sink;
		const table: PredictionTable = {
			suspects: hyps.map((h) => ({ id: h.id, prior: h.prior })),
			probes: specs.map((s) => ({ id: s.id, cost: s.cost, tolerance: s.tolerance })),
			readings: specs.map((s, i) => Array.from(rows[i], (x) => Math.round(tableReading(s.kind, x, ENTRY_DMM) * 1e6) / 1e6))
		};
		t = now();
		const cover = minimalProbeSet(table, { exactLimit: 0 });
		const coverMs = now() - t;
		t = now();
		const plan = buildPlan(table);
		const planMs = now() - t;
		const sec = (ms: number) => (ms / 1000).toFixed(2);
		console.log(
			`${size} parts (${c.nodeNames.length} nodes): ${hyps.length} suspects × ${allSpecs.length} probes (${lamps} test lamps), every pair timed; incremental ${sec(incMs)} s (${((incMs * 1000) / (hyps.length * meters.length)).toFixed(2)} µs a pair)`
		);
		console.log(
			`  full re-solve per hypothesis, same readings (own factorisation, one solve per probe, states checked at every relay and stabilizer) ≈ ${sec(full.totalMs)} s (${full.perHyp.toFixed(1)} ms a suspect, ${full.sample} suspects sampled, max difference ${full.worst.toExponential(1)}) → ratio ${(full.totalMs / incMs).toFixed(2)}× (target ≥ 10× at 1,600 parts)`
		);
		console.log(
			`  same, with inverse entries and the state bound on its own factors ≈ ${sec(fast.totalMs)} s (${fast.perHyp.toFixed(1)} ms a suspect, ${fast.sample} sampled, max difference ${fast.worst.toExponential(1)}) → ratio ${(fast.totalMs / incMs).toFixed(2)}×`
		);
		console.log(
			`  lower bound on any non-incremental method: one solve per suspect, ideal readings (no meter load, no settling) of all ${allSpecs.length} probes read from it ≈ ${sec(idealMs)} s (${idealPer.toFixed(1)} ms a suspect, ${idealPicks.length} sampled) → ratio ${(idealMs / incMs).toFixed(2)}×`
		);
		console.log(
			`  fallbacks ${JSON.stringify(fb)}; minimal set ${cover.probes.length} probes (${coverMs.toFixed(0)} ms, greedy); plan ${plan.steps} steps, ${plan.expectedProbes.toFixed(2)} probes expected (${planMs.toFixed(0)} ms)`
		);
	}
}

export async function quality(): Promise<void> {
	const want = 50;
	// Work allowed to the exact search for each case's optimum (suspect × probe visits).
	const optimumBudget = 2e7;
	type Sums = Record<string, number>;
	const sum: Sums = {};
	const add = (k: string, v: number) => (sum[k] = (sum[k] ?? 0) + v);
	let cases = 0;
	let skipped = 0;
	let planMax = 0;
	const unproven: string[] = [];
	const perCase: string[] = [];
	for (let seed = 1; cases < want && seed < 400; seed++) {
		const { doc, scenario } = generateHarness(7000 + seed, { parts: 60 });
		const c = buildCircuit(doc, scenario);
		const healthy = solveCircuit(c);
		const r = prng(seed);
		const faults = generateHypotheses(c).filter((h) => h.kind !== 'none');
		const planted = r.pick(faults);
		const marks = marksSeen(c, healthy, planted.changes);
		if (!marks.length) {
			skipped++;
			continue;
		}
		const t = now();
		let result;
		try {
			result = diagnose({ doc, scenario, marks });
		} catch {
			skipped++;
			continue;
		}
		add('diagnoseMs', now() - t);
		const table = result.table;
		if (table.suspects.length < 2) {
			skipped++;
			continue;
		}
		// The walk: volts at each point of the marked parts' feeds from the battery, then their
		// earths, as a person checks without a plan (probes.ts feedWalkOrder).
		const abnormal = marks.filter((m) => m.mark !== 'normal').map((m) => m.part);
		const specs = candidateProbes(doc, scenario, c, healthy, regionOf(doc, scenario, abnormal), { profile: ENTRY_DMM, partOut: abnormal });
		const inTable = new Set(table.probes.map((p) => p.id));
		const order = feedWalkOrder(doc, scenario, c, specs, abnormal).filter((id) => inTable.has(id));
		// The app's plan (diagnose builds the same: reach cost, lookahead), timed on its own.
		const tp = now();
		const app = buildPlan(table);
		const planMs = now() - tp;
		planMax = Math.max(planMax, planMs);
		add('planMs', planMs);
		const appOneStep = buildPlan(table, { lookahead: false });
		const byProbes = buildPlan(table, { objective: 'probes' });
		const byProbesOneStep = buildPlan(table, { objective: 'probes', lookahead: false });
		// The same plans without the depth limit (a cut branch counts only the probes up to the cut).
		const uncut = buildPlan(table, { maxDepth: 1000 });
		const uncutOneStep = buildPlan(table, { maxDepth: 1000, lookahead: false });
		const uncutProbes = buildPlan(table, { maxDepth: 1000, objective: 'probes' });
		add('uncut', uncut.expectedProbes);
		add('uncutCost', uncut.expectedCost);
		add('uncutOne', uncutOneStep.expectedProbes);
		add('uncutOneCost', uncutOneStep.expectedCost);
		add('uncutProbes', uncutProbes.expectedProbes);
		add('app', app.expectedProbes);
		add('appCost', app.expectedCost);
		add('appCut', app.unresolvedMass);
		add('appOne', appOneStep.expectedProbes);
		add('appOneCost', appOneStep.expectedCost);
		add('appOneCut', appOneStep.unresolvedMass);
		add('probes', byProbes.expectedProbes);
		add('probesCost', byProbes.expectedCost);
		add('probesCut', byProbes.unresolvedMass);
		add('probesOne', byProbesOneStep.expectedProbes);
		add('probesOneCut', byProbesOneStep.unresolvedMass);
		add('entropy', expectedProbesLowerBound(table).probes);
		const huffman = huffmanLowerBound(table).probes;
		add('huffman', huffman);
		const sep = separationLowerBound(table);
		add('floors', sep.probes);
		add('costBound', sep.cost);
		// The optimum by exact search (no depth limit), each objective; where the budget runs out,
		// the proven lower bound goes into the bound's sum and the case is named.
		const optP = optimalExpected(table, { objective: 'probes', budget: optimumBudget });
		const optC = optimalExpected(table, { objective: 'cost', budget: optimumBudget });
		add('bestBound', Math.max(sep.probes, optP.lower));
		add('bestCostBound', Math.max(sep.cost, optC.lower));
		if (optP.proven) {
			add('provenP', 1);
			add('optP', optP.value);
			add('optPHuffman', huffman);
			add('optPPlan', byProbes.expectedProbes);
			add('optPApp', app.expectedProbes);
		} else unproven.push(`${table.suspects.length} suspects: probes in [${Math.max(sep.probes, optP.lower).toFixed(2)}, ${optP.value.toFixed(2)}]`);
		if (optC.proven) {
			add('provenC', 1);
			add('optC', optC.value);
			add('optCBound', sep.cost);
			add('optCApp', app.expectedCost);
		} else unproven.push(`${table.suspects.length} suspects: cost in [${Math.max(sep.cost, optC.lower).toFixed(2)}, ${optC.value.toFixed(2)}]`);
		perCase.push(`${table.suspects.length}:${byProbes.expectedProbes.toFixed(2)}/${optP.proven ? optP.value.toFixed(2) : `≥${Math.max(sep.probes, optP.lower).toFixed(2)}`}/${huffman.toFixed(2)}`);
		const walk = pointByPointWalk(table, order);
		add('walk', walk.expectedProbes);
		add('walkUnlocated', walk.unlocatedMass);
		add('suspects', table.suspects.length);
		cases++;
	}
	const avg = (k: string, n = cases) => (sum[k] ?? 0) / n;
	const f = (x: number) => x.toFixed(2);
	const pct = (k: string) => `${(100 * avg(k)).toFixed(1)} %`;
	const nP = sum.provenP ?? 0;
	const nC = sum.provenC ?? 0;
	console.log(
		`${cases} planted-fault cases (60-part harnesses; ${skipped} faults skipped: no misbehaving part, or a single suspect), ${avg('suspects').toFixed(1)} suspects on average, ${avg('diagnoseMs').toFixed(0)} ms a diagnosis (its plan ${avg('planMs').toFixed(0)} ms on average, at most ${planMax.toFixed(0)} ms; wall clock, load average ${loadavg()[0].toFixed(1)} on ${availableParallelism()} cores):`
	);
	console.log(
		`  app plan (built to keep the expected reach cost low; lookahead): ${f(avg('app'))} probes, cost ${f(avg('appCost'))} on average (one-step rule: ${f(avg('appOne'))} probes, cost ${f(avg('appOneCost'))}); cut at the depth limit: ${pct('appCut')} of the chance (one-step ${pct('appOneCut')}), counted only to the cut`
	);
	console.log(
		`  without the depth limit: app plan ${f(avg('uncut'))} probes, cost ${f(avg('uncutCost'))} (one-step rule: ${f(avg('uncutOne'))} probes, cost ${f(avg('uncutOneCost'))}); plan built for probes ${f(avg('uncutProbes'))} probes`
	);
	console.log(
		`  plan built to keep the number of probes low (lookahead): ${f(avg('probes'))} probes, cost ${f(avg('probesCost'))} (one-step rule: ${f(avg('probesOne'))} probes); cut: ${pct('probesCut')} of the chance (one-step ${pct('probesOneCut')})`
	);
	console.log(
		`  probe bounds: entropy H/log2 K ${f(avg('entropy'))}; Huffman ${f(avg('huffman'))} (probes plan ${f(avg('probes') / avg('huffman'))}×, app plan ${f(avg('app') / avg('huffman'))}×, target ≤ 1.25); Huffman with the separation floors (plan-bounds.ts) ${f(avg('floors'))} (probes plan ${f(avg('probes') / avg('floors'))}×, app plan ${f(avg('app') / avg('floors'))}×)`
	);
	console.log(
		`  optimum by exact search (no depth limit, ${optimumBudget.toExponential(0)} work a case), counting probes: proven on ${nP} of ${cases} cases; there the optimum is ${f(avg('optP', nP))} against Huffman ${f(avg('optPHuffman', nP))} (${f(avg('optP', nP) / avg('optPHuffman', nP))}×: no plan comes nearer the bound), probes plan ${f(avg('optPPlan', nP))} (${f(avg('optPPlan', nP) / avg('optP', nP))}× the optimum), app plan ${f(avg('optPApp', nP))}`
	);
	console.log(
		`  over all ${cases} cases, the best proven lower bound (the optimum where proven, else the larger of the separation bound and the search's own) ${f(avg('bestBound'))}: probes plan ${f(avg('probes') / avg('bestBound'))}×, app plan ${f(avg('app') / avg('bestBound'))}×`
	);
	console.log(
		`  reach cost: app plan ${f(avg('appCost'))} against the separation cost bound ${f(avg('costBound'))} (${f(avg('appCost') / avg('costBound'))}×) and the best proven bound ${f(avg('bestCostBound'))} (${f(avg('appCost') / avg('bestCostBound'))}×); optimum proven on ${nC} cases: ${f(avg('optC', nC))} against the separation cost bound ${f(avg('optCBound', nC))}, app plan ${f(avg('optCApp', nC))} (${f(avg('optCApp', nC) / avg('optC', nC))}× the optimum)`
	);
	if (unproven.length) console.log(`  exact search not finished within its budget (bound, best plan found): ${unproven.join('; ')}`);
	console.log(`  per case, suspects:probes plan/optimum (or its proven bound)/Huffman bound: ${perCase.join(' ')}`);
	console.log(
		`  point-by-point walk (volts along the feed from the battery, then the earth) ${f(avg('walk'))} probes (app plan ${f(avg('app') / avg('walk'))}×, target ≤ 0.5); the walk leaves the fault unlocated in ${(100 * avg('walkUnlocated')).toFixed(0)} % of the chance`
	);
}

export async function run(): Promise<void> {
	// BENCH_FAULTS=quality (or timing) runs one part only.
	const only = process.env.BENCH_FAULTS;
	if (only && only !== 'quality' && only !== 'timing') throw new Error(`BENCH_FAULTS must be "quality" or "timing", got "${only}"`);
	if (only !== 'quality') await timing();
	if (only !== 'timing') await quality();
}

if (import.meta.url === `file://${process.argv[1]}`) await run();
