// npm run bench: every benchmark of the reasoning core, one after another, printing figures.
// Targets are stated beside each table; nothing here fails a build.
import * as core from './core';
import * as plan from './plan';

const suites: [string, { run(): Promise<void> }][] = [
	['circuit core: solve and trace (ngspice side by side)', core],
	['probe selection and planning', plan]
];

for (const [name, suite] of suites) {
	console.log(`\n=== ${name} ===\n`);
	await suite.run();
}
