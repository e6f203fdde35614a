/**
 * Benchmark of the fault reasoning (not a test).
 *
 * 1. On generated harnesses of about 400 and 1,600 parts with about 100 and 400 suspects (single
 *    faults of the region around a few marked loads, one sweep value per resistive site): time of
 *    all predictions (every suspect × every candidate probe) incrementally against full re-solves
 *    (measured on a sample of suspect–probe pairs and scaled up), with the fallbacks counted;
 *    also against one full solve per suspect only (the least any non-incremental method does, not
 *    counting the probes' own load); minimal-set and plan times.
 * 2. On generated fault cases: plant a fault, derive the marks a person would make from its
 *    predicted behaviour, compute the suspects of those marks and their plan as the app does
 *    (`diagnose`), and compare the plan's expected number of probes with (a) the
 *    information-theoretic lower bound from the suspects' priors and the number of outcome bins
 *    and (b) the point-by-point walk along the feed from the battery.
 *
 * Targets: ratio ≥ 10× at 1,600 parts; plan within 1.25× of the bound; at most half the walk.
 * Run: `npx tsx scripts/bench/faults.ts` (or `npm run bench -- faults`).
 */
import { buildCircuit } from '../../src/lib/circuit/circuit';
import { minimalProbeSet } from '../../src/lib/circuit/cover';
import { diagnose } from '../../src/lib/circuit/diagnose';
import { generateHypotheses, regionOf } from '../../src/lib/circuit/faults';
import { ENTRY_DMM } from '../../src/lib/circuit/meter-profiles';
import { buildPlan, expectedProbesLowerBound, pointByPointWalk } from '../../src/lib/circuit/plan';
import { Base, emptyFallbacks, faultedCircuit, fullReading, predictReadings } from '../../src/lib/circuit/predict';
import { candidateProbes, tableReading } from '../../src/lib/circuit/probes';
import type { PredictionTable } from '../../src/lib/circuit/outcomes';
import { solveCircuit } from '../../src/lib/circuit/solve';
import { markOf, observedElement, quantity, type PartMark } from '../../src/lib/circuit/symptoms';
import { generateHarness, prng } from '../../src/lib/circuit/testing/generate';

const now = () => performance.now();

export async function timing(): Promise<void> {
	for (const [size, marked, suspects] of [[400, 2, 100], [1600, 6, 400]] as const) {
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
		const specs = candidateProbes(doc, scenario, c, base.solution, region, { profile: ENTRY_DMM, tools: ['volts', 'lamp', 'drop'] });
		const meters = specs.map((s) => s.meter);
		const fb = emptyFallbacks();
		t = now();
		const rows = predictReadings(base, hyps, meters, fb);
		const incMs = now() - t + baseMs;
		// Full re-solve per pair, on a sample.
		const sample = 40;
		t = now();
		for (let i = 0; i < sample; i++) fullReading(c, r.pick(hyps).changes, r.pick(meters));
		const perPair = (now() - t) / sample;
		const fullMs = perPair * hyps.length * meters.length;
		t = now();
		for (let i = 0; i < 20; i++) solveCircuit(faultedCircuit(c, r.pick(hyps).changes));
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
			`${size} parts (${c.nodeNames.length} nodes): ${hyps.length} suspects × ${meters.length} probes; incremental ${(incMs / 1000).toFixed(2)} s, ` +
				`full re-solve ≈ ${(fullMs / 1000).toFixed(0)} s (${perPair.toFixed(2)} ms a pair) → ratio ${(fullMs / incMs).toFixed(0)}×; ` +
				`one full solve per suspect only ≈ ${((perHyp * hyps.length) / 1000).toFixed(2)} s → ratio ${((perHyp * hyps.length) / incMs).toFixed(2)}×`
		);
		console.log(
			`  fallbacks ${JSON.stringify(fb)}; minimal set ${cover.probes.length} probes (${coverMs.toFixed(0)} ms, greedy); plan ${plan.steps} steps, ${plan.expectedProbes.toFixed(2)} probes expected (${planMs.toFixed(0)} ms)`
		);
	}
}

/** The marks a person would make with this fault present: every observable part in the region that misbehaves, and a few that do not. */
function plantedMarks(doc: ReturnType<typeof generateHarness>['doc'], scenario: ReturnType<typeof generateHarness>['scenario'], changes: Parameters<typeof faultedCircuit>[1], c: ReturnType<typeof buildCircuit>, healthy: ReturnType<typeof solveCircuit>): PartMark[] {
	const s = solveCircuit(faultedCircuit(c, changes));
	const marks: PartMark[] = [];
	const normal: PartMark[] = [];
	for (const p of doc.parts) {
		const o = observedElement(c, p);
		if (!o) continue;
		const e = c.elements[o.element];
		const h = quantity(o.judged, healthy.g[o.element], healthy.at(e.a) - healthy.at(e.b));
		if (!(h > 1e-9)) continue;
		const q = quantity(o.judged, s.g[o.element], s.at(e.a) - s.at(e.b));
		const mark = markOf(o.judged, q / h);
		(mark === 'normal' ? normal : marks).push({ part: p.id, mark });
	}
	void scenario;
	return marks.length ? [...marks, ...normal.slice(0, 2)] : [];
}

export async function quality(): Promise<void> {
	const want = 50;
	let cases = 0;
	let planSum = 0;
	let boundSum = 0;
	let walkSum = 0;
	let suspectSum = 0;
	let skipped = 0;
	let ms = 0;
	for (let seed = 1; cases < want && seed < 400; seed++) {
		const { doc, scenario } = generateHarness(7000 + seed, { parts: 60 });
		const c = buildCircuit(doc, scenario);
		const healthy = solveCircuit(c);
		const r = prng(seed);
		const faults = generateHypotheses(c).filter((h) => h.kind !== 'none');
		const planted = r.pick(faults);
		const marks = plantedMarks(doc, scenario, planted.changes, c, healthy);
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
		ms += now() - t;
		const table = result.table;
		if (table.suspects.length < 2) {
			skipped++;
			continue;
		}
		// The walk's order: the candidate probes along the feed from the battery, as diagnose made them.
		const abnormal = marks.filter((m) => m.mark !== 'normal').map((m) => m.part);
		const specs = candidateProbes(doc, scenario, c, healthy, regionOf(doc, scenario, abnormal), { profile: ENTRY_DMM, partOut: abnormal });
		const inTable = new Set(table.probes.map((p) => p.id));
		const order = specs.filter((s) => inTable.has(s.id)).sort((a, b) => a.order - b.order).map((s) => s.id);
		const bound = expectedProbesLowerBound(table);
		const walk = pointByPointWalk(table, order);
		planSum += result.plan.expectedProbes;
		boundSum += bound.probes;
		walkSum += walk.expectedProbes;
		suspectSum += table.suspects.length;
		cases++;
	}
	const plan = planSum / cases;
	const bound = boundSum / cases;
	const walk = walkSum / cases;
	console.log(
		`${cases} planted-fault cases (60-part harnesses; ${skipped} faults skipped: no misbehaving part, or a single suspect), ${(suspectSum / cases).toFixed(1)} suspects on average, ${(ms / cases).toFixed(0)} ms a diagnosis:`
	);
	console.log(
		`  plan ${plan.toFixed(2)} probes on average; lower bound ${bound.toFixed(2)} (ratio ${(plan / bound).toFixed(2)}, target ≤ 1.25); point-by-point walk ${walk.toFixed(2)} (ratio ${(plan / walk).toFixed(2)}, target ≤ 0.5)`
	);
}

export async function run(): Promise<void> {
	await timing();
	await quality();
}

if (import.meta.url === `file://${process.argv[1]}`) await run();
