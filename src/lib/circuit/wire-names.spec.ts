import { describe, expect, it } from 'vitest';
import { buildCircuit } from './circuit';
import { demoHarness } from './demo';
import { diagnose } from './diagnose';
import { generateHypotheses } from './faults';
import { defaultScenario } from './scenario';
import { wireNames } from './wire-names';

const parts = [
	{ id: 'bat', key: '1' },
	{ id: 'lamp-a', key: '7' },
	{ id: 'lamp-b', key: '8' },
	{ id: 'stud', key: '49' }
];
const wire = (id: string, code: string, from: [string, string], to: [string, string]) => ({
	id,
	code,
	from: { part: from[0], terminal: from[1] },
	to: { part: to[0], terminal: to[1] }
});
const doc = {
	parts,
	wires: [
		wire('e1', 'B', ['lamp-a', '31'], ['stud', 'stud']),
		wire('e2', 'B', ['lamp-b', '31'], ['stud', 'stud']),
		wire('f1', 'R', ['bat', '+'], ['lamp-a', '1']),
		wire('p1', 'N', ['bat', '+'], ['lamp-b', '1']),
		wire('p2', 'N', ['bat', '+'], ['lamp-b', '1'])
	]
} as never;

describe('wire names', () => {
	const names = wireNames(doc);
	const w = (id: string) => (doc as { wires: { id: string }[] }).wires.find((x) => x.id === id) as never;

	it('name a wire by its code and both ends', () => {
		expect(names.wire(w('f1'))).toBe('wire R between 1.+ and 7.1');
	});

	it('say where an end goes only when another wire of its code ends at the same terminal', () => {
		expect(names.end(w('f1'), 'to')).toBe('wire R at 7.1');
		expect(names.end(w('e1'), 'to')).toBe('wire B at 49.stud (the one to 7.31)');
		expect(names.end(w('e2'), 'to')).toBe('wire B at 49.stud (the one to 8.31)');
		expect(names.end(w('e1'), 'from')).toBe('wire B at 7.31');
	});

	it('fall back to the drawing’s wire id for two wires of one code between the same terminals', () => {
		expect(names.wire(w('p1'))).toBe('wire N between 1.+ and 8.1 [p1]');
		expect(names.end(w('p2'), 'from')).toBe('wire N at 1.+ (the one to 8.1) [p2]');
	});

	it('give every wire end of the demo harness a name of its own', () => {
		const demo = demoHarness();
		const all = wireNames(demo);
		const ends = demo.wires.flatMap((x) => [all.end(x, 'from'), all.end(x, 'to')]);
		expect(new Set(ends).size).toBe(ends.length);
		const wires = demo.wires.map((x) => all.wire(x));
		expect(new Set(wires).size).toBe(wires.length);
	});
});

describe('suspects and probes on the demo harness', () => {
	it('read differently from each other (several earths meet at one stud)', () => {
		const demo = demoHarness();
		const scenario = defaultScenario(demo);
		const labels = generateHypotheses(buildCircuit(demo, scenario)).map((h) => h.label);
		const twice = labels.filter((l, i) => labels.indexOf(l) !== i);
		expect(twice).toEqual([]);
		const gauges = demo.parts.filter((p) => p.kind === 'gauge').map((p) => ({ part: p.id, mark: 'reads-low' as const }));
		const result = diagnose({ doc: demo, scenario, marks: gauges });
		const probeLabels = result.probes.map((p) => p.label);
		expect(probeLabels.filter((l, i) => probeLabels.indexOf(l) !== i)).toEqual([]);
	});
});
