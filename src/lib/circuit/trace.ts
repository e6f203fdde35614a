/**
 * Feed and earth tracing, must-pass points and shared upstream points.
 *
 * The trace graph has a vertex per node and per pass-through element (a wire, a fuse, a
 * closed switch contact, a connector pin pair, a closed relay contact, a stabilizer, an
 * earth point), joined both ways to the element's end nodes (a stabilizer only from input
 * to output), and a sink vertex per part reached from the part's own terminals. Loads are
 * never passed through. A feed path runs from the battery's live terminal (the non-earthed
 * one, so both polarities work) to the part; an earth path from the battery's earthed
 * terminal to the part.
 *
 * Must-pass points are the dominators of the part's sink (Cooper, Harvey & Kennedy 2001):
 * with arcs both ways they are exactly the points on every path. The shared upstream point
 * of several parts is their nearest common dominator.
 */
import { dominatorTree, dominatorsOf, nearestCommonDominator, type DominatorTree } from './dominators';
import { CHASSIS, listNodes, nodeOfTerminal } from './nets';
import { earthedTerminal, liveTerminal } from './parts';
import { viewScenario, type Scenario } from './scenario';
import { relayStates } from './solve';
import type { HarnessDocument, Part, TerminalRef } from './schema';
import { counted } from '../words';

export type TracePoint =
	| { type: 'node'; node: string; terminals: TerminalRef[] }
	| { type: 'wire'; wire: string }
	| { type: 'part'; part: string; contact?: [string, string] };

type Vertex = TracePoint | { type: 'target'; part: string };

export type Side = 'feed' | 'earth';

export interface TraceOptions {
	/** Relays whose coils are energised (30–87 closed, 30–87a open). Default: found by a DC solve of the scenario. */
	energised?: ReadonlySet<string>;
	/** Most paths to list (paths can multiply in meshed wiring); default 64. */
	maxPaths?: number;
}

/** Terminals through which a part is fed or earthed: a relay's coil; a stabilizer's input and earth; else all. */
function targetTerminals(part: Part): readonly string[] {
	if (part.kind === 'relay') return ['85', '86'];
	if (part.kind === 'stabilizer') return ['in', 'earth'];
	return part.terminals;
}

export interface Tracer {
	readonly doc: HarnessDocument;
	/** Vertex index of each point key (see `pointKey`). */
	feed(partId: string): PathTrace;
	earth(partId: string): PathTrace;
	mustPass(partId: string, side?: Side): TracePoint[];
	shared(partIds: readonly string[], side?: Side): SharedPoint;
}

export interface PathTrace {
	part: string;
	side: Side;
	reached: boolean;
	/** Every path, battery end first, the part itself left out. */
	paths: TracePoint[][];
	/** True when there were more paths than `maxPaths`. */
	truncated: boolean;
	/** Points on every path, battery end first. */
	mustPass: TracePoint[];
	/** Why nothing was reached, if so. */
	reason?: string;
}

export interface SharedPoint {
	side: Side;
	/** True when the parts share a point other than the battery terminal itself. */
	shared: boolean;
	/** The shared must-pass point nearest the parts (the battery terminal when they share nothing else). */
	nearest: TracePoint | null;
	/** The whole shared chain, battery end first, ending at `nearest`. */
	chain: TracePoint[];
	/** Selected parts with no path at all. */
	unreached: string[];
	message: string;
}

/** A stable string for a point, e.g. for sets and React-style keys. */
export function pointKey(p: TracePoint): string {
	if (p.type === 'node') return `node:${p.node}`;
	if (p.type === 'wire') return `wire:${p.wire}`;
	return p.contact ? `part:${p.part}:${p.contact[0]}-${p.contact[1]}` : `part:${p.part}`;
}

interface Built {
	vertices: Vertex[];
	succ: number[][];
	preds: number[][];
	targets: Map<string, number>;
	live: number;
	earthed: number;
	batteryOff: boolean;
	battery: Part | undefined;
}

function build(doc: HarnessDocument, scenario: Scenario, energised: ReadonlySet<string>): Built {
	const view = viewScenario(doc, scenario);
	const vertices: Vertex[] = [];
	const succ: number[][] = [];
	const preds: number[][] = [];
	const add = (v: Vertex) => {
		vertices.push(v);
		succ.push([]);
		preds.push([]);
		return vertices.length - 1;
	};
	const arc = (a: number, b: number) => {
		succ[a].push(b);
		preds[b].push(a);
	};
	const nodeIndex = new Map<string, number>();
	for (const n of listNodes(doc)) nodeIndex.set(n.id, add({ type: 'node', node: n.id, terminals: n.terminals }));
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const at = (part: Part, t: string) => nodeIndex.get(nodeOfTerminal(part, t))!;
	const on = (part: Part, t: string) => !view.terminalOff({ part: part.id, terminal: t });
	const both = (el: Vertex, a: number, b: number) => {
		const e = add(el);
		arc(a, e);
		arc(e, a);
		arc(b, e);
		arc(e, b);
	};
	const contact = (part: Part, a: string, b: string) => {
		if (on(part, a) && on(part, b)) both({ type: 'part', part: part.id, contact: [a, b] }, at(part, a), at(part, b));
	};

	for (const part of doc.parts) {
		if (view.partOff(part.id)) continue;
		switch (part.kind) {
			case 'fuse':
				if (!part.params.blown && on(part, 'in') && on(part, 'out')) both({ type: 'part', part: part.id }, at(part, 'in'), at(part, 'out'));
				break;
			case 'earth-point':
				if (on(part, 'stud')) both({ type: 'part', part: part.id }, at(part, 'stud'), nodeIndex.get(CHASSIS)!);
				break;
			case 'switch':
				for (const [a, b] of view.position(part).closed) contact(part, a, b);
				break;
			case 'connector':
				for (const [a, b] of part.params.pins) contact(part, a, b);
				break;
			case 'relay':
				contact(part, '30', energised.has(part.id) ? '87' : '87a');
				break;
			case 'stabilizer':
				if (on(part, 'in') && on(part, 'out')) {
					const e = add({ type: 'part', part: part.id });
					arc(at(part, 'in'), e);
					arc(e, at(part, 'out'));
				}
				break;
		}
	}
	for (const w of doc.wires) {
		if (view.wireOff(w.id) || view.terminalOff(w.from) || view.terminalOff(w.to)) continue;
		const a = parts.get(w.from.part)!;
		const b = parts.get(w.to.part)!;
		both({ type: 'wire', wire: w.id }, at(a, w.from.terminal), at(b, w.to.terminal));
	}
	const targets = new Map<string, number>();
	for (const part of doc.parts) {
		const t = add({ type: 'target', part: part.id });
		targets.set(part.id, t);
		if (view.partOff(part.id)) continue;
		for (const term of targetTerminals(part)) if (on(part, term)) arc(at(part, term), t);
	}
	const battery = doc.parts.find((p) => p.kind === 'battery');
	const earth = doc.vehicle.earth;
	return {
		vertices,
		succ,
		preds,
		targets,
		battery,
		live: battery ? at(battery, liveTerminal(earth)) : -1,
		earthed: battery ? at(battery, earthedTerminal(earth)) : nodeIndex.get(CHASSIS)!,
		batteryOff: !battery || view.partOff(battery.id)
	};
}

/** Most vertex visits of one path enumeration (see `paths`); a few milliseconds of work. */
const WALK_BUDGET = 20_000;

/** Prepare a tracer for one document and scenario; reuse it for many questions. */
export function prepareTrace(doc: HarnessDocument, scenario: Scenario, options: TraceOptions = {}): Tracer {
	const g = build(doc, scenario, options.energised ?? relayStates(doc, scenario));
	const maxPaths = options.maxPaths ?? 64;
	const trees: Partial<Record<Side, DominatorTree>> = {};
	const tree = (side: Side) => (trees[side] ??= dominatorTree(g.succ, side === 'feed' ? g.live : g.earthed));
	const point = (v: number) => g.vertices[v] as TracePoint;
	const target = (partId: string) => {
		const t = g.targets.get(partId);
		if (t === undefined) throw new Error(`trace: no part with id "${partId}"`);
		return t;
	};
	const noSource = (side: Side) =>
		side === 'feed' && (g.live < 0 || g.batteryOff) ? (g.live < 0 ? 'the diagram has no battery' : 'the battery is disconnected') : null;

	function mustPassIdx(partId: string, side: Side): number[] | null {
		const t = target(partId);
		if (noSource(side)) return null;
		const chain = dominatorsOf(tree(side), t);
		return chain.length ? chain.slice(1).reverse() : null;
	}

	function paths(partId: string, side: Side): { paths: TracePoint[][]; truncated: boolean } {
		const t = target(partId);
		const root = side === 'feed' ? g.live : g.earthed;
		// Only walk vertices that can still reach the part.
		const useful = new Uint8Array(g.vertices.length);
		const stack = [t];
		useful[t] = 1;
		while (stack.length) {
			const v = stack.pop()!;
			for (const p of g.preds[v]) if (!useful[p]) ((useful[p] = 1), stack.push(p));
		}
		const out: TracePoint[][] = [];
		let truncated = false;
		const onPath = new Uint8Array(g.vertices.length);
		const path: number[] = [];
		// Simple paths can be exponentially many, and so can the dead ends a depth-first walk
		// tries on a meshed harness: the walk has a step budget, and stops as truncated past it.
		let budget = WALK_BUDGET;
		const walk = (v: number) => {
			if (truncated) return;
			if (--budget < 0) {
				truncated = true;
				return;
			}
			if (v === t) {
				if (out.length >= maxPaths) truncated = true;
				else out.push(path.map(point));
				return;
			}
			onPath[v] = 1;
			path.push(v);
			for (const w of g.succ[v]) {
				if (!useful[w] || onPath[w]) continue;
				// Never walk on through another part's sink, or into the source terminal again.
				if (g.vertices[w].type === 'target' && w !== t) continue;
				walk(w);
			}
			path.pop();
			onPath[v] = 0;
		};
		if (useful[root]) walk(root);
		return { paths: out, truncated };
	}

	function trace(partId: string, side: Side): PathTrace {
		const reasonNoSource = noSource(side);
		const must = mustPassIdx(partId, side);
		if (reasonNoSource || !must) {
			const part = doc.parts.find((p) => p.id === partId)!;
			return {
				part: partId,
				side,
				reached: false,
				paths: [],
				truncated: false,
				mustPass: [],
				reason: reasonNoSource ?? `no ${side} path reaches "${part.key}" through wires, fuses, closed contacts, connectors and earth points`
			};
		}
		const p = paths(partId, side);
		return { part: partId, side, reached: true, ...p, mustPass: must.map(point) };
	}

	function shared(partIds: readonly string[], side: Side = 'feed'): SharedPoint {
		if (!partIds.length) throw new Error('sharedUpstream: select at least one part');
		const unreached: string[] = [];
		const reached: number[] = [];
		for (const id of partIds) {
			const t = target(id);
			if (noSource(side) || tree(side).idom[t] < 0) unreached.push(id);
			else reached.push(t);
		}
		const name = side === 'feed' ? 'feed' : 'earth';
		if (!reached.length) {
			return { side, shared: false, nearest: null, chain: [], unreached, message: `none of the selected parts has a ${name} path` };
		}
		const tr = tree(side);
		let lca = nearestCommonDominator(tr, reached);
		if (g.vertices[lca].type === 'target') lca = tr.idom[lca]; // one part selected: its nearest point
		const chain = dominatorsOf(tr, lca).reverse().map(point);
		const isShared = lca !== tr.root;
		const keyOf = (id: string) => doc.parts.find((p) => p.id === id)?.key ?? id;
		let message = isShared
			? `shared ${name}: ${counted(chain.length, 'point')} from the battery to the nearest common point`
			: `the selected parts share no ${name} point but the battery terminal itself`;
		if (unreached.length) message += `; no ${name} path at all to ${unreached.map(keyOf).join(', ')}`;
		return { side, shared: isShared, nearest: point(lca), chain, unreached, message };
	}

	return {
		doc,
		feed: (id) => trace(id, 'feed'),
		earth: (id) => trace(id, 'earth'),
		mustPass: (id, side = 'feed') => (mustPassIdx(id, side) ?? []).map(point),
		shared
	};
}

/** Every feed path from the battery's live terminal to a part, and its must-pass points. */
export function traceFeed(doc: HarnessDocument, scenario: Scenario, partId: string, options?: TraceOptions): PathTrace {
	return prepareTrace(doc, scenario, options).feed(partId);
}

/** Every earth path from a part to the battery's earthed terminal (listed battery end first). */
export function traceEarth(doc: HarnessDocument, scenario: Scenario, partId: string, options?: TraceOptions): PathTrace {
	return prepareTrace(doc, scenario, options).earth(partId);
}

/** Points on every feed (or earth) path of a part, battery end first; empty if it has none. */
export function mustPass(doc: HarnessDocument, scenario: Scenario, partId: string, side: Side = 'feed', options?: TraceOptions): TracePoint[] {
	return prepareTrace(doc, scenario, options).mustPass(partId, side);
}

/** The must-pass feed point nearest to all the selected parts, with the shared chain up to the battery. */
export function sharedUpstream(doc: HarnessDocument, scenario: Scenario, partIds: readonly string[], options?: TraceOptions): SharedPoint {
	return prepareTrace(doc, scenario, options).shared(partIds, 'feed');
}

/** The must-pass earth point nearest to all the selected parts, with the shared chain to the battery. */
export function sharedEarth(doc: HarnessDocument, scenario: Scenario, partIds: readonly string[], options?: TraceOptions): SharedPoint {
	return prepareTrace(doc, scenario, options).shared(partIds, 'earth');
}
