/**
 * What a restorer cannot know exactly, as ranges, and the "worlds" a diagnosis computes its
 * reading bands from (diagnose.ts, bands.ts).
 *
 * Defaults (TRADE.md, "Tolerances for the uncertainty model"; each a setting):
 * - battery EMF at rest 11.9–12.8 V per 12 V (BCI rest table, 11.89 V discharged to 12.65 V full,
 *   plus a surface charge after driving); running 13.5–14.5 V per 12 V (alternator practice); or
 *   the value measured at the posts once taken;
 * - incandescent lamp wattage and gauge heater, coil and load resistances ±10 % (from memory);
 * - wire lengths drawn from a manual ±50 % unless marked measured, on the drawing (a wire's
 *   `lengthMeasured`) or for one diagnosis (`measuredWires`) (our default);
 * - senders: anywhere on their travel unless the restorer says the position is known;
 * - a healthy stabilizer's average 9.5–10.5 V per 12 V (enthusiast pages).
 *
 * A world moves one group of these to one end of its range and leaves the rest nominal. The
 * members of a group move together (every lamp and load drawing more at once): a reading's deviation is then the sum of
 * the groups' deviations to first order, which bands.ts adds up with a margin.
 */
import { z } from 'zod';
import { resolveParams } from './parts';
import type { Scenario } from './scenario';
import type { HarnessDocument, Part } from './schema';

const range = z.object({ low: z.number(), high: z.number() }).refine((r) => r.low <= r.high, 'low must not be above high');

export const UncertaintySchema = z.object({
	/** Battery EMF (V) range; default by engine state, scaled to the system voltage. */
	battery: range.optional(),
	/** Relative tolerance on lamp wattage. */
	lampWatts: z.number().min(0).max(0.9).default(0.1),
	/** Relative tolerance on gauge heaters, relay coils, motors, loads and resistors. */
	partResistance: z.number().min(0).max(0.9).default(0.1),
	/** Relative tolerance on wire lengths not marked measured. */
	wireLength: z.number().min(0).max(0.9).default(0.5),
	/** Wires whose length was measured: held at their drawn length. */
	measuredWires: z.array(z.string()).default([]),
	/** Senders whose position the restorer knows (the scenario's value is taken as it is). */
	knownSenders: z.array(z.string()).default([]),
	/** A healthy stabilizer's average output (V) per 12 V. */
	stabilizer: range.default({ low: 9.5, high: 10.5 })
});
export type Uncertainty = z.output<typeof UncertaintySchema>;
export type UncertaintyInput = z.input<typeof UncertaintySchema>;

export const REST_EMF_PER_12 = { low: 11.9, high: 12.8 } as const;
export const RUNNING_EMF_PER_12 = { low: 13.5, high: 14.5 } as const;
/** Below this at rest (per 12 V) the battery should be charged before diagnosing (common practice, TRADE.md). */
export const CHARGE_BELOW_PER_12 = 12.0;

export function uncertaintyOf(input?: UncertaintyInput): Uncertainty {
	return UncertaintySchema.parse(input ?? {});
}

/** The main battery: the part, the EMF the model assumes, and the range it may really have. */
export function batteryRange(doc: HarnessDocument, scenario: Scenario, u: Uncertainty): { part: Part; nominal: number; low: number; high: number } | null {
	const part = doc.parts.find((p) => p.kind === 'battery');
	if (!part || part.kind !== 'battery') return null;
	const p = resolveParams('battery', part.params, doc.vehicle);
	const nominal = scenario.engineRunning ? p.chargingVoltage : p.emf;
	const scale = doc.vehicle.systemVoltage / 12;
	const r = u.battery ?? (scenario.engineRunning ? RUNNING_EMF_PER_12 : REST_EMF_PER_12);
	const low = u.battery ? r.low : r.low * scale;
	const high = u.battery ? r.high : r.high * scale;
	return { part, nominal, low: Math.min(low, nominal), high: Math.max(high, nominal) };
}

/** The document and scenario with the main battery's EMF at `volts`. */
export function withBattery(doc: HarnessDocument, scenario: Scenario, volts: number): HarnessDocument {
	const key = scenario.engineRunning ? 'chargingVoltage' : 'emf';
	let done = false;
	return {
		...doc,
		parts: doc.parts.map((p) => {
			if (done || p.kind !== 'battery') return p;
			done = true;
			return { ...p, params: { ...p.params, [key]: volts } } as Part;
		})
	};
}

/** Wires held at their drawn length: marked measured on the drawing (`lengthMeasured`) or named in `u.measuredWires`. */
export function measuredWires(doc: HarnessDocument, u: Pick<Uncertainty, 'measuredWires'>): Set<string> {
	const measured = new Set(u.measuredWires);
	for (const w of doc.wires) if (w.lengthMeasured) measured.add(w.id);
	return measured;
}

/** Most a battery range may say, per volt of the system: a charging 12 V system holds about 14.5 V (TRADE.md); twice is far past any. */
const BATTERY_MOST_PER_VOLT = 2;

/**
 * Checks an uncertainty against the document it is for: every problem with its path (relative to
 * the uncertainty). Known senders must be senders, measured wires wires, and the ranges volts a
 * battery or stabilizer of this system could show.
 */
export function checkUncertainty(doc: HarnessDocument, u: Uncertainty): { path: string; message: string }[] {
	const issues: { path: string; message: string }[] = [];
	const system = doc.vehicle.systemVoltage;
	if (u.battery) {
		if (u.battery.low <= 0) issues.push({ path: 'battery.low', message: 'a battery range starts above 0 V' });
		if (u.battery.high > system * BATTERY_MOST_PER_VOLT) issues.push({ path: 'battery.high', message: `${u.battery.high} V is far above what a ${system} V battery shows (at most ${system * BATTERY_MOST_PER_VOLT} V)` });
	}
	if (u.stabilizer.low <= 0) issues.push({ path: 'stabilizer.low', message: 'a stabilizer range starts above 0 V' });
	if (u.stabilizer.high > 12) issues.push({ path: 'stabilizer.high', message: 'a stabilizer cannot give more than its input: at most 12 V per 12 V' });
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	u.knownSenders.forEach((id, i) => {
		if (parts.get(id)?.kind !== 'sender') issues.push({ path: `knownSenders[${i}]`, message: `"${id}" is not a sender of this diagram` });
	});
	const wires = new Set(doc.wires.map((w) => w.id));
	u.measuredWires.forEach((id, i) => {
		if (!wires.has(id)) issues.push({ path: `measuredWires[${i}]`, message: `"${id}" is not a wire of this diagram` });
	});
	return issues;
}

export interface World {
	/** The group moved and its end, e.g. `lamps:low`. */
	id: string;
	doc: HarnessDocument;
	scenario: Scenario;
}

/** One world per group and end, battery aside (bands.ts treats the battery on its own); senders only those `within` the region. */
export function factorWorlds(doc: HarnessDocument, scenario: Scenario, u: Uncertainty, within?: { parts: ReadonlySet<string> }): World[] {
	const worlds: World[] = [];
	const scale = doc.vehicle.systemVoltage / 12;
	const mapParts = (f: (p: Part) => Part | null): HarnessDocument | null => {
		let changed = false;
		const parts = doc.parts.map((p) => {
			const q = f(p);
			if (q) changed = true;
			return q ?? p;
		});
		return changed ? { ...doc, parts } : null;
	};
	const resistanceKey: Partial<Record<Part['kind'], string>> = {
		gauge: 'resistance',
		relay: 'coilResistance',
		motor: 'resistance',
		load: 'resistance',
		resistor: 'resistance',
		'ignition-coil': 'primaryResistance'
	};
	for (const [end, sign] of [
		['low', -1],
		['high', 1]
	] as const) {
		// Lamps and other loads move together, all drawing more (or less) at once: through the feeds
		// they share, that is the direction that moves a reading most.
		if (u.lampWatts > 0 || u.partResistance > 0) {
			const d = mapParts((p) => {
				if (p.kind === 'lamp') return { ...p, params: { ...p.params, watts: resolveParams('lamp', p.params, doc.vehicle).watts * (1 + sign * u.lampWatts) } } as Part;
				const key = resistanceKey[p.kind];
				if (!key) return null;
				const params = resolveParams(p.kind, p.params as never, doc.vehicle) as Record<string, number>;
				return { ...p, params: { ...p.params, [key]: params[key] / (1 + sign * u.partResistance) } } as Part;
			});
			if (d) worlds.push({ id: `loads:${end}`, doc: d, scenario });
		}
		if (u.wireLength > 0) {
			const measured = measuredWires(doc, u);
			if (doc.wires.some((w) => !measured.has(w.id)))
				worlds.push({ id: `wires:${end}`, doc: { ...doc, wires: doc.wires.map((w) => (measured.has(w.id) ? w : { ...w, lengthM: w.lengthM * (1 + sign * u.wireLength) })) }, scenario });
		}
		const setPoint = (sign < 0 ? u.stabilizer.low : u.stabilizer.high) * scale;
		const d = mapParts((p) => (p.kind === 'stabilizer' ? ({ ...p, params: { ...p.params, setPoint } } as Part) : null));
		if (d) worlds.push({ id: `stabilizer:${end}`, doc: d, scenario });
	}
	const known = new Set(u.knownSenders);
	for (const p of doc.parts) {
		// A sender outside the region feeds nothing the diagnosis reads.
		if (p.kind !== 'sender' || known.has(p.id) || (within && !within.parts.has(p.id))) continue;
		for (const at of [0, 1]) worlds.push({ id: `sender:${p.id}:${at}`, doc, scenario: { ...scenario, senders: { ...scenario.senders, [p.id]: at } } });
	}
	return worlds;
}
