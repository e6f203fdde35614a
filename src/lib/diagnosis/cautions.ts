/**
 * The cautions printed at the top of a probe checklist, and which of them a checklist needs.
 *
 * Every text is our own wording of common workshop practice (DESIGN.md "Safety"; TRADE.md):
 * lead-acid batteries give off hydrogen and can drive hundreds of amps through a short; resistance
 * is measured with the circuit unpowered; with breaker-point ignition the coil and points
 * overheat when the ignition is left on with the engine stopped; petrol vapour is heavier than
 * air and ignites from a spark; airbag igniters can be fired by a meter's own current. Each text
 * ends by pointing back to the manual, because Loomwright assists and does not replace it.
 *
 * The probe planner (src/lib/circuit/probes.ts) attaches caution ids to each probe (its CAUTIONS
 * hold the short words a probe card shows); the fuller texts here go by the same ids, so one
 * caution is printed once, numbered, and each step refers to it by number.
 */
import { CAUTIONS as PROBE_CAUTIONS } from '$lib/circuit/probes';

export const CAUTION_IDS = ['battery', 'coil', 'ohms', 'fuel', 'airbag', 'gauge', 'general'] as const;
export type CautionId = (typeof CAUTION_IDS)[number];

export interface CautionText {
	id: CautionId;
	/** A few words for the step's reference ("see caution 2: ignition coil"). */
	title: string;
	text: string;
}

export const CAUTION_TEXTS: Record<CautionId, CautionText> = {
	battery: {
		id: 'battery',
		title: 'Battery gases and short circuits',
		text:
			'A charging or recently charged battery gives off hydrogen, which explodes from a spark or flame: no smoking, sparks or flames near it, and keep air moving. ' +
			'Take off rings, watches and bracelets. A spanner, ring or probe lead across the posts (or from the live post to the body) carries hundreds of amps: it turns red hot in seconds, burns skin and can burst the battery. ' +
			'Use insulated tools, wear eye protection, and when disconnecting take the earth lead off first and refit it last.'
	},
	coil: {
		id: 'coil',
		title: 'Ignition left on (breaker-point coil)',
		text:
			'With breaker-point ignition, the ignition on and the engine stopped, current flows through the coil whenever the points are closed: the coil and points overheat and can be ruined. ' +
			'Switch the ignition off between steps, or disconnect the coil feed (the terminal 15 wire at the coil) while you work; reconnect it before taking a powered reading, because the expected readings assume the coil is connected.'
	},
	ohms: {
		id: 'ohms',
		title: 'Battery disconnected before ohms',
		text:
			'Before any ohms step: ignition off and the battery disconnected (earth lead off first). A meter on its ohms range across a live circuit gives false readings and can be damaged. ' +
			'Touch the leads together first and subtract what they read. Reconnect the battery (earth lead last) only when the steps that follow need power.'
	},
	fuel: {
		id: 'fuel',
		title: 'Fuel tank sender',
		text:
			'Petrol vapour is heavier than air, gathers low down and ignites from a spark. Work in the open or with strong ventilation, with no sparks, flames, smoking or bare-bulb lamps near the tank, and a suitable fire extinguisher at hand. ' +
			'Disconnect the battery before unplugging or refitting the sender wires, and never let a probe or lamp clip short the sender terminal to the tank.'
	},
	airbag: {
		id: 'airbag',
		title: 'Airbag circuits (later vehicles)',
		text:
			'Do not probe airbag (SRS) connectors, their wiring or the parts near them: a meter\u2019s own test current or a test lamp can fire an airbag, which injures at close range. ' +
			'Before working near them, follow the manual\u2019s disarming procedure (usually the battery disconnected and a stated waiting time), and leave the rest to a qualified technician.'
	},
	gauge: {
		id: 'gauge',
		title: 'Thermal gauges',
		text: PROBE_CAUTIONS.gauge
	},
	general: {
		id: 'general',
		title: 'This checklist assists; the manual decides',
		text:
			'Loomwright assists diagnosis from the diagram you drew; it does not replace the vehicle\u2019s manual, local codes and regulations, or a qualified technician. ' +
			'Where a step does not match your vehicle, or you are unsure it is safe, stop and check the manual or ask someone qualified.'
	}
};

/**
 * The earliest model year given the airbag caution. Driver airbags spread through the late
 * 1980s and 1990s (from memory); 1985 errs early, on the safe side.
 */
export const AIRBAG_FROM_YEAR = 1985;

/** A year written in the vehicle's year field ("1962", "c. 1988", "1990–94"): the first four digits, or null. */
export function vehicleYear(text: string): number | null {
	const m = /(1[89]\d\d|20\d\d)/.exec(text);
	return m ? Number(m[1]) : null;
}

/**
 * Whether a vehicle may have airbags: a year from AIRBAG_FROM_YEAR on, a year not stated (when
 * the age is unknown the caution is shown), or a part whose name speaks of an airbag or SRS.
 */
export function mayHaveAirbags(year: string, partNames: readonly string[]): boolean {
	if (partNames.some((n) => /\bairbags?\b|\bSRS\b|supplemental restraint/i.test(n))) return true;
	const y = vehicleYear(year);
	return y === null || y >= AIRBAG_FROM_YEAR;
}

export interface CautionNeeds {
	/** Some step is taken with the circuit powered. */
	powered: boolean;
	/** The diagram has an ignition coil (breaker-point ignition). */
	coil: boolean;
	/** Some step is an ohms reading. */
	ohms: boolean;
	/** Some step's probe goes on a part at the fuel tank. */
	fuelTank: boolean;
	airbags: boolean;
}

/**
 * The cautions a checklist prints, in order: battery always first (every checklist starts with
 * the battery in reach), then the ones the steps need, then any the planner gave that are not
 * covered, and the general note always last.
 */
export function requiredCautions(needs: CautionNeeds): CautionId[] {
	const out: CautionId[] = ['battery'];
	if (needs.powered && needs.coil) out.push('coil');
	if (needs.ohms) out.push('ohms');
	if (needs.fuelTank) out.push('fuel');
	if (needs.airbags) out.push('airbag');
	return out;
}
