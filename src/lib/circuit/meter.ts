/**
 * The meter: one home for what the restorer's instruments are and what they show.
 *
 * - Profiles: what a meter and test lamp resolve, for telling suspects apart. Accuracy is
 *   ±(% of reading + counts) (TRADE.md, "Meters"); the planner widens it by a band for a
 *   reading that fluctuates on a pulsing stabilizer output.
 * - Setups: the harness as found, with the battery off (ohms), or with a part taken out.
 * - The meter put across two points (`meterFor`, for the solver) and what it shows for a raw
 *   solved value (`tableReading`: volts, brightness in %, ohms; `shownReading` adds "OL").
 *
 * Probes (probes.ts), the diagnosis (diagnose.ts), what-if readings, the trace panel and the API
 * all take their meter from here.
 */
import { z } from 'zod';
import type { ProbePoint } from './meters';
import { lampResistance } from './parts';
import type { Meter } from './predict';
import type { Scenario } from './scenario';
import type { HarnessDocument } from './schema';

export const MeterProfileSchema = z.object({
	id: z.string().min(1).max(40),
	label: z.string().max(120).default(''),
	/** DC volts input resistance (Ω). */
	inputOhms: z.number().positive(),
	/** DC volts accuracy on the 20 V range: ±(rel·reading + abs). */
	volts: z.object({ abs: z.number().nonnegative(), rel: z.number().nonnegative() }),
	/** Half-width of the swing shown on a pulsing stabilizer output (V). */
	pulsingBand: z.number().nonnegative(),
	/** Ohms accuracy (with the test leads), test current and top of range. */
	ohms: z.object({ abs: z.number().nonnegative(), rel: z.number().nonnegative(), testCurrent: z.number().positive(), overLimit: z.number().positive() }),
	/** Test lamp bulb and how finely a person judges its brightness (percentage points, and relative). */
	lamp: z.object({ watts: z.number().positive(), abs: z.number().nonnegative(), rel: z.number().nonnegative() })
});
export type MeterProfile = z.output<typeof MeterProfileSchema>;

/**
 * An entry-level 3½-digit DMM and a 5 W test lamp.
 * - 10 MΩ input: the usual requirement in makers' service information (TRADE.md).
 * - ±(0.5 % + 2 counts) on 20 V, 10 mV a count: from memory (TRADE.md), so 0.02 V + 0.5 %.
 * - Pulsing band ±1 V: invented (the output is a square wave averaged by the meter; TRADE.md
 *   says only that the reading fluctuates).
 * - Ohms ±(1 % + 3 counts) of 0.1 Ω plus about 0.2 Ω of leads: from memory; 1 mA test
 *   current: from memory (TRADE.md); 40 MΩ top of range: as meters.ts.
 * - Test lamp 5 W: TRADE.md says 2–5 W, not confirmed. Brightness judged by eye to about
 *   ±10 points and ±30 %: invented (a person tells bright, dim and dark apart, not shades).
 */
export const ENTRY_DMM: MeterProfile = {
	id: 'entry-dmm',
	label: 'Entry-level digital multimeter and a 5 W test lamp',
	inputOhms: 10e6,
	volts: { abs: 0.02, rel: 0.005 },
	pulsingBand: 1,
	ohms: { abs: 0.5, rel: 0.01, testCurrent: 1e-3, overLimit: 40e6 },
	lamp: { watts: 5, abs: 10, rel: 0.3 }
};

/** A cheap DMM with 1 MΩ input ("cheap meters may have 1 MΩ", TRADE.md); otherwise as the entry-level one. */
export const CHEAP_DMM: MeterProfile = { ...ENTRY_DMM, id: 'cheap-dmm', label: 'Cheap digital multimeter (1 MΩ input)', inputOhms: 1e6 };

/**
 * A moving-coil meter at 20 kΩ/V on its 20 V range: about 400 kΩ (electronics tutorials,
 * TRADE.md). Reading a needle to ±0.2 V and ±3 %: invented.
 */
export const ANALOGUE_METER: MeterProfile = {
	...ENTRY_DMM,
	id: 'analogue',
	label: 'Analogue moving-coil meter, 20 kΩ/V',
	inputOhms: 400e3,
	volts: { abs: 0.2, rel: 0.03 },
	pulsingBand: 0.3,
	ohms: { abs: 2, rel: 0.05, testCurrent: 1e-3, overLimit: 1e6 }
};

export const METER_PROFILES: Record<string, MeterProfile> = {
	[ENTRY_DMM.id]: ENTRY_DMM,
	[CHEAP_DMM.id]: CHEAP_DMM,
	[ANALOGUE_METER.id]: ANALOGUE_METER
};

/** What a probe measures: DC volts to earth, a volt drop between two points, ohms unpowered, a test lamp to earth. */
export const PROBE_KINDS = ['volts', 'drop', 'ohms', 'lamp'] as const;
export type ProbeKind = (typeof PROBE_KINDS)[number];

/** The harness as found (the scenario), with the battery disconnected, or with one part taken out of its holder. */
export type SetupId = 'as-given' | 'power-off' | `part-out:${string}`;

/** The setup's scenario: the scenario itself, the battery off, or a part out. */
export function setupScenario(doc: HarnessDocument, scenario: Scenario, setup: SetupId): Scenario {
	if (setup === 'as-given') return scenario;
	if (setup === 'power-off') {
		const batteries = doc.parts.filter((p) => p.kind === 'battery').map((p) => p.id);
		return { ...scenario, engineRunning: false, disconnected: [...(scenario.disconnected ?? []), ...batteries] };
	}
	const part = setup.slice('part-out:'.length);
	return { ...scenario, disconnected: [...(scenario.disconnected ?? []), part] };
}

/** The meter across two points as the solver takes it: the DMM's input resistance, its ohms test current, or the test lamp's bulb. */
export function meterFor(kind: ProbeKind, a: ProbePoint, b: ProbePoint, profile: MeterProfile, systemVoltage: number): Meter {
	if (kind === 'lamp') return { kind: 'lamp', a, b, ohms: lampResistance(systemVoltage, profile.lamp.watts), watts: profile.lamp.watts };
	if (kind === 'ohms') return { kind: 'ohms', a, b, testCurrent: profile.ohms.testCurrent };
	return { kind: 'volts', a, b, inputOhms: profile.inputOhms };
}

/** The unit a probe kind reads in. */
export function unitOf(kind: ProbeKind): 'V' | '%' | 'Ω' {
	return kind === 'lamp' ? '%' : kind === 'ohms' ? 'Ω' : 'V';
}

/** A raw solved reading as a table value: volts; a lamp's brightness (fraction) in %; ohms capped at the top of range. */
export function tableReading(kind: ProbeKind, raw: number, profile: MeterProfile): number {
	if (kind === 'lamp') return raw * 100;
	if (kind === 'ohms') return !Number.isFinite(raw) || raw > profile.ohms.overLimit ? profile.ohms.overLimit : raw;
	return raw;
}

/** What the meter shows for a raw solved reading: the table value, or "OL" at or over the top of the ohms range. */
export function shownReading(kind: ProbeKind, raw: number, profile: MeterProfile): number | 'OL' {
	if (kind === 'ohms' && !(raw < profile.ohms.overLimit)) return 'OL';
	return tableReading(kind, raw, profile);
}
