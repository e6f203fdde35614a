import { describe, expect, it } from 'vitest';
import { emptyDocument } from '$lib/circuit/schema';
import { TRADE_LETTERS, IEC_60757 } from '$lib/circuit/colours';
import { addParts, addWire, createPart, moveParts, updateWire } from './ops';
import { FlowMirror, wireLook, withSelection } from './flow';

// The canvas must show what the document says: checked against the document itself and the
// palette data of the circuit core (trade letter G = green #2e7d32, B = black #1a1a1a).

function sample() {
	let doc = emptyDocument({ systemVoltage: 12, earth: 'negative' });
	doc = addParts(doc, [
		createPart(doc, 'fuse', { x: 0, y: 0 }, { id: 'f', key: '1' }),
		createPart(doc, 'lamp', { x: 300, y: 0 }, { id: 'l', key: '2' })
	]);
	return addWire(doc, { part: 'f', terminal: 'out' }, { part: 'l', terminal: 'feed' }, { id: 'w', code: 'G/B' }).doc;
}

describe('wireLook', () => {
	it.each([
		{ code: 'G/B', base: '#2e7d32', tracer: '#1a1a1a', description: 'green with black tracer' },
		{ code: 'R', base: '#d32f2f', tracer: null, description: 'red' }
	])('$code is drawn $description', ({ code, base, tracer, description }) => {
		expect(wireLook(code, TRADE_LETTERS)).toEqual({ base, tracer, description, known: true });
	});
	it('draws an unknown code grey and says so', () => {
		const look = wireLook('G/B', IEC_60757);
		expect(look.known).toBe(false);
		expect(look.description).toMatch(/not in the palette/);
	});
});

describe('FlowMirror', () => {
	it('mirrors parts and wires, terminals as handles', () => {
		const doc = sample();
		const m = new FlowMirror();
		const nodes = m.nodes(doc, []);
		expect(nodes.map((n) => [n.id, n.type, n.position])).toEqual([
			['f', 'fuse', { x: 0, y: 0 }],
			['l', 'lamp', { x: 300, y: 0 }]
		]);
		expect(nodes[0].handles!.map((h) => h.id)).toEqual(['in', 'out']);
		const edges = m.edges(doc, TRADE_LETTERS, []);
		expect(edges[0]).toMatchObject({ source: 'f', sourceHandle: 'out', target: 'l', targetHandle: 'feed', type: 'wire' });
		expect(edges[0].ariaLabel).toBe('Wire G/B (green with black tracer) from 1 out to 2 feed');
	});

	it('keeps unchanged objects and the canvas selection across edits', () => {
		const doc = sample();
		const m = new FlowMirror();
		let nodes = m.nodes(doc, []);
		let edges = m.edges(doc, TRADE_LETTERS, []);
		nodes = withSelection(nodes, new Set(['l']));
		edges = withSelection(edges, new Set(['w']));
		const moved = moveParts(doc, new Map([['f', { x: 10, y: 20 }]]));
		const next = m.nodes(moved, nodes);
		expect(next[1]).toBe(nodes[1]);
		expect(next[0]).not.toBe(nodes[0]);
		expect(next[0].position).toEqual({ x: 10, y: 20 });
		expect(next[1].selected).toBe(true);
		const recoded = updateWire(moved, 'w', { code: 'R' });
		const nextEdges = m.edges(recoded, TRADE_LETTERS, edges);
		expect(nextEdges[0].data!.look.base).toBe('#d32f2f');
		expect(nextEdges[0].selected).toBe(true);
		expect(m.edges(recoded, TRADE_LETTERS, nextEdges)[0]).toBe(nextEdges[0]);
	});

	it('withSelection returns the same array when nothing changes', () => {
		const nodes = new FlowMirror().nodes(sample(), []);
		expect(withSelection(nodes, new Set())).toBe(nodes);
	});
});
