/**
 * Benchmark of the fault reasoning (not a test). On generated harnesses of about 400 and 1,600
 * parts: hypotheses of a region around a few marked loads; time of all predictions (every
 * hypothesis × every candidate probe) incrementally against full re-solves (measured on a
 * sample of hypothesis–probe pairs and scaled up), with the fallbacks counted; minimal-set and
 * plan times; and on generated fault cases the plan's average number of probes against the
 * information-theoretic lower bound and the point-by-point walk along the feed.
 *
 * Targets: ratio ≥ 10× at 1,600 parts; plan within 1.25× of the bound; at most half the walk.
 * Run: `npx tsx scripts/bench/faults.ts`.
 */
import { buildCircuit } from '../../src/lib/circuit/circuit';
import { minimalProbeSet } from '../../src/lib/circuit/cover';
import { generateHypotheses, regionOf } from '../../src/lib/circuit/faults';
import { ENTRY_DMM } from '../../src/lib/circuit/meter-profiles';
import { buildPlan, expectedProbesLowerBound, pointByPointWalk } from '../../src/lib/circuit/plan';
import { Base, emptyFallbacks, fullReading, predictReadings } from '../../src/lib/circuit/predict';
import { candidateProbes, tableReading } from '../../src/lib/circuit/probes';
import type { PredictionTable } from '../../src/lib/circuit/outcomes';
import { generateHarness, prng } from '../../src/lib/circuit/testing/generate';

const now = () => performance.now();

export async function run(): Promise<void> {
	for (const [size, marked] of [[400, 3], [1600, 10]] as const) {
		const { doc, scenario } = generateHarness(4040 + size, { parts: size, crossLinks: 0.05, floating: 0.02 });
		const c = buildCircuit(doc, scenario);
		let t = now();
		const base = new Base(c);
		const baseMs = now() - t;
		const r = prng(size);
		const loads = doc.parts.filter((p) => ['lamp', 'gauge', 'motor', 'load'].includes(p.kind));
		const picked = Array.from({ length: marked }, () => r.pick(loads).id);
		const region = regionOf(doc, scenario, picked);
		const hyps = generateHypotheses(c, { region, sweep: [20] });
		const specs = candidateProbes(doc, scenario, c, base.solution, region, { profile: ENTRY_DMM, tools: ['volts', 'lamp', 'drop'] });
		const meters = specs.map((s) => s.meter);
		const fb = emptyFallbacks();
		t = now();
		const rows = predictReadings(base, hyps, meters, fb);
		const incMs = now() - t + baseMs;
		// Full re-solve per pair, on a sample.
		const sample = 60;
		t = now();
		for (let i = 0; i < sample; i++) fullReading(c, r.pick(hyps).changes, r.pick(meters));
		const perPair = (now() - t) / sample;
		const fullMs = perPair * hyps.length * meters.length;
		// Full re-solve per hypothesis only (no meter loading): the least any non-incremental method does.
		t = now();
		for (let i = 0; i < 20; i++) fullReading(c, r.pick(hyps).changes, { kind: 'current', element: 0 });
		const perHyp = (now() - t) / 20;
		const table: PredictionTable = {
			suspects: hyps.map((h) => ({ id: h.id, prior: h.prior })),
			probes: specs.map((s) => ({ id: s.id, cost: s.cost, tolerance: s.tolerance })),
			readings: specs.map((s, i) => Array.from(rows[i], (x) => Math.round(tableReading(s, x, ENTRY_DMM) * 1e6) / 1e6))
		};
		t = now();
		const cover = minimalProbeSet(table, { exactLimit: 0 });
		const coverMs = now() - t;
		t = now();
		const plan = buildPlan(table);
		const planMs = now() - t;
		console.log(
			`${size} parts: ${hyps.length} hypotheses × ${meters.length} probes; incremental ${incMs.toFixed(0)} ms, full re-solve ≈ ${(fullMs / 1000).toFixed(1)} s ` +
				`(${perPair.toFixed(2)} ms a pair) → ratio ${(fullMs / incMs).toFixed(0)}×; per-hypothesis full solves only ≈ ${(perHyp * hyps.length).toFixed(0)} ms → ratio ${((perHyp * hyps.length) / incMs).toFixed(1)}×`
		);
		console.log(`  fallbacks ${JSON.stringify(fb)}; minimal set ${cover.probes.length} probes (${coverMs.toFixed(0)} ms, exact ${cover.exact}); plan ${plan.steps} steps, ${plan.expectedProbes.toFixed(2)} probes expected (${planMs.toFixed(0)} ms)`);
		// Fault cases: every hypothesis is a case, weighted by its prior (≥ 50 cases).
		const bound = expectedProbesLowerBound(table);
		const order = specs.map((s, i) => [s.order, i] as const).sort((a, b) => b[0] - a[0]).map(([, i]) => specs[i].id);
		const walk = pointByPointWalk(table, order);
		console.log(
			`  ${hyps.length} fault cases: plan ${plan.expectedProbes.toFixed(2)} probes; lower bound ${bound.probes.toFixed(2)} (ratio ${(plan.expectedProbes / bound.probes).toFixed(2)}, target ≤ 1.25); point-by-point ${walk.expectedProbes.toFixed(2)} (ratio ${(plan.expectedProbes / walk.expectedProbes).toFixed(2)}, target ≤ 0.5)`
		);
	}
}

if (import.meta.url === `file://${process.argv[1]}`) await run();
