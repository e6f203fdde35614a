/**
 * Benchmark of the circuit core (not a test): generated harnesses of about 100, 400 and
 * 1,600 parts; for each, the node count, our solve time, the trace times, and ngspice's time
 * per operating point on the same netlist (many solves in one ngspice process), as a ratio.
 *
 * Targets: our solve no slower than ngspice's per solve at 400 parts; sharedUpstream for 10
 * selections under 5 ms at 1,600 parts.
 *
 * Run: `tsx scripts/bench/core.ts` (or through `npm run bench`).
 */
import { buildCircuit } from '../../src/lib/circuit/circuit';
import { clearPlanCache, factorCircuit, solveCircuit, sourceVector } from '../../src/lib/circuit/solve';
import { toSpice } from '../../src/lib/circuit/spice';
import { prepareTrace, sharedUpstream } from '../../src/lib/circuit/trace';
import { generateHarness, prng } from '../../src/lib/circuit/testing/generate';
import { timeOperatingPoint } from '../../src/lib/circuit/testing/ngspice';

const now = () => performance.now();

/** Mean time (ms) of fn over enough runs to fill about `budgetMs`, after a warm-up. */
function time(fn: () => void, budgetMs = 300, minRuns = 5): number {
	fn();
	let runs = 0;
	const start = now();
	while (runs < minRuns || now() - start < budgetMs) {
		fn();
		runs++;
	}
	return (now() - start) / runs;
}

const pad = (s: string | number, n: number) => String(s).padStart(n);
const ms = (x: number) => (x < 0.1 ? x.toFixed(4) : x < 10 ? x.toFixed(3) : x.toFixed(1));

export async function run(): Promise<void> {
	const rows: string[][] = [];
	const header = ['parts', 'wires', 'nodes', 'cold solve ms', 'solve ms', 'refactor+solve ms', 'ngspice ms/op', 'ratio', 'cold ratio', 'trace prep ms', 'shared×10 ms', 'shared×10 incl. prep ms'];
	for (const size of [100, 400, 1600]) {
		const { doc, scenario } = generateHarness(20260 + size, { parts: size, crossLinks: 0.08, floating: 0.02 });
		const circuit = buildCircuit(doc, scenario);
		const solution = solveCircuit(circuit);
		// Cold: build the circuit, pattern, ordering, factorisation, relay and stabilizer rounds.
		const coldMs = time(() => {
			clearPlanCache();
			solveCircuit(buildCircuit(doc, scenario));
		});
		// Per solve of a known structure (another scenario of the same harness): build and solve,
		// the ordering reused, as ngspice reuses its setup from one `op` to the next.
		const solveMs = time(() => solveCircuit(buildCircuit(doc, scenario)));
		// One more factorisation and solve of the settled matrix (what ngspice repeats per op).
		const rhs = sourceVector(circuit, solution.g);
		const refactorMs = time(() => factorCircuit(circuit, solution.g).solve(rhs));
		const deck = toSpice(circuit, { g: solution.g, title: `bench ${size}` }).text;
		const spice = timeOperatingPoint(deck, size >= 1600 ? 200 : 1000);

		const loads = doc.parts.filter((p) => ['lamp', 'load', 'motor', 'gauge', 'resistor', 'sender', 'ignition-coil'].includes(p.kind));
		const r = prng(size);
		const selections = Array.from({ length: 10 }, () => [r.pick(loads).id, r.pick(loads).id, r.pick(loads).id]);
		const prepMs = time(() => prepareTrace(doc, scenario));
		const tracer = prepareTrace(doc, scenario);
		const sharedMs = time(() => {
			for (const sel of selections) tracer.shared(sel);
		});
		const sharedFreshMs = time(() => {
			const t = prepareTrace(doc, scenario, { energised: solution.energised });
			for (const sel of selections) t.shared(sel);
		});
		// The public one-call form, each call preparing its own tracer (relay states included).
		sharedUpstream(doc, scenario, selections[0]);

		rows.push([
			String(doc.parts.length),
			String(doc.wires.length),
			String(circuit.nodeNames.length),
			ms(coldMs),
			ms(solveMs),
			ms(refactorMs),
			ms(spice.perSolveMs),
			(solveMs / spice.perSolveMs).toFixed(2),
			(coldMs / spice.perSolveMs).toFixed(2),
			ms(prepMs),
			ms(sharedMs),
			ms(sharedFreshMs)
		]);
	}
	const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
	const line = (cells: string[]) => cells.map((c, i) => pad(c, widths[i])).join('  ');
	console.log('Loomwright circuit core benchmark (ratio = our solve / ngspice per operating point, same netlist, same run)');
	console.log(line(header));
	for (const r of rows) console.log(line(r));
	console.log(
		'\ncold solve: build the circuit, pattern, ordering, factorisation, relay and stabilizer rounds, nothing cached.\n' +
			'solve: the same for a structure seen before (ordering reused). refactor+solve: one numeric factorisation and solve.\n' +
			'ngspice: mean analysis time per `op` over many repeats in one process (load time subtracted).\n' +
			'trace prep: trace graph, relay states (a DC solve), ready for questions; shared×10: 10 sharedUpstream selections on a prepared tracer;\n' +
			'incl. prep: building the tracer (relay states given) plus the 10 selections.'
	);
}

const direct = process.argv[1] && /bench[\\/]core\.ts$/.test(process.argv[1]);
if (direct) {
	run().catch((e) => {
		console.error(e);
		process.exit(1);
	});
}
