import { describe, expect, it } from 'vitest';
import { buildCircuit } from './circuit';
import { demoHarness } from './demo';
import { diagnose } from './diagnose';
import { generateHypotheses } from './faults';
import { defaultScenario } from './scenario';
import { wireNames } from './wire-names';

const parts = [
	{ id: 'bat', key: '1', label: 'Battery', kind: 'battery' },
	{ id: 'lamp-a', key: '7', label: 'Panel lamp', kind: 'lamp' },
	{ id: 'lamp-b', key: '8', kind: 'lamp' },
	{ id: 'stud', key: '49', kind: 'earth-point' }
];
const wire = (id: string, code: string, from: [string, string], to: [string, string]) => ({
	id,
	code,
	from: { part: from[0], terminal: from[1] },
	to: { part: to[0], terminal: to[1] }
});
const doc = {
	palette: 'trade-letters',
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

	// Colours in words from the single-letter trade code (palettes.ts: B black, R red, N brown).
	it('name a wire by its code, its colours in words and both ends by key number, name and terminal', () => {
		expect(names.wire(w('f1'))).toBe('wire R (red) between the + post of 1 (Battery) and terminal 1 of 7 (Panel lamp)');
	});

	it('say where an end goes only when another wire of its code ends at the same terminal', () => {
		expect(names.end(w('f1'), 'to')).toBe('wire R (red) at terminal 1 of 7 (Panel lamp)');
		expect(names.end(w('e1'), 'to')).toBe('wire B (black) at terminal stud of 49 (the one to terminal 31 of 7 Panel lamp)');
		expect(names.end(w('e2'), 'to')).toBe('wire B (black) at terminal stud of 49 (the one to terminal 31 of 8)');
		expect(names.end(w('e1'), 'from')).toBe('wire B (black) at terminal 31 of 7 (Panel lamp)');
	});

	it('tell two wires of one code between the same terminals apart by their order in the wire list, never by the drawing\u2019s ids', () => {
		expect(names.wire(w('p1'))).toBe('wire N (brown) between the + post of 1 (Battery) and terminal 1 of 8 (1 of 2 alike in the wire list)');
		expect(names.end(w('p2'), 'from')).toBe('wire N (brown) at the + post of 1 (Battery) (the one to terminal 1 of 8) (2 of 2 alike in the wire list)');
	});

	it('give every wire end of the demo harness a name of its own', () => {
		const demo = demoHarness();
		const all = wireNames(demo);
		const ends = demo.wires.flatMap((x) => [all.end(x, 'from'), all.end(x, 'to')]);
		expect(new Set(ends).size).toBe(ends.length);
		const wires = demo.wires.map((x) => all.wire(x));
		expect(new Set(wires).size).toBe(wires.length);
		// No "6.in" key-dot-terminal shorthand and no drawing ids (w-…) in what the restorer reads.
		for (const name of [...ends, ...wires]) expect(name).not.toMatch(/\b\d+\.[\w+-]|\bw-/);
		// The battery's feed wire, as the restorer says it (positive earth: the − post feeds).
		expect(ends).toContain('wire N (brown) at the \u2212 post of 1 (Battery 12 V)');
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
