// Turns trace results into what the canvas marks: the wires, parts and terminals on each
// selected part's feed and earth paths, the must-pass points, and for two or more parts the
// shared feed and shared earth with their plain sentence. Pure: the tracer is prepared once
// per document and scenario by the caller (src/lib/trace/trace.svelte.ts).
import { nets, type Net } from '$lib/circuit/nets';
import { PASS_THROUGH_KINDS } from '$lib/circuit/parts';
import type { HarnessDocument } from '$lib/circuit/schema';
import { pointKey, type PathTrace, type Side, type TracePoint, type Tracer } from '$lib/circuit/trace';
import { pointName, sharedSentence } from './words';

/** A terminal as one string, `part:terminal` (part ids never hold a colon). */
export const terminalId = (part: string, terminal: string) => `${part}:${terminal}`;

export interface Marks {
	wires: Set<string>;
	parts: Set<string>;
	terminals: Set<string>;
}

const emptyMarks = (): Marks => ({ wires: new Set(), parts: new Set(), terminals: new Set() });

/** Adds a point to marks: a wire, a pass-through part (or its contact), or a node's terminals. */
export function markPoint(m: Marks, p: TracePoint): void {
	if (p.type === 'wire') m.wires.add(p.wire);
	else if (p.type === 'part') m.parts.add(p.part);
	else for (const t of p.terminals) m.terminals.add(terminalId(t.part, t.terminal));
}

/** Where a marker for a point is drawn: on a wire, on a part, or on one terminal. */
export type MarkerPlace = { on: 'wire'; wire: string } | { on: 'part'; part: string } | { on: 'terminal'; part: string; terminal: string };

export function placeOf(doc: HarnessDocument, p: TracePoint): MarkerPlace | null {
	if (p.type === 'wire') return { on: 'wire', wire: p.wire };
	if (p.type === 'part') return { on: 'part', part: p.part };
	const t = p.terminals[0];
	if (!t) return null; // the chassis has no drawn terminal of its own
	const part = doc.parts.find((x) => x.id === t.part);
	return part?.kind === 'splice' ? { on: 'part', part: t.part } : { on: 'terminal', part: t.part, terminal: t.terminal };
}

export interface SideTrace {
	part: string;
	side: Side;
	reached: boolean;
	/** When the part earths through another part (a gauge through its sender): that part's id. */
	via?: string;
	/** Wires between this part and the one it earths through. */
	bridge: string[];
	mustPass: TracePoint[];
	/** Must-pass points in words, battery end first. */
	mustPassNames: string[];
	reason?: string;
}

export interface SharedMark {
	side: Side;
	point: TracePoint | null;
	place: MarkerPlace | null;
	name: string | null;
	sentence: string;
}

export interface TraceView {
	parts: string[];
	feed: Marks;
	earth: Marks;
	/** Keys (see `pointKey`) of points on every path of every selected part, either side. */
	mustPass: Set<string>;
	mustPassPlaces: MarkerPlace[];
	traces: SideTrace[];
	shared: { feed: SharedMark; earth: SharedMark } | null;
}

function netIndex(doc: HarnessDocument): Map<string, Net> {
	const m = new Map<string, Net>();
	for (const n of nets(doc)) for (const t of n.terminals) m.set(terminalId(t.part, t.terminal), n);
	return m;
}

/**
 * A part with no earth path of its own often earths through a load wired to it (a gauge
 * through its sender, a warning lamp through its switch's far side): the first such part,
 * wired straight to one of its terminals that is not on its feed, whose earth is reached.
 */
function earthThrough(doc: HarnessDocument, tracer: Tracer, partId: string, feedTerminals: Set<string>, index: Map<string, Net>) {
	const part = doc.parts.find((p) => p.id === partId);
	if (!part) return null;
	for (const t of part.terminals) {
		if (feedTerminals.has(terminalId(partId, t))) continue;
		const net = index.get(terminalId(partId, t));
		if (!net) continue;
		for (const ref of net.terminals) {
			if (ref.part === partId) continue;
			const other = doc.parts.find((p) => p.id === ref.part);
			if (!other || PASS_THROUGH_KINDS.has(other.kind) || other.kind === 'battery') continue;
			const trace = tracer.earth(other.id);
			if (trace.reached) return { via: other.id, trace, bridge: net.wires };
		}
	}
	return null;
}

function sideTrace(doc: HarnessDocument, t: PathTrace, via?: string, bridge: string[] = []): SideTrace {
	return {
		part: t.part,
		side: t.side,
		reached: t.reached,
		via,
		bridge,
		mustPass: t.mustPass,
		mustPassNames: t.mustPass.map((p) => pointName(doc, p)),
		reason: t.reason
	};
}

function addPaths(m: Marks, t: PathTrace) {
	for (const path of t.paths) for (const p of path) markPoint(m, p);
}

/**
 * Everything trace mode marks for a selection of parts.
 * @example traceView(doc, prepareTrace(doc, defaultScenario(doc)), ['fuel-gauge', 'temp-gauge']).shared?.feed.name
 * // 'terminal out of 19 Instrument voltage stabilizer'
 */
export function traceView(doc: HarnessDocument, tracer: Tracer, partIds: readonly string[]): TraceView {
	const known = new Set(doc.parts.map((p) => p.id));
	const parts = partIds.filter((id) => known.has(id));
	const feed = emptyMarks();
	const earth = emptyMarks();
	const mustPass = new Map<string, TracePoint>();
	const traces: SideTrace[] = [];
	const via = new Map<string, string>();
	let index: Map<string, Net> | null = null;

	for (const id of parts) {
		const f = tracer.feed(id);
		addPaths(feed, f);
		traces.push(sideTrace(doc, f));
		for (const p of f.mustPass) mustPass.set(pointKey(p), p);

		let e = tracer.earth(id);
		let throughId: string | undefined;
		let bridge: string[] = [];
		if (!e.reached) {
			const own = emptyMarks();
			addPaths(own, f);
			const through = earthThrough(doc, tracer, id, own.terminals, (index ??= netIndex(doc)));
			if (through) {
				e = { ...through.trace, part: id };
				throughId = through.via;
				bridge = through.bridge;
				via.set(id, through.via);
				for (const w of bridge) earth.wires.add(w);
				earth.parts.add(through.via);
			}
		}
		addPaths(earth, e);
		traces.push(sideTrace(doc, e, throughId, bridge));
		for (const p of e.mustPass) mustPass.set(pointKey(p), p);
	}

	let shared: TraceView['shared'] = null;
	if (parts.length >= 2) {
		const mark = (side: Side): SharedMark => {
			const ids = side === 'earth' ? parts.map((id) => via.get(id) ?? id) : parts;
			const s = tracer.shared(ids, side);
			const unreached = parts.filter((id, i) => s.unreached.includes(ids[i]));
			const point = s.shared ? s.nearest : null;
			return {
				side,
				point,
				place: point ? placeOf(doc, point) : null,
				name: point ? pointName(doc, point) : null,
				sentence: sharedSentence(doc, { side, parts, nearest: point, unreached, via })
			};
		};
		shared = { feed: mark('feed'), earth: mark('earth') };
	}

	const places = [...mustPass.values()].map((p) => placeOf(doc, p)).filter((p): p is MarkerPlace => p !== null);
	return { parts, feed, earth, mustPass: new Set(mustPass.keys()), mustPassPlaces: places, traces, shared };
}

export interface TerminalMarks {
	feed: boolean;
	earth: boolean;
	mustPass: boolean;
	shared: Side[];
}
export interface PartMarks extends TerminalMarks {
	selected: boolean;
	terminals: Map<string, TerminalMarks>;
}
export interface WireMarks extends TerminalMarks {}

export interface CanvasMarks {
	/** True when something is traced: parts and wires off every path are drawn faint. */
	any: boolean;
	parts: Map<string, PartMarks>;
	wires: Map<string, WireMarks>;
}

const blank = (): TerminalMarks => ({ feed: false, earth: false, mustPass: false, shared: [] });

/** The view as look-ups per part, terminal and wire, so each node and edge finds its own marks at once. */
export function canvasMarks(view: TraceView): CanvasMarks {
	const parts = new Map<string, PartMarks>();
	const wires = new Map<string, WireMarks>();
	const part = (id: string) => {
		let m = parts.get(id);
		if (!m) parts.set(id, (m = { ...blank(), selected: false, terminals: new Map() }));
		return m;
	};
	const terminal = (id: string) => {
		const i = id.indexOf(':');
		const m = part(id.slice(0, i));
		const name = id.slice(i + 1);
		let t = m.terminals.get(name);
		if (!t) m.terminals.set(name, (t = blank()));
		return t;
	};
	const wire = (id: string) => {
		let m = wires.get(id);
		if (!m) wires.set(id, (m = blank()));
		return m;
	};
	for (const [side, marks] of [['feed', view.feed], ['earth', view.earth]] as const) {
		for (const id of marks.parts) part(id)[side] = true;
		for (const id of marks.wires) wire(id)[side] = true;
		for (const id of marks.terminals) {
			terminal(id)[side] = true;
			part(id.slice(0, id.indexOf(':')))[side] = true;
		}
	}
	const place = (p: MarkerPlace): TerminalMarks => (p.on === 'wire' ? wire(p.wire) : p.on === 'part' ? part(p.part) : terminal(terminalId(p.part, p.terminal)));
	for (const p of view.mustPassPlaces) place(p).mustPass = true;
	for (const s of view.shared ? [view.shared.feed, view.shared.earth] : []) if (s.place) place(s.place).shared.push(s.side);
	for (const id of view.parts) part(id).selected = true;
	return { any: view.parts.length > 0, parts, wires };
}
