// Changes between two revisions, checked on small documents worked by hand.
import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { parseDocument, type HarnessDocument } from '$lib/circuit/schema';
import { changeSummary, documentChanges } from './changes';

function doc(input: unknown): HarnessDocument {
	const r = parseDocument(input);
	if (!r.ok) throw new Error(JSON.stringify(r.errors));
	return r.document;
}

const base = {
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'negative' },
	palette: 'trade-letters',
	parts: [
		{ id: 'bat', key: '1', label: 'Battery', kind: 'battery', position: { x: 0, y: 0 } },
		{ id: 'lamp', key: '7', label: 'Side lamp', kind: 'lamp', params: { watts: 5 }, position: { x: 200, y: 0 } },
		{ id: 'e', key: '9', kind: 'earth-point', position: { x: 200, y: 100 } }
	],
	wires: [
		{ id: 'w1', from: { part: 'bat', terminal: '+' }, to: { part: 'lamp', terminal: 'feed' }, code: 'R' },
		{ id: 'w2', from: { part: 'lamp', terminal: 'earth' }, to: { part: 'e', terminal: 'stud' }, code: 'B' }
	]
};
const edit = (f: (d: typeof base) => void) => {
	const d = structuredClone(base);
	f(d);
	return doc(d);
};

describe('changes between revisions', () => {
	it('find nothing between a document and itself, or the demo harness and a copy', () => {
		expect(documentChanges(doc(base), doc(base))).toEqual({ changes: [], moved: { parts: 0, wires: 0 } });
		expect(documentChanges(demoHarness(), structuredClone(demoHarness())).changes).toEqual([]);
	});

	it('name a recoloured wire by its ends, old code and new', () => {
		const r = documentChanges(doc(base), edit((d) => (d.wires[0].code = 'R/W')));
		expect(r.changes).toEqual([{ kind: 'changed', what: 'wire', id: 'w1', text: 'Wire R/W (red with white tracer) between the + post of 1 (Battery) and terminal feed of 7 (Side lamp): code R → R/W' }]);
	});

	it('list a part added with its wire, and a part removed with its wire', () => {
		const r = documentChanges(
			doc(base),
			edit((d) => {
				d.parts.push({ id: 'fuse', key: '4', label: 'Fuse', kind: 'fuse', position: { x: 100, y: 0 } } as never);
				d.wires.push({ id: 'w3', from: { part: 'bat', terminal: '+' }, to: { part: 'fuse', terminal: 'in' }, code: 'N' });
				d.parts = d.parts.filter((p) => p.id !== 'e');
				d.wires = d.wires.filter((w) => w.id !== 'w2');
			})
		);
		expect(r.changes.map((c) => c.text)).toEqual([
			'Part 4 Fuse (fuse) added',
			'Part 9 (earth-point) removed',
			'Wire N (brown) between the + post of 1 (Battery) and terminal in of 4 (Fuse) added',
			'Wire B (black) between terminal earth of 7 (Side lamp) and terminal stud of 9 removed'
		]);
	});

	it('say what of a part changed, and count a move on the drawing without listing it', () => {
		const r = documentChanges(
			doc(base),
			edit((d) => {
				d.parts[1].params = { watts: 21 };
				d.parts[1].label = 'Stop lamp';
				d.parts[0].position = { x: 40, y: 40 };
				(d.wires[1] as Record<string, unknown>).waypoints = [{ x: 200, y: 60 }];
			})
		);
		expect(r.changes.map((c) => c.text)).toEqual(['Part 7 Stop lamp: label “Side lamp” → “Stop lamp”; watts 5 → 21']);
		expect(r.moved).toEqual({ parts: 1, wires: 1 });
	});

	it('tell a wire moved to another terminal, a new size and length, the earth and the palette', () => {
		const r = documentChanges(
			doc(base),
			edit((d) => {
				d.wires[1].to = { part: 'bat', terminal: '-' };
				(d.wires[1] as Record<string, unknown>).size = { mm2: 2 };
				(d.wires[1] as Record<string, unknown>).lengthM = 1.5;
				(d.wires[1] as Record<string, unknown>).lengthMeasured = true;
				d.vehicle.earth = 'positive';
				d.palette = 'iec-60757';
				d.wires[0].code = 'RD';
				d.wires[1].code = 'BK';
			})
		);
		expect(r.changes.map((c) => c.text)).toEqual([
			'Earth negative → positive',
			'Colour codes trade-letters → iec-60757',
			'Wire RD (red) between the + post of 1 (Battery) and terminal feed of 7 (Side lamp): code R → RD',
			'Wire BK (black) between terminal earth of 7 (Side lamp) and the − post of 1 (Battery): code B → BK; other end terminal stud of 9 → the − post of 1 (Battery); size 1 mm² → 2 mm²; length 1 m → 1.5 m; length marked measured'
		]);
	});
});

describe('changeSummary', () => {
	const change = (text: string) => ({ kind: 'changed' as const, what: 'wire' as const, id: text, text });
	it.each([
		[null, 'First revision'],
		[{ changes: [change('Wire R (red) recoloured')], moved: { parts: 0, wires: 0 } }, 'Wire R (red) recoloured'],
		[{ changes: [change('A'), change('B')], moved: { parts: 0, wires: 0 } }, 'A, and 1 more change'],
		[{ changes: [change('A'), change('B'), change('C')], moved: { parts: 4, wires: 0 } }, 'A, and 2 more changes'],
		[{ changes: [], moved: { parts: 1, wires: 2 } }, 'Moved 1 part and the bends of 2 wires on the drawing'],
		[{ changes: [], moved: { parts: 0, wires: 0 } }, 'Saved again, unchanged']
	])('%j reads "%s"', (c, text) => expect(changeSummary(c)).toBe(text));
});

