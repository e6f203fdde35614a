import { describe, expect, it } from 'vitest';
import { getHandlePosition, type InternalNodeBase } from '@xyflow/system';
import { emptyDocument } from '$lib/circuit/schema';
import { TRADE_LETTERS } from '$lib/circuit/colours';
import { addParts, addWire, createPart } from './ops';
import { FlowMirror, withHidden, withSelection } from './flow';
import { drawOverview, overviewOf, terminalEnd } from './overview';

// The overview must put each wire's ends where the live drawing does. The live wires are
// placed by the canvas library (@xyflow/system's getHandlePosition), so that is the yardstick.

function sample() {
	let doc = emptyDocument({ systemVoltage: 12, earth: 'negative' });
	doc = addParts(doc, [
		createPart(doc, 'fuse', { x: 0, y: 0 }, { id: 'f', key: '1' }),
		createPart(doc, 'lamp', { x: 300, y: 40 }, { id: 'l', key: '2' }),
		createPart(doc, 'relay', { x: 5000, y: 5000 }, { id: 'r', key: '3' })
	]);
	doc = addWire(doc, { part: 'f', terminal: 'out' }, { part: 'l', terminal: 'feed' }, { id: 'w1', code: 'G/B' }).doc;
	doc = addWire(doc, { part: 'r', terminal: '30' }, { part: 'r', terminal: '87' }, { id: 'w2', code: 'R' }).doc;
	return doc;
}

describe('terminalEnd', () => {
	it('is where the canvas library draws the end of a wire, for every terminal of every kind', () => {
		const m = new FlowMirror();
		let doc = emptyDocument({ systemVoltage: 12, earth: 'negative' });
		doc = addParts(doc, [
			createPart(doc, 'relay', { x: 120, y: 80 }, { id: 'a', key: '1' }),
			createPart(doc, 'gauge', { x: -40, y: 300 }, { id: 'b', key: '2' }),
			createPart(doc, 'earth-point', { x: 500, y: 10 }, { id: 'c', key: '3' }),
			createPart(doc, 'battery', { x: 800, y: 200 }, { id: 'd', key: '4' })
		]);
		for (const node of m.nodes(doc, [])) {
			const internal = { ...node, measured: { width: node.width, height: node.height }, internals: { positionAbsolute: node.position, z: 0, userNode: node } } as unknown as InternalNodeBase;
			for (const h of node.handles!) {
				const ours = terminalEnd(node, h.id!)!;
				expect(ours.side).toBe(h.position);
				expect(ours.point).toEqual(getHandlePosition(internal, { ...h, id: h.id ?? null, nodeId: node.id, width: h.width!, height: h.height! }));
			}
		}
	});
	it('has no end for a terminal the part does not have', () => {
		const node = new FlowMirror().nodes(sample(), [])[0];
		expect(terminalEnd(node, 'nope')).toBeNull();
	});
});

describe('overviewOf', () => {
	it('routes each wire from end to end and keeps the selection', () => {
		const doc = sample();
		const m = new FlowMirror();
		const nodes = withSelection(m.nodes(doc, []), new Set(['l']));
		const edges = withSelection(m.edges(doc, TRADE_LETTERS, []), new Set(['w1']));
		const o = overviewOf(nodes, edges);
		expect(o.parts.map((p) => p.selected)).toEqual([false, true, false]);
		const w1 = o.wires[0];
		expect(w1.points[0]).toEqual(terminalEnd(nodes[0], 'out')!.point);
		expect(w1.points.at(-1)).toEqual(terminalEnd(nodes[1], 'feed')!.point);
		// Trade letters: G = green #2e7d32 with B = black #1a1a1a tracer (the palette's own data).
		expect([w1.base, w1.tracer, w1.selected]).toEqual(['#2e7d32', '#1a1a1a', true]);
		// Orthogonal throughout, as the live wires are drawn.
		for (const w of o.wires) for (let i = 1; i < w.points.length; i++) expect(w.points[i].x === w.points[i - 1].x || w.points[i].y === w.points[i - 1].y).toBe(true);
	});
	it('hides and shows every part without rebuilding ones already right', () => {
		const nodes = new FlowMirror().nodes(sample(), []);
		const hidden = withHidden(nodes, true);
		expect(hidden.every((n) => n.hidden)).toBe(true);
		expect(withHidden(hidden, true)).toBe(hidden);
		expect(withHidden(hidden, false).every((n) => !n.hidden)).toBe(true);
	});
});

describe('drawOverview', () => {
	/** A 2D context that records what is stroked and filled. */
	function recorder() {
		const strokes: { colour: string; width: number; moves: number }[] = [];
		const rects: number[][] = [];
		let moves = 0;
		const ctx = {
			strokeStyle: '',
			fillStyle: '',
			lineWidth: 1,
			lineJoin: 'miter',
			setTransform() {},
			clearRect() {},
			beginPath: () => void (moves = 0),
			moveTo: () => void moves++,
			lineTo() {},
			stroke() {
				strokes.push({ colour: String(ctx.strokeStyle), width: ctx.lineWidth, moves });
			},
			fillRect: (...r: number[]) => void rects.push(r),
			strokeRect() {}
		};
		return { ctx: ctx as unknown as CanvasRenderingContext2D, strokes, rects };
	}
	it('draws only what is on screen, one stroke per colour', () => {
		const doc = sample();
		const m = new FlowMirror();
		const o = overviewOf(m.nodes(doc, []), m.edges(doc, TRADE_LETTERS, []));
		const r = recorder();
		// 1000 × 600 px at zoom 0.3 shows x and y from 0 to about 3,300 and 2,000: the relay at
		// 5,000 and its wire are off screen.
		drawOverview(r.ctx, o, { x: 0, y: 0, zoom: 0.3 }, { width: 1000, height: 600 }, 1);
		expect(r.rects).toHaveLength(2);
		expect(r.strokes.map((s) => s.colour)).toEqual(['#1b1f24', '#2e7d32', '#1a1a1a']);
		expect(r.strokes.every((s) => s.moves === 1)).toBe(true);
		// Never thinner than a pixel on screen: the casing at zoom 0.3 is max(8, 2 / 0.3) units.
		expect(r.strokes[0].width).toBe(8);
		const far = recorder();
		drawOverview(far.ctx, o, { x: 0, y: 0, zoom: 0.1 }, { width: 1000, height: 600 }, 1);
		expect(far.strokes[0].width).toBeCloseTo(20);
		// At zoom 0.1 the screen spans 10,000 units, so the relay's red wire is in view too; no
		// tracer is drawn that far out.
		expect(far.strokes.map((s) => [s.colour, s.moves])).toEqual([['#1b1f24', 2], ['#2e7d32', 1], ['#d32f2f', 1]]);
		expect(far.rects).toHaveLength(3);
	});
});
