// What a DMM and a test lamp would show at a terminal in a scenario, in words, computed in the
// browser by the circuit core (src/lib/circuit/meters.ts).
import { measureVolts, testLamp, type LampReading, type VoltsReading } from '$lib/circuit/meters';
import { ENTRY_DMM } from '$lib/circuit/meter';
import { earthedTerminal } from '$lib/circuit/parts';
import type { Scenario } from '$lib/circuit/scenario';
import type { HarnessDocument, Part, TerminalRef } from '$lib/circuit/schema';
import { senderResistance } from '$lib/circuit/parts';

export interface TerminalReading {
	ref: TerminalRef;
	volts: VoltsReading;
	lamp: LampReading;
	/** "-10.03 V", as a DMM on its 20 V DC range shows it. */
	voltsText: string;
	/** "dim (70 % of full brightness)". */
	lampText: string;
	/** Above rated power, the percentage the words leave out: "109 % of the bulb’s rated power". */
	lampDetail: string | null;
	/** Where the black lead goes, in words. */
	blackLead: string;
}

/** Volts as a 20 V-range DMM shows them: two decimals and the sign (feeds read negative on positive earth). */
export function formatVolts(v: number): string {
	const r = Math.round(v * 100) / 100;
	return `${r === 0 ? '0.00' : r.toFixed(2)} V`;
}

/**
 * A test lamp's brightness in words; the bands are our own (about a third of rated power looks
 * dim). Above its rated power (a charged battery above the bulb's rated voltage) a lamp looks no
 * brighter than full to the eye, so the words say so; the number stays in brightnessDetail.
 */
export function brightnessWords(brightness: number): string {
	const pct = Math.round(brightness * 100);
	if (pct > 100) return 'full brightness (bulb above its rated voltage)';
	const word = brightness >= 0.8 ? 'full' : brightness >= 0.3 ? 'dim' : brightness >= 0.02 ? 'very dim' : 'dark';
	return word === 'dark' ? 'dark (no glow)' : `${word} (${pct} % of full brightness)`;
}

/** The number behind the words: "109 % of the bulb's rated power", or null when the words already give it. */
export function brightnessDetail(brightness: number): string | null {
	const pct = Math.round(brightness * 100);
	return pct > 100 ? `${pct} % of the bulb\u2019s rated power` : null;
}

/** The entry-level DMM (black lead on the battery's earthed post) and its test lamp at one terminal. */
export function terminalReading(doc: HarnessDocument, scenario: Scenario, ref: TerminalRef): TerminalReading {
	const volts = measureVolts(doc, scenario, ref);
	const lamp = testLamp(doc, scenario, ref, { watts: ENTRY_DMM.lamp.watts });
	const post = earthedTerminal(doc.vehicle.earth);
	return {
		ref,
		volts,
		lamp,
		voltsText: formatVolts(volts.volts),
		lampText: brightnessWords(lamp.brightness),
		lampDetail: brightnessDetail(lamp.brightness),
		blackLead: `black lead on the battery's earthed post (${post}, ${doc.vehicle.earth} earth)`
	};
}

/** A sender's resistance at a position, for the slider's label. */
export function senderOhms(part: Extract<Part, { kind: 'sender' }>, position: number): number {
	return senderResistance(part.params, position);
}
