/**
 * Part kinds: their terminals, their electrical parameters with units and defaults,
 * and how each default was chosen.
 *
 * Terminal names follow DIN 72552 where a part of the kind carries those numbers
 * (relay 30/85/86/87/87a, ignition coil 15/1); otherwise they are plain words.
 *
 * Where a default is marked "invented", it is a plausible round figure of our own,
 * meant to be overwritten with the vehicle's own value. "Common practice" marks a trade
 * figure with no primary source; "from memory" marks a recalled value (see TRADE.md).
 */
import { z } from 'zod';

export const SYSTEM_VOLTAGES = [6, 12, 24] as const;
export type SystemVoltage = (typeof SYSTEM_VOLTAGES)[number];

export const EARTH_POLARITIES = ['negative', 'positive'] as const;
export type EarthPolarity = (typeof EARTH_POLARITIES)[number];

/** Reach zones, used later to cost a probe (how hard the place is to get at). */
export const LOCATIONS = [
	'engine-bay',
	'front',
	'dash',
	'cabin',
	'boot',
	'rear',
	'fuel-tank',
	'chassis'
] as const;
export type Location = (typeof LOCATIONS)[number];

export const PART_KINDS = [
	'battery',
	'earth-point',
	'fuse',
	'switch',
	'relay',
	'lamp',
	'gauge',
	'sender',
	'stabilizer',
	'resistor',
	'motor',
	'ignition-coil',
	'connector',
	'splice',
	'generator',
	'load'
] as const;
export type PartKind = (typeof PART_KINDS)[number];

const ohms = (d: number) => z.number().positive().default(d);
const volts = () => z.number().positive().optional();
const pair = z.tuple([z.string().min(1), z.string().min(1)]);

/** Parameter schemas per kind. Optional voltages default from the system voltage (see `resolveParams`). */
export const PARAM_SCHEMAS = {
	battery: z.object({
		/** Open-circuit voltage (V). Default 2.1 V per cell: 12.6 V on 12 V (common practice; BCI rest table in TRADE.md). */
		emf: volts(),
		/** Internal resistance (Ω). Invented default for a healthy battery. */
		internalResistance: ohms(0.02),
		/** Terminal voltage held by the charging system when the engine runs (V). Default 14.2 V on 12 V (common practice: 13.5–14.5 V). */
		chargingVoltage: volts()
	}),
	'earth-point': z.object({
		/** Resistance from the stud to the chassis (Ω). Invented default for a clean, tight earth. */
		resistance: ohms(0.005)
	}),
	fuse: z.object({
		/** Rating (A). Invented default. */
		rating: z.number().positive().default(10),
		/** Cold resistance of the element and its caps (Ω). Invented default. */
		resistance: ohms(0.005),
		blown: z.boolean().default(false)
	}),
	switch: z.object({
		/** What the switch does, so a scenario can pick sensible positions (ignition on, lights off). */
		role: z.enum(['ignition', 'lighting', 'other']).default('other'),
		/** Named positions, each the set of terminal pairs its contacts join. */
		positions: z
			.array(z.object({ name: z.string().min(1), closed: z.array(pair).default([]) }))
			.min(1),
		/** Position used by the default scenario; otherwise chosen by role. */
		defaultPosition: z.string().optional(),
		/** Resistance of one closed contact (Ω). Invented default (a good switch drops well under 0.3 V; TRADE.md). */
		contactResistance: ohms(0.01)
	}),
	relay: z.object({
		/** Coil resistance between 85 and 86 (Ω). From memory: 12 V automotive relays are about 70–90 Ω. */
		coilResistance: ohms(80),
		/** Coil voltage at which the armature pulls in (V). Default 0.6 × system voltage (from memory: about 7–8 V on 12 V). */
		pullIn: volts(),
		/** Coil voltage below which a pulled-in armature drops out (V). Default 0.25 × system voltage (invented). */
		dropOut: volts(),
		/** Resistance of the closed contact 30–87 or 30–87a (Ω). Invented default. */
		contactResistance: ohms(0.01)
	}),
	lamp: z.object({
		/** Rated voltage (V). Default: the system voltage. */
		volts: volts(),
		/** Rated power (W). Invented default. Hot resistance is V²/P. */
		watts: z.number().positive().default(5)
	}),
	gauge: z.object({
		/** Heater or coil resistance (Ω). 58 Ω: one enthusiast measurement of a thermal gauge heater (TRADE.md). */
		resistance: ohms(58),
		/** Current that drives the needle to full scale (A). Invented default, near 10 V over 58 Ω + a full sender. */
		fullScaleCurrent: z.number().positive().default(0.13)
	}),
	sender: z.object({
		/** Resistance at position 0 (empty or cold) (Ω). 145 Ω: enthusiast measurement of a fuel sender near empty (TRADE.md). */
		ohmsAt0: ohms(145),
		/** Resistance at position 1 (full or hot) (Ω). 21 Ω: the same measurement near full (TRADE.md). */
		ohmsAt1: ohms(21),
		/** How resistance moves between the ends: linear (float rheostat) or logarithmic (NTC thermistor). */
		taper: z.enum(['linear', 'logarithmic']).default('linear'),
		/** Position 0..1 when the scenario does not say. */
		position: z.number().min(0).max(1).default(0.5)
	}),
	stabilizer: z.object({
		/** Average output voltage while regulating (V). Default 10 V on 12 V, scaled (common practice; TRADE.md). */
		setPoint: volts(),
		/** Resistance from input to output with the contacts closed (Ω). Invented default. */
		outputResistance: ohms(0.2),
		/** Bimetal heater, behind the contacts: output to earth (Ω). Invented default. */
		heaterResistance: ohms(40)
	}),
	resistor: z.object({
		/** Resistance (Ω). Default 1.5 Ω, a coil ballast resistor (from memory). */
		resistance: ohms(1.5)
	}),
	motor: z.object({
		/** Running-equivalent resistance (Ω): rated volts over running current. Invented default (3 A at 12 V). */
		resistance: ohms(4)
	}),
	'ignition-coil': z.object({
		/** Primary winding resistance 15–1 (Ω). Common practice, from memory: 3–4 Ω for a 12 V breaker-point coil. */
		primaryResistance: ohms(3)
	}),
	connector: z.object({
		/** Pin pairs: each joins a terminal on one half with one on the other. */
		pins: z.array(pair).default([]),
		/** Resistance of one mated pin pair (Ω). Invented default. */
		contactResistance: ohms(0.005)
	}),
	splice: z.object({}),
	generator: z.object({
		/** Armature resistance D–E (Ω). Invented default. */
		armatureResistance: ohms(0.5),
		/** Output voltage when the engine runs (V). Default: the battery's charging voltage (common practice). */
		outputVoltage: volts()
	}),
	load: z.object({
		/** Resistance (Ω). Invented default. */
		resistance: ohms(100),
		/** The two terminals it sits between; default the first two. */
		between: pair.optional()
	})
} as const satisfies Record<PartKind, z.ZodType>;

export type ParamsOf<K extends PartKind> = z.output<(typeof PARAM_SCHEMAS)[K]>;

/** Fixed terminals per kind; `null` means the user names them. */
export const FIXED_TERMINALS: Record<PartKind, readonly string[] | null> = {
	battery: ['+', '-'],
	'earth-point': ['stud'],
	fuse: ['in', 'out'],
	switch: null,
	relay: ['85', '86', '30', '87', '87a'],
	lamp: ['feed', 'earth'],
	gauge: ['feed', 'sender'],
	sender: ['feed', 'earth'],
	stabilizer: ['in', 'out', 'earth'],
	resistor: ['1', '2'],
	motor: ['feed', 'earth'],
	'ignition-coil': ['15', '1'],
	connector: null,
	splice: null,
	generator: ['D', 'E'],
	load: null
};

/** Terminals used when a user-named kind is created without any. */
export const DEFAULT_TERMINALS: Record<PartKind, readonly string[]> = {
	...(FIXED_TERMINALS as Record<PartKind, readonly string[]>),
	switch: ['1', '2'],
	connector: ['A1', 'B1'],
	splice: ['1', '2', '3'],
	load: ['1', '2']
};

/**
 * Kinds a feed or an earth may run through (they pass current on rather than use it).
 * A relay passes current through its contacts only; a stabilizer from input to output.
 */
export const PASS_THROUGH_KINDS: ReadonlySet<PartKind> = new Set([
	'earth-point',
	'fuse',
	'switch',
	'relay',
	'connector',
	'splice',
	'stabilizer'
]);

/** Properties of a kind that meters and planners need to know. */
export const KIND_TRAITS: Partial<Record<PartKind, { pulsing?: boolean; source?: boolean }>> = {
	// A bimetal stabilizer's output is a square wave; a DMM on it fluctuates (TRADE.md).
	stabilizer: { pulsing: true },
	battery: { source: true },
	generator: { source: true }
};

/** Battery rest voltage: 2.1 V per lead-acid cell (common practice). */
export function restVoltage(system: SystemVoltage): number {
	return (system / 2) * 2.1;
}

/** Charging voltage: 14.2 V per 12 V (common practice: 13.5–14.5 V at the battery). */
export function chargingVoltage(system: SystemVoltage): number {
	return (system / 12) * 14.2;
}

/** Stabilizer set-point: 10 V per 12 V, scaled (common practice). */
export function stabilizerSetPoint(system: SystemVoltage): number {
	return (system / 12) * 10;
}

export interface VehicleFacts {
	systemVoltage: SystemVoltage;
	earth: EarthPolarity;
}

type Resolved = {
	[K in PartKind]: Required<Omit<ParamsOf<K>, 'defaultPosition' | 'between'>> &
		Pick<ParamsOf<K>, Extract<keyof ParamsOf<K>, 'defaultPosition' | 'between'>>;
};

/** Parameters with the voltage-dependent defaults filled from the vehicle. */
export function resolveParams<K extends PartKind>(
	kind: K,
	params: ParamsOf<K>,
	vehicle: VehicleFacts
): Resolved[K] {
	const v = vehicle.systemVoltage;
	const p = params as Record<string, unknown>;
	switch (kind) {
		case 'battery':
			return {
				...p,
				emf: p.emf ?? restVoltage(v),
				chargingVoltage: p.chargingVoltage ?? chargingVoltage(v)
			} as unknown as Resolved[K];
		case 'relay':
			return {
				...p,
				pullIn: p.pullIn ?? 0.6 * v,
				dropOut: p.dropOut ?? 0.25 * v
			} as unknown as Resolved[K];
		case 'lamp':
			return { ...p, volts: p.volts ?? v } as unknown as Resolved[K];
		case 'stabilizer':
			return { ...p, setPoint: p.setPoint ?? stabilizerSetPoint(v) } as unknown as Resolved[K];
		case 'generator':
			return { ...p, outputVoltage: p.outputVoltage ?? chargingVoltage(v) } as unknown as Resolved[K];
		default:
			return p as unknown as Resolved[K];
	}
}

/** Hot resistance of an incandescent lamp: R = V²/P (Ohm's law with P = V·I). */
export function lampResistance(volts: number, watts: number): number {
	return (volts * volts) / watts;
}

/**
 * Sender resistance at a position 0..1. Linear for a float rheostat; logarithmic
 * (geometric interpolation) approximates an NTC thermistor, whose resistance falls
 * roughly exponentially with temperature.
 */
export function senderResistance(
	p: { ohmsAt0: number; ohmsAt1: number; taper: 'linear' | 'logarithmic' },
	position: number
): number {
	const x = Math.min(1, Math.max(0, position));
	if (p.taper === 'logarithmic') return p.ohmsAt0 * Math.pow(p.ohmsAt1 / p.ohmsAt0, x);
	return p.ohmsAt0 + (p.ohmsAt1 - p.ohmsAt0) * x;
}

/** Which battery terminal is earthed for a polarity. */
export function earthedTerminal(earth: EarthPolarity): '+' | '-' {
	return earth === 'negative' ? '-' : '+';
}

/** The battery's live (non-earthed) terminal. */
export function liveTerminal(earth: EarthPolarity): '+' | '-' {
	return earth === 'negative' ? '+' : '-';
}

/** +1 on negative earth (feeds read positive), −1 on positive earth (feeds read negative). */
export function polaritySign(earth: EarthPolarity): 1 | -1 {
	return earth === 'negative' ? 1 : -1;
}
