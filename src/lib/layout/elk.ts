/**
 * Auto-layout of a harness drawing with the Eclipse Layout Kernel's layered algorithm
 * (elkjs; Sugiyama, Tagawa & Toda 1981: layers, crossing reduction, coordinate assignment).
 *
 * Each part is an ELK node of its drawn size (the editor's `partGeometry`), each terminal a port
 * fixed where the box draws it, so terminals stay on their sides (feed in on the left, out on
 * the right, earths down). Wires run left to right where they can: a wire drawn from an
 * input-side terminal to an output-side one is handed to ELK reversed, so current flows
 * rightwards through the layers. Pure: document in, positions out; the worker runs it off the
 * page's thread.
 */
import ELK from 'elkjs/lib/elk.bundled.js';
import type { ElkExtendedEdge, ElkNode, ElkPort, LayoutOptions } from 'elkjs/lib/elk-api';
import type { HarnessDocument, Position } from '../circuit/schema';
import { partGeometry } from '../editor/geometry';
import type { Side } from '../editor/route';

const ELK_SIDE: Record<Side, 'WEST' | 'EAST' | 'NORTH' | 'SOUTH'> = { left: 'WEST', right: 'EAST', top: 'NORTH', bottom: 'SOUTH' };

/** Layer spacing leaves room for a wire's code label between columns. */
export const LAYOUT_OPTIONS: LayoutOptions = {
	'elk.algorithm': 'layered',
	'elk.direction': 'RIGHT',
	'elk.edgeRouting': 'ORTHOGONAL',
	'elk.spacing.nodeNode': '48',
	'elk.layered.spacing.nodeNodeBetweenLayers': '96',
	'elk.spacing.edgeNode': '24',
	'elk.spacing.edgeEdge': '12',
	'elk.spacing.componentComponent': '96',
	'elk.separateConnectedComponents': 'true',
	// A fixed seed: the same document always lays out the same way. Keeping the document's
	// order (considerModelOrder) tripled the time on 300 parts here, so it stays off.
	'elk.layered.considerModelOrder.strategy': 'NONE',
	'elk.randomSeed': '1',
	'elk.padding': '[top=40,left=40,bottom=40,right=40]'
};

/**
 * Large drawings get fewer crossing-reduction sweeps (ELK's thoroughness, default 7): measured
 * here (scripts/bench/layout.ts) 300 parts took 2.4 s at 7 and under 1 s at 1.
 */
function optionsFor(parts: number): LayoutOptions {
	const thoroughness = parts > 150 ? 1 : parts > 60 ? 3 : 7;
	return { ...LAYOUT_OPTIONS, 'elk.layered.thoroughness': String(thoroughness) };
}

const portId = (part: string, terminal: string) => `${part}:${terminal}`;

/**
 * The ELK graph of a document: nodes sized as drawn, one fixed port per terminal.
 * @example toElkGraph(doc).children[0].ports[0] // { id: 'fuse-ign:in', x: 0, y: 44, … 'elk.port.side': 'WEST' }
 */
export function toElkGraph(doc: HarnessDocument): ElkNode {
	const sides = new Map<string, Side>();
	const children: ElkNode[] = doc.parts.map((part) => {
		const g = partGeometry(part.kind, part.terminals, part.kind === 'connector' ? part.params.pins : undefined);
		const ports: ElkPort[] = g.terminals.map((t) => {
			sides.set(portId(part.id, t.name), t.side);
			return { id: portId(part.id, t.name), x: t.x, y: t.y, width: 0, height: 0, layoutOptions: { 'elk.port.side': ELK_SIDE[t.side] } };
		});
		return { id: part.id, width: g.width, height: g.height, ports, layoutOptions: { 'elk.portConstraints': 'FIXED_POS' } };
	});
	const kind = new Map(doc.parts.map((p) => [p.id, p.kind]));
	const edges: ElkExtendedEdge[] = doc.wires.map((w) => {
		let a = portId(w.from.part, w.from.terminal);
		let b = portId(w.to.part, w.to.terminal);
		const ka = kind.get(w.from.part);
		const kb = kind.get(w.to.part);
		// Feeds leave the battery and end at earth points, as a schematic reads (common practice);
		// elsewhere, into a part on its left and out on its right.
		if (ka === 'earth-point' && kb !== 'earth-point') [a, b] = [b, a];
		else if (kb === 'battery' && ka !== 'battery') [a, b] = [b, a];
		else if (ka !== 'battery' && kb !== 'earth-point') {
			if (sides.get(a) === 'left' && sides.get(b) !== 'left') [a, b] = [b, a];
			else if (sides.get(b) === 'right' && sides.get(a) !== 'right') [a, b] = [b, a];
		}
		return { id: w.id, sources: [a], targets: [b] };
	});
	return { id: 'harness', layoutOptions: optionsFor(doc.parts.length), children, edges };
}

/** Part positions from a laid-out graph, rounded to whole pixels. */
export function positionsFrom(result: ElkNode): Map<string, Position> {
	const out = new Map<string, Position>();
	for (const c of result.children ?? []) out.set(c.id, { x: Math.round(c.x ?? 0), y: Math.round(c.y ?? 0) });
	return out;
}

/** Moves parts to their laid-out positions; wires lose the bends the user placed (they would point nowhere). */
export function applyPositions(doc: HarnessDocument, positions: ReadonlyMap<string, Position>): HarnessDocument {
	return {
		...doc,
		parts: doc.parts.map((p) => {
			const to = positions.get(p.id);
			return to && (to.x !== p.position.x || to.y !== p.position.y) ? { ...p, position: to } : p;
		}),
		wires: doc.wires.map((w) => {
			if (!w.waypoints) return w;
			const { waypoints: _dropped, ...rest } = w;
			void _dropped;
			return rest;
		})
	};
}

let shared: InstanceType<typeof ELK> | null = null;

/** Lays out a document; resolves to the part positions. */
export async function layoutPositions(doc: HarnessDocument): Promise<Map<string, Position>> {
	if (!doc.parts.length) return new Map();
	shared ??= new ELK();
	return positionsFrom(await shared.layout(toElkGraph(doc)));
}
