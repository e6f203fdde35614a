/**
 * Meter models: what a DMM or a test lamp would show at a probe point.
 *
 * - Volts: the meter is a 10 MΩ resistor from the point to its black lead (TRADE.md: DMM
 *   input ≥ 10 MΩ). It barely loads the circuit, so a high-resistance joint can read full
 *   voltage on it.
 * - Volt drop: the meter across two points with the circuit working ("under load").
 * - Ohms: the battery (and a running generator) disconnected, a 1 mA test current from the
 *   meter (TRADE.md, from memory), R = V / I; "OL" above the range.
 * - Test lamp: a bulb of a few watts, hot resistance V²/P, from the point to earth; brightness
 *   is the power it gets over its rated power. It loads the circuit and shows a drop.
 */
import { CHASSIS } from './nets';
import { addCurrentSource, addElement, buildCircuit, type Circuit } from './circuit';
import { lampResistance } from './parts';
import { ENTRY_DMM, setupScenario } from './meter';
import type { Scenario } from './scenario';
import type { HarnessDocument, TerminalRef } from './schema';
import { solveCircuit, type Solution } from './solve';

/** Where a probe goes: a part's terminal, a wire's end (behind its joint), the chassis, or the battery's earthed post. */
export type ProbePoint = TerminalRef | { wire: string; end: 'from' | 'to' } | 'chassis' | 'earth';


/** The node a probe point touches. */
export function probeNode(c: Circuit, p: ProbePoint): number {
	if (p === 'earth') return -1;
	if (p === 'chassis') return c.nodeIndex.get('chassis')!;
	if ('wire' in p) return c.wireEndNode(p.wire, p.end);
	return c.terminalNode(p);
}

const volt = (s: Solution, node: number) => s.at(node);

/**
 * Nodes a regulating stabilizer's output feeds, each with how much of the output's swing it
 * shows: V(node)/V(output) against the battery's earthed post. The contacts open and close
 * several times a second (TRADE.md), so a DMM fluctuates there — on the output itself, along its
 * wires and contacts, and in proportion beyond a load (a gauge's sender terminal is a divider of
 * the output). The walk goes downhill only (toward earth, as the output's current does), stops at
 * the chassis and the stabilizer's own earth, which every circuit shares, and never crosses the
 * stabilizer's own contacts or heater back to its input.
 */
export function pulsingNodes(s: Solution): Map<number, number> {
	const c = s.circuit;
	const out = new Map<number, number>();
	const chassis = c.nodeIndex.get(CHASSIS) ?? -1;
	const own = new Set(c.stabilizers.map((st) => st.part));
	const adj = new Map<number, number[]>();
	c.elements.forEach((e, k) => {
		if (s.g[k] === 0 || e.a < 0 || e.b < 0) return;
		if (e.ref.kind === 'part' && own.has(e.ref.part)) return;
		(adj.get(e.a) ?? adj.set(e.a, []).get(e.a)!).push(e.b);
		(adj.get(e.b) ?? adj.set(e.b, []).get(e.b)!).push(e.a);
	});
	const earthSide = new Set<number>([chassis]);
	for (const st of c.stabilizers) earthSide.add(st.earth);
	for (const st of c.stabilizers) {
		const vOut = s.at(st.output);
		if (!s.regulating.get(st.part) || Math.abs(vOut) < 1e-9) continue;
		const stack = [st.output];
		out.set(st.output, 1);
		while (stack.length) {
			const v = stack.pop()!;
			for (const w of adj.get(v) ?? [])
				// Downhill only: the output's current flows toward earth, never up through another load.
				if (!out.has(w) && !earthSide.has(w) && Math.abs(s.at(w)) <= Math.abs(s.at(v)) + 1e-9) {
					out.set(w, Math.max(0, Math.min(1, s.at(w) / vOut)));
					stack.push(w);
				}
		}
	}
	return out;
}

/** Below this share of the output's swing a DMM holds steady enough to read (invented). */
export const PULSING_SHOWN = 0.05;

export interface VoltsReading {
	volts: number;
	/** The reading sits on a pulsing stabilizer output: a DMM fluctuates around this average. */
	pulsing: boolean;
	converged: boolean;
}

/** DC volts at a point against the black lead (default: the battery's earthed post). */
export function measureVolts(
	doc: HarnessDocument,
	scenario: Scenario,
	point: ProbePoint,
	{ black = 'earth', inputOhms = ENTRY_DMM.inputOhms }: { black?: ProbePoint; inputOhms?: number } = {}
): VoltsReading {
	const c = buildCircuit(doc, scenario);
	const a = probeNode(c, point);
	const b = probeNode(c, black);
	addElement(c, a, b, inputOhms, 'voltmeter');
	const s = solveCircuit(c);
	return { volts: volt(s, a) - volt(s, b), pulsing: (pulsingNodes(s).get(a) ?? 0) > PULSING_SHOWN, converged: s.converged };
}

/** Volt drop from a to b with the circuit working (the meter across the two points). */
export function measureDrop(doc: HarnessDocument, scenario: Scenario, a: ProbePoint, b: ProbePoint): VoltsReading {
	return measureVolts(doc, scenario, a, { black: b });
}

export interface OhmsReading {
	/** Resistance (Ω); Infinity when over the range. */
	ohms: number;
	overLimit: boolean;
}

/** Resistance between two points with the battery disconnected (and the engine stopped). */
export function measureOhms(
	doc: HarnessDocument,
	scenario: Scenario,
	a: ProbePoint,
	b: ProbePoint = 'chassis',
	{ testCurrent = ENTRY_DMM.ohms.testCurrent, maxOhms = ENTRY_DMM.ohms.overLimit }: { testCurrent?: number; maxOhms?: number } = {}
): OhmsReading {
	const c = buildCircuit(doc, setupScenario(doc, scenario, 'power-off'));
	const na = probeNode(c, a);
	const nb = probeNode(c, b);
	addCurrentSource(c, na, nb, testCurrent, 'ohmmeter');
	const s = solveCircuit(c);
	const ohms = (volt(s, na) - volt(s, nb)) / testCurrent;
	return ohms > maxOhms ? { ohms: Infinity, overLimit: true } : { ohms, overLimit: false };
}

export interface LampReading {
	/** Current through the test lamp (A, magnitude). */
	current: number;
	/** Voltage across it (V, magnitude). */
	volts: number;
	/** Power in its filament (W). */
	power: number;
	/** Power over rated power: 1 = full brightness, about 0 = dark. */
	brightness: number;
}

/** A test lamp from a point to earth (default the battery's earthed post). */
export function testLamp(
	doc: HarnessDocument,
	scenario: Scenario,
	point: ProbePoint,
	{ watts = ENTRY_DMM.lamp.watts, volts, to = 'earth' }: { watts?: number; volts?: number; to?: ProbePoint } = {}
): LampReading {
	const rated = volts ?? doc.vehicle.systemVoltage;
	const ohms = lampResistance(rated, watts);
	const c = buildCircuit(doc, scenario);
	const a = probeNode(c, point);
	const b = probeNode(c, to);
	addElement(c, a, b, ohms, 'test lamp');
	const s = solveCircuit(c);
	const v = Math.abs(volt(s, a) - volt(s, b));
	const power = (v * v) / ohms;
	return { current: v / ohms, volts: v, power, brightness: power / watts };
}
