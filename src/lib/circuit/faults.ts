/**
 * Single-fault hypotheses and their priors.
 *
 * A hypothesis is one thing gone wrong, written as a small list of changes to the flat circuit
 * (`circuit.ts`): an element's resistance replaced or raised, an element opened, a node joined
 * to the chassis, a stabilizer that no longer regulates as it should, a battery that has run
 * down. Element indices are the same in every scenario of a document (open elements are kept
 * at g = 0), so one list of hypotheses serves every setup a probe is taken in.
 *
 * Generated over a *region* of the harness (by default the feed and earth paths of the marked
 * parts, see `regionOf`): no fault; each wire open; each wire end off its terminal or of high
 * resistance; each connector pin, earth point, fuse holder and switch contact of high
 * resistance or open; each node shorted to the chassis; each part open or shorted; and the
 * part-specific failures (stabilizer stuck open, stuck closed, low or high output; sender open
 * or shorted; lamp filament open; fuse blown; relay coil open).
 *
 * High resistance is a sweep of values (`RESISTIVE_SWEEP`): one hypothesis per value at the
 * same *site*; `suspects.ts` keeps, per site, the value that explains the marks best.
 *
 * Priors come from a failure weight per fault kind (`DEFAULT_WEIGHTS`). No survey of faults on
 * old vehicles was found (TRADE.md, "Fault frequency"): the order — earths and connectors, then
 * switch contacts, then fuses and their holders, then failed components, then chafed insulation
 * and shorts — is common practice; the numbers themselves are invented to follow that order.
 * The user can change any weight per diagram.
 */
import type { Circuit, Element } from './circuit';
import { CHASSIS, nodeOfTerminal } from './nets';
import { resolveParams } from './parts';
import type { Scenario } from './scenario';
import type { HarnessDocument, Part } from './schema';
import { prepareTrace, type TracePoint } from './trace';
import { wireNames } from './wire-names';

/** One change to the circuit. Element and node indices refer to `buildCircuit` of the document. */
export type Change =
	/** Element resistance: replaced by `ohms`, raised by `ohms` in series (`series`), or opened (`ohms: null`). */
	| { type: 'element'; element: number; ohms: number | null; series?: boolean }
	/** A new conductance from a node to the chassis (a short to earth). */
	| { type: 'to-chassis'; node: number; ohms: number }
	/** A stabilizer fault: contacts never close, contacts welded, or a set-point off by `factor`. */
	| { type: 'stabilizer'; part: string; mode: 'stuck-open' | 'stuck-closed' | 'set-point'; factor?: number }
	/** A battery whose open-circuit voltage has fallen to `volts`. */
	| { type: 'emf'; part: string; volts: number };

export const FAULT_KINDS = [
	'none',
	'wire:open',
	'joint:off',
	'joint:resistive',
	'node:short',
	'earth-point:open',
	'earth-point:resistive',
	'connector:pin-open',
	'connector:pin-resistive',
	'switch:contact-open',
	'switch:contact-resistive',
	'switch:contact-stuck',
	'fuse:blown',
	'fuse:resistive',
	'relay:coil-open',
	'relay:contact-open',
	'relay:contact-resistive',
	'lamp:open',
	'lamp:shorted',
	'gauge:open',
	'gauge:shorted',
	'sender:open',
	'sender:shorted',
	'stabilizer:stuck-open',
	'stabilizer:stuck-closed',
	'stabilizer:low',
	'stabilizer:high',
	'resistor:open',
	'resistor:shorted',
	'motor:open',
	'motor:shorted',
	'load:open',
	'load:shorted',
	'ignition-coil:open',
	'ignition-coil:shorted',
	'battery:discharged'
] as const;
export type FaultKind = (typeof FAULT_KINDS)[number];

/**
 * Failure weights per site (relative, any unit). Order: common practice (TRADE.md); the
 * numbers are invented to follow it. A resistive site's weight is shared by its sweep values.
 */
export const DEFAULT_WEIGHTS: Record<FaultKind, number> = {
	none: 1,
	// Corroded or loose earths and connectors: the commonest (common practice).
	'earth-point:resistive': 10,
	'earth-point:open': 3,
	'connector:pin-resistive': 8,
	'connector:pin-open': 2,
	'joint:resistive': 6,
	'joint:off': 2,
	// Switch contacts next.
	'switch:contact-resistive': 5,
	'switch:contact-open': 3,
	'switch:contact-stuck': 0.5,
	// Fuses and fuse-holder contacts (old glass fuses lose their caps; ceramic ones corrode).
	'fuse:resistive': 4,
	'fuse:blown': 3,
	'relay:contact-resistive': 3,
	'relay:contact-open': 1.5,
	'relay:coil-open': 1,
	// Failed components: stabilizers, senders, gauges, bulbs.
	'stabilizer:low': 2.5,
	'stabilizer:high': 1.5,
	'stabilizer:stuck-open': 1.5,
	'stabilizer:stuck-closed': 1,
	'sender:open': 2,
	'sender:shorted': 0.7,
	'gauge:open': 1.5,
	'gauge:shorted': 0.3,
	'lamp:open': 3,
	'lamp:shorted': 0.2,
	'motor:open': 1,
	'motor:shorted': 0.3,
	'load:open': 1,
	'load:shorted': 0.3,
	'resistor:open': 1,
	'resistor:shorted': 0.3,
	'ignition-coil:open': 1,
	'ignition-coil:shorted': 0.3,
	'battery:discharged': 2,
	// Chafed insulation and shorts: the rarest of the list.
	'wire:open': 0.8,
	'node:short': 0.5
};

/** Extra resistance of a corroded or loose joint (Ω): a sweep, from a dirty joint to one barely touching. Invented values. */
export const RESISTIVE_SWEEP = [1, 5, 20, 100] as const;

/** Resistance of a short to the chassis (Ω): chafed insulation on bare metal. Invented. */
export const SHORT_OHMS = 0.05;

/** A shorted winding or filament keeps this fraction of its resistance (invented), at least 0.02 Ω. */
export const SHORTED_FRACTION = 0.02;

/** A stabilizer's set-point when it drifts low or high (tired bimetal, dirty contacts; TRADE.md). Invented factors. */
export const STABILIZER_DRIFT = { low: 0.7, high: 1.3 } as const;

/** A run-down 12 V battery: 11.89 V, "discharged" in the BCI rest table (TRADE.md); scaled by system voltage. */
export const DISCHARGED_VOLTS_PER_12 = 11.89;

/**
 * The span each sized fault mode covers in a real vehicle (TRADE.md, "Tolerances"): a corroded or
 * loose joint is anything from a fraction of an ohm to effectively open, a chafed short from near
 * 0 Ω to a few ohms (common practice); a drifting stabilizer's set-point anywhere outside the
 * healthy 9.5–10.5 V per 12 V (enthusiast pages, TRADE.md) — the factor ends are invented. A
 * suspect stands for its whole span; the sweep values only sample it.
 */
export const FAULT_SIZE_RANGES = {
	/** Ω added in series. */
	resistive: { low: 0.3, high: 5000 },
	/** Ω from the node to the chassis. */
	short: { low: 0.01, high: 3 },
	/** Factor on the set-point. */
	'stabilizer:low': { low: 0.4, high: 0.93 },
	'stabilizer:high': { low: 1.07, high: 1.6 }
} as const;

/**
 * Sizes a diagnosis samples across each range (roughly even steps on a log scale for ohms): a
 * suspect's span of readings is read off these, and between two samples a reading moves
 * monotonically (one conductance changing: the Sherman–Morrison update is a Möbius function of it).
 */
export const SIZE_GRIDS = {
	resistive: [0.3, 1, 3, 10, 20, 50, 150, 500, 5000],
	short: [0.01, 0.1, 0.5, 1, 3],
	'stabilizer:low': [0.4, 0.55, 0.7, 0.8, 0.88, 0.93],
	'stabilizer:high': [1.07, 1.12, 1.2, 1.3, 1.45, 1.6]
} as const;

/** The size range of a hypothesis's fault mode, or null for a fault with one size (open, blown, stuck). */
export function sizeRange(h: Pick<Hypothesis, 'kind' | 'changes'>): { low: number; high: number } | null {
	if (h.kind === 'node:short') return FAULT_SIZE_RANGES.short;
	if (h.kind === 'stabilizer:low' || h.kind === 'stabilizer:high') return FAULT_SIZE_RANGES[h.kind];
	const c = h.changes[0];
	return c && c.type === 'element' && c.series && c.ohms !== null ? FAULT_SIZE_RANGES.resistive : null;
}

/** A sized hypothesis's changes with its fault at `size` (Ω, or the set-point factor); others unchanged. */
export function atSize(h: Pick<Hypothesis, 'kind' | 'changes'>, size: number): Change[] {
	if (!sizeRange(h)) return h.changes;
	return h.changes.map((c, i) => {
		if (i > 0) return c;
		if (c.type === 'element' || c.type === 'to-chassis') return { ...c, ohms: size };
		if (c.type === 'stabilizer') return { ...c, factor: size };
		return c;
	});
}

/** Where a fault is, in the restorer's terms. */
export interface FaultPlace {
	part?: string;
	terminals?: string[];
	wire?: string;
	end?: 'from' | 'to';
	/** Node name (see nets.ts) for shorts. */
	node?: string;
}

export interface Hypothesis {
	/** Stable id, e.g. `joint:w-fuel-a:to:20`, `lamp:open:tail-left`. */
	id: string;
	/** Same for every sweep value of one place (a resistive joint at 1, 5, 20 or 100 Ω). */
	site: string;
	kind: FaultKind;
	label: string;
	place: FaultPlace;
	/** Prior weight of the site (not yet normalised). */
	prior: number;
	/** Added resistance (Ω) for sweep hypotheses. */
	ohms?: number;
	changes: Change[];
}

/** Parts, wires and nodes (names) the hypotheses are generated over. */
export interface Region {
	parts: Set<string>;
	wires: Set<string>;
	nodes: Set<string>;
}

export interface HypothesisOptions {
	/** Restrict to a region (default: the whole harness). */
	region?: Region;
	/** Weights per fault kind overriding `DEFAULT_WEIGHTS`. */
	weights?: Partial<Record<FaultKind, number>>;
	/** Resistive sweep values (Ω); default `RESISTIVE_SWEEP`. */
	sweep?: readonly number[];
}

/** Kinds whose failure may come and go (loose, corroded, broken inside the insulation): they can explain "erratic". */
export const INTERMITTENT_KINDS: ReadonlySet<FaultKind> = new Set([
	'wire:open',
	'joint:off',
	'joint:resistive',
	'earth-point:open',
	'earth-point:resistive',
	'connector:pin-open',
	'connector:pin-resistive',
	'switch:contact-open',
	'switch:contact-resistive',
	'fuse:resistive',
	'relay:contact-resistive',
	'sender:open',
	'stabilizer:low',
	'stabilizer:high',
	'node:short'
]);

/** Every element of a circuit by a key of its reference: `wire:w1`, `joint:w1:from`, `part:p1:role:a-b`. */
function elementKeys(c: Circuit): Map<string, number> {
	const keys = new Map<string, number>();
	c.elements.forEach((e: Element, k) => {
		const r = e.ref;
		if (r.kind === 'wire') keys.set(`wire:${r.wire}`, k);
		else if (r.kind === 'joint') keys.set(`joint:${r.wire}:${r.end}`, k);
		else if (r.kind === 'part') keys.set(`part:${r.part}:${r.role}:${r.terminals.join('-')}`, k);
	});
	return keys;
}

/** Generate the hypotheses of a document's circuit (any setup of it) over a region. */
export function generateHypotheses(c: Circuit, options: HypothesisOptions = {}): Hypothesis[] {
	const doc = c.doc;
	const weights = { ...DEFAULT_WEIGHTS, ...(options.weights ?? {}) };
	const sweep = options.sweep ?? RESISTIVE_SWEEP;
	const region = options.region;
	const inParts = (id: string) => !region || region.parts.has(id);
	const inWires = (id: string) => !region || region.wires.has(id);
	const elements = elementKeys(c);
	const names = wireNames(doc);
	const out: Hypothesis[] = [];
	const add = (kind: FaultKind, site: string, label: string, place: FaultPlace, changes: Change[], ohms?: number) => {
		const w = weights[kind];
		if (!(w > 0)) return;
		out.push({ id: ohms === undefined ? site : `${site}:${ohms}`, site, kind, label, place, prior: w, changes, ...(ohms !== undefined ? { ohms } : {}) });
	};
	const resistive = (kind: FaultKind, site: string, label: string, place: FaultPlace, element: number) => {
		for (const r of sweep) add(kind, site, `${label}, about ${r} Ω`, place, [{ type: 'element', element, ohms: r, series: true }], r);
	};
	const el = (part: Part, role: string, terms: readonly string[]) => elements.get(`part:${part.id}:${role}:${terms.join('-')}`);

	add('none', 'none', 'No fault: the harness is as drawn', {}, []);

	for (const w of doc.wires) {
		if (!inWires(w.id)) continue;
		const wire = elements.get(`wire:${w.id}`)!;
		const named = names.wire(w);
		add('wire:open', `wire:${w.id}:open`, `${named[0].toUpperCase()}${named.slice(1)} broken inside its insulation`, { wire: w.id }, [{ type: 'element', element: wire, ohms: null }]);
		for (const end of ['from', 'to'] as const) {
			const ref = w[end];
			const joint = elements.get(`joint:${w.id}:${end}`)!;
			const at = names.end(w, end);
			const place = { wire: w.id, end, part: ref.part, terminals: [ref.terminal] };
			add('joint:off', `joint:${w.id}:${end}:off`, `End of ${at} off its terminal`, place, [{ type: 'element', element: joint, ohms: null }]);
			resistive('joint:resistive', `joint:${w.id}:${end}`, `Corroded or loose end of ${at}`, place, joint);
		}
	}

	for (const part of doc.parts) {
		if (!inParts(part.id)) continue;
		const k = part.key;
		const name = part.label ? `${k} (${part.label})` : k;
		const place = (terminals?: string[]): FaultPlace => ({ part: part.id, ...(terminals ? { terminals } : {}) });
		const open = (kind: FaultKind, label: string, element: number | undefined, terminals?: string[]) => {
			if (element !== undefined) add(kind, `${kind}:${part.id}${terminals ? ':' + terminals.join('-') : ''}`, label, place(terminals), [{ type: 'element', element, ohms: null }]);
		};
		const shorted = (kind: FaultKind, label: string, element: number | undefined) => {
			if (element === undefined) return;
			const ohms = Math.max(0.02, SHORTED_FRACTION / c.elements[element].gClosed);
			add(kind, `${kind}:${part.id}`, label, place(), [{ type: 'element', element, ohms }]);
		};
		switch (part.kind) {
			case 'battery': {
				const p = resolveParams('battery', part.params, doc.vehicle);
				const volts = (DISCHARGED_VOLTS_PER_12 * doc.vehicle.systemVoltage) / 12;
				if (volts < p.emf) add('battery:discharged', `battery:discharged:${part.id}`, `Battery ${name} run down (about ${volts.toFixed(2)} V at rest)`, place(), [{ type: 'emf', part: part.id, volts }]);
				break;
			}
			case 'earth-point': {
				const e = el(part, 'earth', ['stud']);
				open('earth-point:open', `Earth point ${name} loose, not touching the body`, e);
				if (e !== undefined) resistive('earth-point:resistive', `earth-point:${part.id}`, `Earth point ${name} corroded`, place(), e);
				break;
			}
			case 'fuse': {
				const e = el(part, 'fuse', ['in', 'out']);
				if (!part.params.blown) open('fuse:blown', `Fuse ${name} blown`, e);
				if (e !== undefined) resistive('fuse:resistive', `fuse:${part.id}`, `Fuse ${name}: corroded caps or holder`, place(), e);
				break;
			}
			case 'switch': {
				const seen = new Set<string>();
				for (const pos of part.params.positions) {
					for (const [a, b] of pos.closed) {
						const pair = [a, b].sort().join('-');
						if (seen.has(pair)) continue;
						seen.add(pair);
						const e = el(part, 'contact', [a, b]);
						if (e === undefined) continue;
						const terms = [a, b];
						open('switch:contact-open', `Switch ${name}: contact ${a}–${b} does not close`, e, terms);
						add('switch:contact-stuck', `switch:contact-stuck:${part.id}:${a}-${b}`, `Switch ${name}: contact ${a}–${b} stuck closed`, place(terms), [
							{ type: 'element', element: e, ohms: 1 / c.elements[e].gClosed }
						]);
						resistive('switch:contact-resistive', `switch:${part.id}:${a}-${b}`, `Switch ${name}: contact ${a}–${b} burnt or dirty`, place(terms), e);
					}
				}
				break;
			}
			case 'relay': {
				open('relay:coil-open', `Relay ${name}: coil open`, el(part, 'coil', ['85', '86']), ['85', '86']);
				const no = el(part, 'contact', ['30', '87']);
				open('relay:contact-open', `Relay ${name}: contact 30–87 does not close`, no, ['30', '87']);
				if (no !== undefined) resistive('relay:contact-resistive', `relay:${part.id}:30-87`, `Relay ${name}: contact 30–87 burnt`, place(['30', '87']), no);
				break;
			}
			case 'connector':
				for (const [a, b] of part.params.pins) {
					const e = el(part, 'pin', [a, b]);
					if (e === undefined) continue;
					open('connector:pin-open', `Connector ${name}: pin ${a}–${b} pushed back or broken`, e, [a, b]);
					resistive('connector:pin-resistive', `connector:${part.id}:${a}-${b}`, `Connector ${name}: pin ${a}–${b} corroded`, place([a, b]), e);
				}
				break;
			case 'lamp': {
				const e = el(part, 'filament', ['feed', 'earth']);
				open('lamp:open', `Lamp ${name}: filament broken`, e);
				shorted('lamp:shorted', `Lamp ${name}: shorted inside the holder`, e);
				break;
			}
			case 'gauge': {
				const e = el(part, 'winding', ['feed', 'sender']);
				open('gauge:open', `Gauge ${name}: heater winding open`, e);
				shorted('gauge:shorted', `Gauge ${name}: winding shorted`, e);
				break;
			}
			case 'sender': {
				const e = el(part, 'track', ['feed', 'earth']);
				open('sender:open', `Sender ${name}: open (worn track or broken lead)`, e);
				shorted('sender:shorted', `Sender ${name}: shorted to its body`, e);
				break;
			}
			case 'stabilizer':
				add('stabilizer:stuck-open', `stabilizer:stuck-open:${part.id}`, `Stabilizer ${name}: contacts never close`, place(), [{ type: 'stabilizer', part: part.id, mode: 'stuck-open' }]);
				add('stabilizer:stuck-closed', `stabilizer:stuck-closed:${part.id}`, `Stabilizer ${name}: contacts welded shut`, place(), [{ type: 'stabilizer', part: part.id, mode: 'stuck-closed' }]);
				add('stabilizer:low', `stabilizer:low:${part.id}`, `Stabilizer ${name}: output low (tired bimetal, dirty contacts)`, place(), [
					{ type: 'stabilizer', part: part.id, mode: 'set-point', factor: STABILIZER_DRIFT.low }
				]);
				add('stabilizer:high', `stabilizer:high:${part.id}`, `Stabilizer ${name}: output high`, place(), [
					{ type: 'stabilizer', part: part.id, mode: 'set-point', factor: STABILIZER_DRIFT.high }
				]);
				break;
			case 'resistor':
			case 'motor':
			case 'load':
			case 'ignition-coil': {
				const role = part.kind === 'motor' || part.kind === 'ignition-coil' ? 'winding' : 'resistance';
				const terms =
					part.kind === 'motor' ? ['feed', 'earth'] : part.kind === 'ignition-coil' ? ['15', '1'] : part.kind === 'resistor' ? ['1', '2'] : (part.params.between ?? part.terminals.slice(0, 2));
				const e = el(part, role, terms);
				const noun = { resistor: 'Resistor', motor: 'Motor', load: 'Part', 'ignition-coil': 'Ignition coil' }[part.kind];
				open(`${part.kind}:open` as FaultKind, `${noun} ${name}: open`, e);
				shorted(`${part.kind}:shorted` as FaultKind, `${noun} ${name}: shorted`, e);
				break;
			}
			default:
				break;
		}
	}

	// Shorts to the chassis: one per node of the region (splices are one node; wire ends belong to their terminal's node).
	const chassis = c.nodeIndex.get(CHASSIS);
	if (chassis !== undefined) {
		const seen = new Set<number>();
		for (const part of doc.parts) {
			if (part.kind === 'earth-point') continue; // its stud is earthed already
			for (const t of part.terminals) {
				const name = nodeOfTerminal(part, t);
				if (region && !region.nodes.has(name)) continue;
				const node = c.nodeIndex.get(name)!;
				if (node < 0 || node === chassis || seen.has(node)) continue;
				seen.add(node);
				const where = part.kind === 'splice' ? `splice ${part.key}` : `${part.key}.${t}`;
				add('node:short', `short:${name}`, `Short to earth at ${where} (chafed insulation)`, { part: part.id, terminals: [t], node: name }, [
					{ type: 'to-chassis', node, ohms: SHORT_OHMS }
				]);
			}
		}
	}
	return out;
}

/**
 * The region a diagnosis looks at: every point on the feed and earth paths of the given parts;
 * the parts wired straight to their terminals (a gauge's sender, a lamp sharing its feed wire),
 * with their paths; and the feed and earth of the stabilizers and relay coils on those paths,
 * whose failure moves what passes through them.
 */
export function regionOf(doc: HarnessDocument, scenario: Scenario, partIds: readonly string[]): Region {
	const tracer = prepareTrace(doc, scenario);
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const region: Region = { parts: new Set(), wires: new Set(), nodes: new Set() };
	const done = new Map<string, number>();
	const addPoint = (pt: TracePoint) => {
		if (pt.type === 'node') region.nodes.add(pt.node);
		else if (pt.type === 'wire') region.wires.add(pt.wire);
		else region.parts.add(pt.part);
	};
	// Terminals joined by wires, splices and connector pins: the parts on the same wiring.
	const byTerminal = new Map<string, { wire: string; other: { part: string; terminal: string } }[]>();
	for (const w of doc.wires) {
		const a = `${w.from.part}:${w.from.terminal}`;
		const b = `${w.to.part}:${w.to.terminal}`;
		(byTerminal.get(a) ?? byTerminal.set(a, []).get(a)!).push({ wire: w.id, other: w.to });
		(byTerminal.get(b) ?? byTerminal.set(b, []).get(b)!).push({ wire: w.id, other: w.from });
	}
	const wiredTo = (partId: string): string[] => {
		const found = new Set<string>();
		const seen = new Set<string>();
		const start = parts.get(partId)!;
		const stack = start.terminals.map((t) => ({ part: partId, terminal: t }));
		while (stack.length) {
			const ref = stack.pop()!;
			const k = `${ref.part}:${ref.terminal}`;
			if (seen.has(k)) continue;
			seen.add(k);
			const p = parts.get(ref.part)!;
			region.nodes.add(nodeOfTerminal(p, ref.terminal));
			if (ref.part !== partId) {
				if (p.kind === 'splice') stack.push(...p.terminals.map((t) => ({ part: p.id, terminal: t })));
				else if (p.kind === 'connector') {
					region.parts.add(p.id);
					for (const [x, y] of p.params.pins) {
						if (x === ref.terminal) stack.push({ part: p.id, terminal: y });
						if (y === ref.terminal) stack.push({ part: p.id, terminal: x });
					}
				} else if (p.kind !== 'battery' && p.kind !== 'earth-point') found.add(p.id);
			}
			// Earth points and battery posts join many circuits: do not walk on through them.
			if (ref.part !== partId && (p.kind === 'earth-point' || p.kind === 'battery')) continue;
			for (const { wire, other } of byTerminal.get(k) ?? []) {
				region.wires.add(wire);
				stack.push(other);
			}
		}
		return [...found];
	};
	const visit = (partId: string, depth: number) => {
		// A part first reached from a neighbour (less depth left) is walked again when marked itself.
		if ((done.get(partId) ?? -1) >= depth) return;
		done.set(partId, depth);
		region.parts.add(partId);
		const part = parts.get(partId)!;
		for (const side of ['feed', 'earth'] as const) {
			const tr = side === 'feed' ? tracer.feed(partId) : tracer.earth(partId);
			for (const path of tr.paths) for (const pt of path) addPoint(pt);
		}
		for (const t of part.terminals) region.nodes.add(nodeOfTerminal(part, t));
		if (depth > 0) {
			for (const other of wiredTo(partId)) visit(other, depth - 1);
		}
	};
	for (const id of partIds) {
		if (!parts.has(id)) throw new Error(`regionOf: no part with id "${id}"`);
		visit(id, 2);
	}
	// Stabilizers and relays passed through: their own feed and earth (a relay: its coil).
	for (const id of [...region.parts]) {
		const p = parts.get(id)!;
		if (p.kind === 'stabilizer' || p.kind === 'relay') visit(id, 0);
	}
	// The battery is always in: its posts and its run-down state.
	for (const p of doc.parts) if (p.kind === 'battery') region.parts.add(p.id);
	return region;
}
