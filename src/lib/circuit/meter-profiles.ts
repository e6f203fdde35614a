/**
 * Meter profiles: what the restorer's instruments can resolve, for telling suspects apart.
 * Accuracy is ±(% of reading + counts) (TRADE.md, "Meters"); the planner widens it by a band
 * for a reading that fluctuates on a pulsing stabilizer output.
 */
import { z } from 'zod';

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
