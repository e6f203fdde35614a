// npm run bench [-- NAME ...]: the benchmarks of the reasoning core, one after another, printing
// figures (targets are stated beside each table; nothing here fails a build). Names pick suites:
// core, plan, faults, robust, serve, layout, editor. The drawing board's browser benchmark is `npm run bench:ui`.
import * as core from './core';
import * as editor from './editor';
import * as faults from './faults';
import * as layout from './layout';
import * as plan from './plan';
import * as robust from './robust';
import * as serve from './serve';

const suites: Record<string, [string, { run(): Promise<void> }]> = {
	core: ['circuit core: solve and trace, with ngspice side by side', core],
	plan: ['probe selection and planning on generated tables', plan],
	faults: ['fault predictions (incremental vs full), minimal set and plan on generated harnesses', faults],
	robust: ['diagnosis driven to its end in true worlds: part tolerances, battery state, wire lengths, fault sizes, meter error', robust],
	serve: ['end to end: probe plans through an HTTP server with the planning threads, one at a time and 20 at once', serve],
	layout: ['auto-layout with elkjs', layout],
	editor: ['drawing board edits on a large loom: clipboard, paste, palette switch, kind change, bends', editor]
};

const picked = process.argv.slice(2);
for (const name of picked) {
	if (!(name in suites)) {
		console.error(`no benchmark "${name}"; there are: ${Object.keys(suites).join(', ')}`);
		process.exit(2);
	}
}
for (const name of picked.length ? picked : Object.keys(suites)) {
	const [title, suite] = suites[name];
	console.log(`\n=== ${title} ===\n`);
	await suite.run();
}
