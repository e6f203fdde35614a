/**
 * Benchmark of probe selection and planning (not a test): generated harness tables of 40, 100
 * and 400 suspects (src/lib/circuit/testing/tables.ts): suspects sampled from the harness's
 * single faults over the whole harness ("spread"), and 40 suspects that explain one symptom
 * ("symptom": the parts on one fuse misbehave).
 *
 * For each: the minimal probe set, exact (branch and bound) and greedy (Chvátal's bound), with
 * times and costs; the plan's build time; the plan's expected probes and cost against the
 * information-theoretic lower bound and the point-by-point walk along the feed.
 *
 * Target: the exact minimal set for 40 suspects within 1 s.
 *
 * Run: `tsx scripts/bench/plan.ts` (or through `npm run bench`).
 */
import { minimalProbeSet } from '../../src/lib/circuit/cover';
import { buildPlan, expectedProbesLowerBound, pointByPointWalk } from '../../src/lib/circuit/plan';
import { harnessTable, rng } from '../../src/lib/circuit/testing/tables';

const now = () => performance.now();
const ms = (x: number) => `${x < 10 ? x.toFixed(1) : x.toFixed(0)} ms`;
const f2 = (x: number) => x.toFixed(2);
const pad = (s: string, w: number) => s.padStart(w);

function timed<T>(fn: () => T): { value: T; ms: number } {
	const start = now();
	const value = fn();
	return { value, ms: now() - start };
}

export async function run(): Promise<void> {
	// "spread": suspects sampled over the whole harness; "symptom": the faults explaining one
	// fuse's parts misbehaving, with 120 of the harness's probes, walked along that fuse's feed.
	const cases: { suspects: number; seeds: number[]; symptom?: boolean; probes?: number }[] = [
		{ suspects: 40, seeds: [1, 2, 3, 4, 5], symptom: true, probes: 120 },
		{ suspects: 40, seeds: [1, 2, 3, 4, 5] },
		{ suspects: 100, seeds: [1, 2, 3] },
		{ suspects: 400, seeds: [1] }
	];
	// Warm the code paths so the first case's times are not compile times.
	minimalProbeSet(harnessTable(rng(99), { suspects: 30 }).table);
	buildPlan(harnessTable(rng(99), { suspects: 30 }).table);

	const header = [
		'kind',
		'suspects',
		'probes',
		'seed',
		'exact set',
		'exact ms',
		'nodes',
		'greedy set',
		'greedy ms',
		'H(d)',
		'set LB',
		'plan ms',
		'steps',
		'E[probes]',
		'E[cost]',
		'cut',
		'uncut E[probes]',
		'uncut E[cost]',
		'lower bound',
		'walk E[probes]',
		'walk E[cost]',
		'walk unlocated'
	];
	const rows: string[][] = [];
	for (const c of cases) {
		for (const seed of c.seeds) {
			const { table, walkOrder } = harnessTable(rng(seed), { suspects: c.suspects, symptom: c.symptom, probes: c.probes });
			const exact = timed(() => minimalProbeSet(table));
			const greedy = timed(() => minimalProbeSet(table, { exactLimit: 0 }));
			const plan = timed(() => buildPlan(table));
			const uncut = buildPlan(table, { maxDepth: table.suspects.length });
			const lb = expectedProbesLowerBound(table);
			const walk = pointByPointWalk(table, walkOrder);
			const e = exact.value;
			rows.push([
				c.symptom ? 'symptom' : 'spread',
				String(table.suspects.length),
				String(table.probes.length),
				String(seed),
				`${e.cost.toFixed(0)} (${e.probes.length})${e.exact ? '' : ' greedy'}`,
				ms(exact.ms),
				String(e.searchNodes),
				`${greedy.value.cost.toFixed(0)} (${greedy.value.probes.length})`,
				ms(greedy.ms),
				f2(greedy.value.bound?.ratio ?? 1),
				f2(greedy.value.bound?.lowerBound ?? greedy.value.cost),
				ms(plan.ms),
				String(plan.value.steps),
				f2(plan.value.expectedProbes),
				f2(plan.value.expectedCost),
				`${(plan.value.unresolvedMass * 100).toFixed(0)} %`,
				f2(uncut.expectedProbes),
				f2(uncut.expectedCost),
				f2(lb.probes),
				f2(walk.expectedProbes),
				f2(walk.expectedCost),
				`${(walk.unlocatedMass * 100).toFixed(0)} %`
			]);
		}
	}
	const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
	const line = (cells: string[]) => cells.map((x, i) => pad(x, widths[i])).join('  ');
	console.log('Loomwright probe planning benchmark (generated harness tables)');
	console.log(line(header));
	for (const r of rows) console.log(line(r));
	console.log(
		'\nexact set: cost (probes) of the minimal probe set; "greedy" when the search was not tried (over 128 suspect classes)\n' +
			'  or ran out of nodes. nodes: branch-and-bound nodes. greedy set: Chvátal greedy, H(d) its worst-case ratio,\n' +
			'  set LB a proven lower bound on the optimum.\n' +
			'plan: decision tree by information per cost (default depth limit 30); cut: chance of a branch cut at the limit.\n' +
			'uncut: the same plan without a practical depth limit. lower bound: H(ambiguity classes) / log2(max outcomes of a probe),\n' +
			'  a bound on the expected probes of any plan (Shannon). walk: volts at every point in turn from the battery along\n' +
			'  the feed, stopping once the fault is located; unlocated: chance the walk ends without locating it.'
	);
}

const direct = process.argv[1] && /bench[\\/]plan\.ts$/.test(process.argv[1]);
if (direct) {
	run().catch((e) => {
		console.error(e);
		process.exit(1);
	});
}
