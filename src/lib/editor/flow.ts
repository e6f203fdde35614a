// The canvas's nodes and edges, derived from the document (the document is the one source of
// truth; the canvas only adds what it tracks itself: selection, measured size, drag state).
// Unchanged parts and wires keep their node and edge objects, so the canvas re-lays only what
// changed: that keeps a 1,000-part drawing responsive after each edit.
import type { Edge, Node } from '@xyflow/svelte';
import type { PartKind } from '$lib/circuit/parts';
import type { HarnessDocument, Part, Wire } from '$lib/circuit/schema';
import { displayColours, type Palette } from '$lib/circuit/colours';
import { handleBox, partGeometry, type PartGeometry } from './geometry';

export type PartNodeData = { part: Part; geometry: PartGeometry };
export type PartNode = Node<PartNodeData, PartKind>;

export type WireLook = {
	base: string;
	tracer: string | null;
	/** "green with black tracer", or why the code could not be read. */
	description: string;
	/** False when the code is not in the palette (drawn grey and dashed, and said in text). */
	known: boolean;
};
export type WireEdgeData = { wire: Wire; look: WireLook; fromKey: string; toKey: string };
export type WireEdge = Edge<WireEdgeData, 'wire'>;

/** How a wire is drawn for its code in a palette. */
export function wireLook(code: string, palette: Palette): WireLook {
	try {
		const d = displayColours(code, palette);
		return { base: d.base, tracer: d.tracer, description: d.description, known: true };
	} catch {
		return { base: '#9aa1a9', tracer: null, description: `code ${code} is not in the palette`, known: false };
	}
}

function pinsOf(part: Part) {
	return part.kind === 'connector' ? part.params.pins : undefined;
}

export function partNode(part: Part, previous?: PartNode): PartNode {
	const geometry = partGeometry(part.kind, part.terminals, pinsOf(part));
	return {
		id: part.id,
		type: part.kind,
		position: { x: part.position.x, y: part.position.y },
		data: { part, geometry },
		width: geometry.width,
		height: geometry.height,
		// Terminal places given up front: wires can be drawn before a node is measured on screen.
		handles: geometry.terminals.map((t) => ({ id: t.name, type: 'source' as const, position: t.side as never, ...handleBox(t) })),
		selected: previous?.selected ?? false,
		ariaLabel: `Part ${part.key}${part.label ? `, ${part.label}` : ''} (${part.kind})`
	};
}

/** Keeps node and edge objects across document changes, rebuilding only changed ones. */
export class FlowMirror {
	private parts = new Map<string, Part>();
	private wires = new Map<string, { wire: Wire; palette: Palette; fromKey: string; toKey: string }>();

	nodes(doc: HarnessDocument, current: readonly PartNode[]): PartNode[] {
		const byId = new Map(current.map((n) => [n.id, n]));
		const seen = new Map<string, Part>();
		const out = doc.parts.map((part) => {
			seen.set(part.id, part);
			const node = byId.get(part.id);
			if (node && this.parts.get(part.id) === part) return node;
			return partNode(part, node);
		});
		this.parts = seen;
		return out;
	}

	edges(doc: HarnessDocument, palette: Palette, current: readonly WireEdge[]): WireEdge[] {
		const byId = new Map(current.map((e) => [e.id, e]));
		const keys = new Map(doc.parts.map((p) => [p.id, p.key]));
		const seen = new Map<string, { wire: Wire; palette: Palette; fromKey: string; toKey: string }>();
		const out = doc.wires.map((wire) => {
			const fromKey = keys.get(wire.from.part) ?? '?';
			const toKey = keys.get(wire.to.part) ?? '?';
			const entry = { wire, palette, fromKey, toKey };
			seen.set(wire.id, entry);
			const edge = byId.get(wire.id);
			const was = this.wires.get(wire.id);
			if (edge && was && was.wire === wire && was.palette === palette && was.fromKey === fromKey && was.toKey === toKey) return edge;
			return wireEdge(wire, palette, fromKey, toKey, edge);
		});
		this.wires = seen;
		return out;
	}
}

export function wireEdge(wire: Wire, palette: Palette, fromKey: string, toKey: string, previous?: WireEdge): WireEdge {
	const look = wireLook(wire.code, palette);
	return {
		id: wire.id,
		type: 'wire',
		source: wire.from.part,
		target: wire.to.part,
		sourceHandle: wire.from.terminal,
		targetHandle: wire.to.terminal,
		data: { wire, look, fromKey, toKey },
		selected: previous?.selected ?? false,
		ariaLabel: `Wire ${wire.code} (${look.description}) from ${fromKey} ${wire.from.terminal} to ${toKey} ${wire.to.terminal}`
	};
}

/** Sets a flag on nodes or edges, keeping the objects whose flag did not change (and the array, if none did). */
function withFlag<T extends { id: string; selected?: boolean; hidden?: boolean }>(items: readonly T[], flag: 'selected' | 'hidden', want: (item: T) => boolean): T[] {
	let changed = false;
	const out = items.map((item) => {
		const value = want(item);
		if (!!item[flag] === value) return item;
		changed = true;
		return { ...item, [flag]: value };
	});
	return changed ? out : (items as T[]);
}

/** Sets the selected flag on nodes and edges. */
export function withSelection<T extends { id: string; selected?: boolean }>(items: readonly T[], selected: ReadonlySet<string>): T[] {
	return withFlag(items, 'selected', (item) => selected.has(item.id));
}

/** Hides or shows every node (the far-zoom overview draws them instead). */
export function withHidden<T extends { id: string; hidden?: boolean }>(items: readonly T[], hidden: boolean): T[] {
	return withFlag(items, 'hidden', () => hidden);
}
