import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { parseDocument, type HarnessDocument } from '../circuit/schema';
import { partGeometry } from '../editor/geometry';
import { applyPositions, layoutPositions, toElkGraph } from './elk';

function doc(raw: unknown): HarnessDocument {
	const r = parseDocument(raw);
	if (!r.ok) throw new Error(JSON.stringify(r.errors));
	return r.document;
}

// battery + → fuse in/out → lamp feed/earth → earth point, drawn with the fuse wire "backwards".
const chain = doc({
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'negative' },
	parts: [
		{ id: 'lamp', key: '3', kind: 'lamp' },
		{ id: 'bat', key: '1', kind: 'battery' },
		{ id: 'fuse', key: '2', kind: 'fuse' },
		{ id: 'earth', key: '4', kind: 'earth-point' }
	],
	wires: [
		{ id: 'a', from: { part: 'fuse', terminal: 'in' }, to: { part: 'bat', terminal: '+' }, code: 'N' },
		{ id: 'b', from: { part: 'fuse', terminal: 'out' }, to: { part: 'lamp', terminal: 'feed' }, code: 'G' },
		{ id: 'c', from: { part: 'lamp', terminal: 'earth' }, to: { part: 'earth', terminal: 'stud' }, code: 'B' }
	]
});

type Box = { id: string; x: number; y: number; w: number; h: number };
function boxes(d: HarnessDocument): Box[] {
	return d.parts.map((p) => {
		const g = partGeometry(p.kind, p.terminals, p.kind === 'connector' ? p.params.pins : undefined);
		return { id: p.id, x: p.position.x, y: p.position.y, w: g.width, h: g.height };
	});
}

describe('toElkGraph', () => {
	it('gives every terminal a port fixed on the side the part draws it', () => {
		const g = toElkGraph(chain);
		const fuse = g.children!.find((c) => c.id === 'fuse')!;
		expect(fuse.layoutOptions?.['elk.portConstraints']).toBe('FIXED_POS');
		expect(fuse.ports!.map((p) => [p.id, p.layoutOptions?.['elk.port.side'], p.x])).toEqual([
			['fuse:in', 'WEST', 0],
			['fuse:out', 'EAST', fuse.width]
		]);
		const earth = g.children!.find((c) => c.id === 'earth')!;
		expect(earth.ports![0].layoutOptions?.['elk.port.side']).toBe('NORTH');
	});

	it('hands wires to ELK flowing out of right-side terminals into left-side ones', () => {
		const g = toElkGraph(chain);
		// Wire a is drawn fuse.in → battery.+; the battery's + is on its left in the editor's
		// geometry, the fuse's in too, so the wire keeps its direction there.
		expect(g.edges!.find((e) => e.id === 'b')).toMatchObject({ sources: ['fuse:out'], targets: ['lamp:feed'] });
	});

	it('runs feeds out of the battery and into earth points, however the wire was drawn', () => {
		const drawnBackwards = {
			...chain,
			wires: [
				{ ...chain.wires[0], from: { part: 'fuse', terminal: 'in' }, to: { part: 'bat', terminal: '+' } },
				{ ...chain.wires[2], from: { part: 'earth', terminal: 'stud' }, to: { part: 'lamp', terminal: 'earth' } }
			]
		};
		const g = toElkGraph(drawnBackwards);
		expect(g.edges!.map((e) => [e.sources[0], e.targets[0]])).toEqual([
			['bat:+', 'fuse:in'],
			['lamp:earth', 'earth:stud']
		]);
	});
});

describe('layoutPositions (layered)', { timeout: 60_000 }, () => {
	it('places a feed chain in layers left to right (Sugiyama: edges point one way)', async () => {
		const laid = applyPositions(chain, await layoutPositions(chain));
		const x = new Map(laid.parts.map((p) => [p.id, p.position.x]));
		expect(x.get('fuse')!).toBeLessThan(x.get('lamp')!);
	});

	it('lays out the demo harness with no two parts overlapping, deterministically', async () => {
		const demo = demoHarness();
		const first = await layoutPositions(demo);
		expect(first.size).toBe(demo.parts.length);
		const laid = applyPositions(demo, first);
		const b = boxes(laid);
		for (let i = 0; i < b.length; i++) {
			for (let j = i + 1; j < b.length; j++) {
				const p = b[i];
				const q = b[j];
				const apart = p.x + p.w <= q.x || q.x + q.w <= p.x || p.y + p.h <= q.y || q.y + q.h <= p.y;
				if (!apart) throw new Error(`${p.id} overlaps ${q.id}`);
			}
		}
		expect(parseDocument(laid).ok).toBe(true);
		const again = await layoutPositions(demo);
		expect([...again]).toEqual([...first]);
	});

	it('drops user bends and leaves unmoved parts untouched', () => {
		const withBend = { ...chain, wires: chain.wires.map((w, i) => (i === 0 ? { ...w, waypoints: [{ x: 5, y: 5 }] } : w)) };
		const out = applyPositions(withBend, new Map([['bat', { x: 10, y: 20 }]]));
		expect(out.wires[0].waypoints).toBeUndefined();
		expect(out.parts.find((p) => p.id === 'bat')!.position).toEqual({ x: 10, y: 20 });
		expect(out.parts.find((p) => p.id === 'lamp')).toBe(withBend.parts.find((p) => p.id === 'lamp'));
	});
});
