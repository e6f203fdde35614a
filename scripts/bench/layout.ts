/**
 * Benchmark of the auto-layout (not a test): ELK's layered algorithm on generated harnesses of
 * 50, 150 and 300 parts and on the demo, as the drawing board's "Tidy" runs it (in the page's
 * worker there; in this process here). The first run includes loading ELK.
 *
 * Target: 300 parts laid out in under 3 s on this machine.
 *
 * Run: `tsx scripts/bench/layout.ts` (add it to scripts/bench/index.ts to run with the others).
 */
import { demoHarness } from '../../src/lib/circuit/demo';
import { generateHarness } from '../../src/lib/circuit/testing/generate';
import { layoutPositions } from '../../src/lib/layout/elk';

const ms = (x: number) => x.toFixed(0);

export async function run(): Promise<void> {
	const big = generateHarness(300, { parts: 300 }).doc;
	const cases = [
		{ name: '300 parts, first run (ELK cold: load + JIT)', doc: big },
		{ name: 'demo harness', doc: demoHarness() },
		...[50, 150].map((n) => ({ name: `generated, ${n} parts`, doc: generateHarness(n, { parts: n }).doc })),
		{ name: '300 parts, again', doc: big },
		{ name: '300 parts, third time', doc: big }
	];
	console.log('layout                                        parts  wires   wall ms    cpu ms');
	for (const c of cases) {
		const cpu = process.cpuUsage();
		const start = performance.now();
		const positions = await layoutPositions(c.doc);
		const t = performance.now() - start;
		const used = process.cpuUsage(cpu);
		if (positions.size !== c.doc.parts.length) throw new Error(`${c.name}: ${positions.size} of ${c.doc.parts.length} parts placed`);
		console.log(`${c.name.padEnd(45)} ${String(c.doc.parts.length).padStart(5)} ${String(c.doc.wires.length).padStart(6)} ${ms(t).padStart(9)} ${ms((used.user + used.system) / 1000).padStart(9)}`);
	}
	console.log('target: 300 parts under 3 s (the drawing board warms its layout worker when it opens)');
}

if (import.meta.url === `file://${process.argv[1]}`) await run();
