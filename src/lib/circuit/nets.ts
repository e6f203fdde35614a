/**
 * Nodes and nets.
 *
 * A *node* is one electrical point of the circuit: a part's terminal, except that all the
 * terminals of a splice are one node (a splice is a joint with no resistance of its own),
 * plus the chassis. A *net* is what a restorer calls "one circuit wire": the terminals
 * joined by wires, splices and connector pins, found as connected components of the
 * terminal graph (graphology + graphology-components).
 */
import { MultiUndirectedGraph } from 'graphology';
import { connectedComponents } from 'graphology-components';
import type { HarnessDocument, Part, TerminalRef } from './schema';

/** The chassis (vehicle body or frame) that every earth point bolts to. */
export const CHASSIS = 'chassis';

/** A stable key for one terminal. Part ids cannot contain ":" (schema), so this is unambiguous. */
export function terminalKey(part: string, terminal: string): string {
	return `${part}:${terminal}`;
}

/** The node a terminal belongs to: a splice's terminals share the splice's node. */
export function nodeOfTerminal(part: Pick<Part, 'id' | 'kind'>, terminal: string): string {
	return part.kind === 'splice' ? part.id : terminalKey(part.id, terminal);
}

export interface NodeInfo {
	id: string;
	terminals: TerminalRef[];
}

/** Every node of a document, in document order, the chassis last. */
export function listNodes(doc: HarnessDocument): NodeInfo[] {
	const nodes = new Map<string, NodeInfo>();
	for (const part of doc.parts) {
		for (const t of part.terminals) {
			const id = nodeOfTerminal(part, t);
			let n = nodes.get(id);
			if (!n) nodes.set(id, (n = { id, terminals: [] }));
			n.terminals.push({ part: part.id, terminal: t });
		}
	}
	nodes.set(CHASSIS, { id: CHASSIS, terminals: [] });
	return [...nodes.values()];
}

export type TerminalEdge =
	| { kind: 'wire'; wire: string }
	| { kind: 'splice'; part: string }
	| { kind: 'pin'; part: string; pins: [string, string] };

/** The terminal graph: one graph node per terminal; edges for wires, splice joins and connector pins. */
export function terminalGraph(doc: HarnessDocument): MultiUndirectedGraph<TerminalRef, TerminalEdge> {
	const g = new MultiUndirectedGraph<TerminalRef, TerminalEdge>();
	for (const part of doc.parts) {
		for (const t of part.terminals) g.addNode(terminalKey(part.id, t), { part: part.id, terminal: t });
		if (part.kind === 'splice') {
			const [first, ...rest] = part.terminals;
			for (const t of rest) {
				g.addEdge(terminalKey(part.id, first), terminalKey(part.id, t), { kind: 'splice', part: part.id });
			}
		}
		if (part.kind === 'connector') {
			for (const [a, b] of part.params.pins) {
				g.addEdge(terminalKey(part.id, a), terminalKey(part.id, b), { kind: 'pin', part: part.id, pins: [a, b] });
			}
		}
	}
	for (const w of doc.wires) {
		g.addEdge(terminalKey(w.from.part, w.from.terminal), terminalKey(w.to.part, w.to.terminal), { kind: 'wire', wire: w.id });
	}
	return g;
}

export interface Net {
	/** The net's first terminal key, stable while the document's order is. */
	id: string;
	terminals: TerminalRef[];
	wires: string[];
}

/** Nets: terminals joined by wires, splices and connector pins. Lone unwired terminals are left out. */
export function nets(doc: HarnessDocument): Net[] {
	const g = terminalGraph(doc);
	const out: Net[] = [];
	for (const component of connectedComponents(g)) {
		const wires = new Set<string>();
		for (const key of component) {
			g.forEachEdge(key, (_e, attr) => {
				if (attr.kind === 'wire') wires.add(attr.wire);
			});
		}
		if (component.length < 2) continue;
		out.push({ id: component[0], terminals: component.map((k) => g.getNodeAttributes(k)), wires: [...wires] });
	}
	return out;
}

/** The net holding a terminal, or null if nothing is wired to it. */
export function netOf(doc: HarnessDocument, ref: TerminalRef): Net | null {
	const key = terminalKey(ref.part, ref.terminal);
	return nets(doc).find((n) => n.terminals.some((t) => terminalKey(t.part, t.terminal) === key)) ?? null;
}
