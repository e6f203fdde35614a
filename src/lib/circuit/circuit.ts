/**
 * Document + scenario → a flat linear circuit: numbered nodes, conductances between them,
 * and Norton sources, each element carrying a back-reference to the part, wire or wire-end
 * joint it models. The reference node (0 V) is the main battery's earthed terminal, so a
 * positive-earth vehicle reads negative (mirror image) and no ideal voltage source is needed:
 * the nodal matrix stays symmetric positive definite.
 *
 * Every element is one conductance, so a fault (an open wire, a high-resistance joint, a
 * corroded earth) is one rank-one change of the matrix. Elements that are open in this
 * scenario (an open switch contact, a blown fuse, an unplugged joint) are kept with g = 0,
 * so the matrix pattern is the same for every scenario of a document.
 */
import { CHASSIS, nodeOfTerminal } from './nets';
import {
	earthedTerminal,
	lampResistance,
	polaritySign,
	resolveParams,
	senderResistance
} from './parts';
import { viewScenario, type Scenario } from './scenario';
import type { HarnessDocument, Part, TerminalRef } from './schema';
import { wireResistance } from './wires';

/** Leakage from every node to the reference (S), like SPICE's gmin: a floating node reads 0 V. */
export const GMIN = 1e-12;

/**
 * Resistance of one wire-end joint (crimp or soldered eyelet to terminal), Ω. Invented
 * default of the order of a sound crimp (a few milliohms, from memory).
 */
export const JOINT_RESISTANCE = 0.002;

/** Floor on a wire's own resistance, so a zero-length wire stays a finite conductance (Ω). */
export const MIN_WIRE_RESISTANCE = 1e-5;

export type ElementRole =
	| 'internal'
	| 'armature'
	| 'earth'
	| 'fuse'
	| 'contact'
	| 'pin'
	| 'filament'
	| 'winding'
	| 'coil'
	| 'heater'
	| 'track'
	| 'resistance'
	| 'regulator';

export type ElementRef =
	| { kind: 'wire'; wire: string }
	| { kind: 'joint'; wire: string; end: 'from' | 'to' }
	| { kind: 'part'; part: string; role: ElementRole; terminals: string[] }
	| { kind: 'meter'; label: string };

export interface Element {
	/** Node indices; −1 is the reference. */
	a: number;
	b: number;
	/** Conductance in this scenario (S); 0 when open. */
	g: number;
	/** Conductance when healthy and closed (S), whatever the scenario. */
	gClosed: number;
	ref: ElementRef;
}

/**
 * A Norton source between nodes a (driven to the live side) and b: with `element` set it is
 * an EMF behind that element's conductance (J = emf · g), otherwise a fixed current J into a.
 */
export interface Source {
	a: number;
	b: number;
	emf?: number;
	element?: number;
	current?: number;
	ref: ElementRef;
}

export interface RelayDevice {
	part: string;
	coil: number;
	/** 30–87 (closes when energised) and 30–87a (opens). */
	normallyOpen: number;
	normallyClosed: number;
	pullIn: number;
	dropOut: number;
}

export interface StabilizerDevice {
	part: string;
	input: number;
	output: number;
	earth: number;
	/** The input–output element whose conductance the regulation sets. */
	element: number;
	setPoint: number;
	gMax: number;
}

export interface Circuit {
	doc: HarnessDocument;
	nodeNames: string[];
	/** Node names to indices, the reference at −1 (built on first use). */
	readonly nodeIndex: Map<string, number>;
	/** Name of the reference node (the main battery's earthed terminal, or the chassis). */
	reference: string;
	elements: Element[];
	sources: Source[];
	relays: RelayDevice[];
	stabilizers: StabilizerDevice[];
	gmin: number;
	/** +1 negative earth, −1 positive earth. */
	polarity: 1 | -1;
	/** Node of a part's terminal (−1 for the reference). */
	terminalNode(ref: TerminalRef): number;
	/** Node of a wire's end, on the wire side of its joint. */
	wireEndNode(wire: string, end: 'from' | 'to'): number;
}

export interface BuildOptions {
	/** Relays starting pulled in (solve() finds the real state; default none). */
	energised?: ReadonlySet<string>;
	/** Wire temperature (°C), default 20. */
	temperatureC?: number;
}

const wireEnd = (wire: string, end: 'from' | 'to') => `wire:${wire}:${end}`;

/** Build the flat circuit for a document in a scenario. */
export function buildCircuit(doc: HarnessDocument, scenario: Scenario, options: BuildOptions = {}): Circuit {
	const view = viewScenario(doc, scenario);
	const vehicle = doc.vehicle;
	const polarity = polaritySign(vehicle.earth);
	const battery = doc.parts.find((p) => p.kind === 'battery');
	const reference = battery ? nodeOfTerminal(battery, earthedTerminal(vehicle.earth)) : CHASSIS;

	// Nodes are numbered without string look-ups (big harnesses build in a millisecond or
	// two): each part's terminals in order (a splice is one node), the chassis, then two
	// ends per wire. The reference takes no number (−1); the numbers after it close up.
	const parts = new Map<string, Part>();
	const base = new Map<string, number>();
	const nodeNames: string[] = [];
	let raw = 0;
	let refRaw = -1;
	const earthedName = battery ? earthedTerminal(vehicle.earth) : '';
	for (const p of doc.parts) {
		parts.set(p.id, p);
		base.set(p.id, raw);
		if (p.kind === 'splice') {
			nodeNames.push(p.id);
			raw++;
		} else {
			for (const t of p.terminals) {
				if (battery && p.id === battery.id && t === earthedName) refRaw = raw;
				nodeNames.push(`${p.id}:${t}`);
				raw++;
			}
		}
	}
	const chassisRaw = raw++;
	nodeNames.push(CHASSIS);
	if (refRaw < 0) refRaw = chassisRaw;
	const wireBase = raw;
	const wireIndex = new Map<string, number>();
	doc.wires.forEach((w, i) => {
		wireIndex.set(w.id, i);
		nodeNames.push(wireEnd(w.id, 'from'), wireEnd(w.id, 'to'));
	});
	nodeNames.splice(refRaw, 1);
	const fromRaw = (r: number) => (r < refRaw ? r : r === refRaw ? -1 : r - 1);
	const rawOf = (p: Part, terminal: string) => base.get(p.id)! + (p.kind === 'splice' ? 0 : p.terminals.indexOf(terminal));
	const chassisNode = fromRaw(chassisRaw);
	let nodeIndexCache: Map<string, number> | null = null;
	const nodeIndexOf = () => {
		if (!nodeIndexCache) {
			nodeIndexCache = new Map(nodeNames.map((name, i) => [name, i]));
			nodeIndexCache.set(reference, -1);
		}
		return nodeIndexCache;
	};
	const terminalNode = (ref: TerminalRef) => {
		const part = parts.get(ref.part);
		if (!part || !part.terminals.includes(ref.terminal)) {
			throw new Error(`circuit: no terminal "${ref.terminal}" on part "${ref.part}"`);
		}
		return fromRaw(rawOf(part, ref.terminal));
	};
	const wireEndNode = (wire: string, end: 'from' | 'to') => {
		const i = wireIndex.get(wire);
		if (i === undefined) throw new Error(`circuit: no wire "${wire}"`);
		return fromRaw(wireBase + 2 * i + (end === 'to' ? 1 : 0));
	};

	const elements: Element[] = [];
	const sources: Source[] = [];
	const relays: RelayDevice[] = [];
	const stabilizers: StabilizerDevice[] = [];
	const add = (a: number, b: number, gClosed: number, closed: boolean, ref: ElementRef) => {
		elements.push({ a, b, gClosed, g: closed ? gClosed : 0, ref });
		return elements.length - 1;
	};

	// Per-part helpers, defined once (not per part) to keep building cheap on big harnesses.
	let part: Part = doc.parts[0];
	let off = false;
	const t = (name: string) => fromRaw(rawOf(part, name));
	const el = (a: string, b: string, ohms: number, role: ElementRole, closed = true) =>
		add(t(a), t(b), 1 / ohms, closed && !off, { kind: 'part', part: part.id, role, terminals: [a, b] });
	for (part of doc.parts) {
		off = view.partOff(part.id);
		switch (part.kind) {
			case 'battery': {
				const p = resolveParams('battery', part.params, vehicle);
				const e = el('+', '-', p.internalResistance, 'internal');
				const emf = view.engineRunning ? p.chargingVoltage : p.emf;
				sources.push({ a: t('+'), b: t('-'), emf: off ? 0 : emf, element: e, ref: elements[e].ref });
				break;
			}
			case 'generator': {
				const p = resolveParams('generator', part.params, vehicle);
				const e = el('D', 'E', p.armatureResistance, 'armature');
				if (view.engineRunning && !off) {
					// Drive D to the live side: positive on negative earth, negative on positive earth.
					const [a, b] = polarity > 0 ? [t('D'), t('E')] : [t('E'), t('D')];
					sources.push({ a, b, emf: p.outputVoltage, element: e, ref: elements[e].ref });
				}
				break;
			}
			case 'earth-point': {
				const chassis = chassisNode;
				add(t('stud'), chassis, 1 / part.params.resistance, !off, { kind: 'part', part: part.id, role: 'earth', terminals: ['stud'] });
				break;
			}
			case 'fuse':
				el('in', 'out', part.params.resistance, 'fuse', !part.params.blown);
				break;
			case 'switch': {
				const closed = view.position(part).closed;
				const seen = new Set<string>();
				for (const pos of part.params.positions) {
					for (const [a, b] of pos.closed) {
						const key = a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`;
						if (seen.has(key)) continue;
						seen.add(key);
						const on = closed.some(([x, y]) => (x === a && y === b) || (x === b && y === a));
						el(a, b, part.params.contactResistance, 'contact', on);
					}
				}
				break;
			}
			case 'relay': {
				const p = resolveParams('relay', part.params, vehicle);
				const on = options.energised?.has(part.id) ?? false;
				const coil = el('85', '86', p.coilResistance, 'coil');
				const no = el('30', '87', p.contactResistance, 'contact', on);
				const nc = el('30', '87a', p.contactResistance, 'contact', !on);
				relays.push({ part: part.id, coil, normallyOpen: no, normallyClosed: nc, pullIn: p.pullIn, dropOut: p.dropOut });
				break;
			}
			case 'lamp': {
				const p = resolveParams('lamp', part.params, vehicle);
				el('feed', 'earth', lampResistance(p.volts, p.watts), 'filament');
				break;
			}
			case 'gauge':
				el('feed', 'sender', part.params.resistance, 'winding');
				break;
			case 'sender':
				el('feed', 'earth', senderResistance(part.params, view.senderPosition(part)), 'track');
				break;
			case 'stabilizer': {
				const p = resolveParams('stabilizer', part.params, vehicle);
				// Starts with its contacts closed (input to output); solve() regulates it. The bimetal
				// heater sits behind the contacts (output to earth), so the output always has a load.
				const e = el('in', 'out', p.outputResistance, 'regulator');
				el('out', 'earth', p.heaterResistance, 'heater');
				stabilizers.push({ part: part.id, input: t('in'), output: t('out'), earth: t('earth'), element: e, setPoint: p.setPoint, gMax: 1 / p.outputResistance });
				break;
			}
			case 'resistor':
				el('1', '2', part.params.resistance, 'resistance');
				break;
			case 'motor':
				el('feed', 'earth', part.params.resistance, 'winding');
				break;
			case 'ignition-coil':
				el('15', '1', part.params.primaryResistance, 'winding');
				break;
			case 'connector':
				for (const [a, b] of part.params.pins) el(a, b, part.params.contactResistance, 'pin');
				break;
			case 'load': {
				const [a, b] = part.params.between ?? [part.terminals[0], part.terminals[1]];
				el(a, b, part.params.resistance, 'resistance');
				break;
			}
			case 'splice':
				break;
		}
	}

	const partNode = (ref: TerminalRef) => fromRaw(rawOf(parts.get(ref.part)!, ref.terminal));
	doc.wires.forEach((w, i) => {
		const from = fromRaw(wireBase + 2 * i);
		const to = fromRaw(wireBase + 2 * i + 1);
		const cut = view.wireOff(w.id);
		add(partNode(w.from), from, 1 / JOINT_RESISTANCE, !cut && !view.terminalOff(w.from), { kind: 'joint', wire: w.id, end: 'from' });
		const r = Math.max(MIN_WIRE_RESISTANCE, wireResistance({ size: w.size, lengthM: w.lengthM, temperatureC: options.temperatureC }));
		add(from, to, 1 / r, true, { kind: 'wire', wire: w.id });
		add(to, partNode(w.to), 1 / JOINT_RESISTANCE, !cut && !view.terminalOff(w.to), { kind: 'joint', wire: w.id, end: 'to' });
	});

	return {
		doc,
		nodeNames,
		get nodeIndex() {
			return nodeIndexOf();
		},
		reference,
		elements,
		sources,
		relays,
		stabilizers,
		gmin: GMIN,
		polarity,
		terminalNode,
		wireEndNode
	};
}

/** Add an element (a meter, a test lamp) to a built circuit; returns its index. */
export function addElement(circuit: Circuit, a: number, b: number, ohms: number, label: string): number {
	const g = 1 / ohms;
	circuit.elements.push({ a, b, g, gClosed: g, ref: { kind: 'meter', label } });
	return circuit.elements.length - 1;
}

/** Add a fixed current source driving `current` amperes into node a, out of node b. */
export function addCurrentSource(circuit: Circuit, a: number, b: number, current: number, label: string): void {
	circuit.sources.push({ a, b, current, ref: { kind: 'meter', label } });
}

/** Who an element belongs to, as one id: the part or the wire (joints belong to their wire). */
export function ownerOf(ref: ElementRef): string {
	if (ref.kind === 'part') return ref.part;
	if (ref.kind === 'meter') return `meter:${ref.label}`;
	return ref.wire;
}

/** A short human name for an element, e.g. "joint of wire w12 at its to end". */
export function describeElement(circuit: Circuit, index: number): string {
	const ref = circuit.elements[index].ref;
	const key = (id: string) => circuit.doc.parts.find((p: Part) => p.id === id)?.key ?? id;
	switch (ref.kind) {
		case 'wire':
			return `wire ${ref.wire}`;
		case 'joint':
			return `joint of wire ${ref.wire} at its ${ref.end} end`;
		case 'part':
			return `${ref.role} ${ref.terminals.join('–')} of part ${key(ref.part)}`;
		case 'meter':
			return ref.label;
	}
}
