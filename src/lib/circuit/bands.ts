/**
 * Reading bands: the span of readings one suspect can give at one probe in a real vehicle, from
 * a handful of solved "worlds" (uncertainty.ts) instead of a solve per combination.
 *
 * The method (one-at-a-time deviations, summed; the "vertex" or "worst-case sensitivity" analysis
 * of circuit tolerance texts, e.g. Spence & Soin, "Tolerance Design of Electronic Circuits",
 * 1988, ch. 3): for each group of uncertain values, solve the world with the group at its low
 * end and at its high end, the rest nominal; a reading's deviation in the full box of values is,
 * to first order, the sum of the groups' deviations, so its band is the nominal reading minus
 * the sum of the downward deviations and plus the sum of the upward ones. The fault's own size
 * is one more group: the reading at each sampled size of the suspect's span. Second-order terms
 * (a larger joint under a brighter lamp) are covered by a margin on the summed deviations
 * (SPREAD_MARGIN, invented; the robust benchmark measures what it leaves out). The fault's
 * size is sampled on a grid reaching a step past the sizes that explain the marks, and each
 * group's deviation is applied at the sampled sizes that read lowest and highest (diagnose.ts),
 * so the size itself takes no margin (one would let a joint's drop band reach 0 V and merge with
 * every clean joint's).
 *
 * The battery is kept apart: readings are solved at three EMFs (the range's ends and the
 * nominal) and read off the line through them, so a battery reading taken in the diagnosis
 * narrows every band without solving again — each suspect's own EMF is the one that makes its
 * predicted battery reading equal the measured one (its load on the battery included).
 */
import type { ReadingRange } from './outcomes';

/** How a reading moves, at one probe under one suspect. */
export interface Spread {
	/** The representative reading at the EMF range's low and high ends (the nominal EMF's is the table's). */
	atLow: number;
	atHigh: number;
	/** The band at the nominal EMF: every size of the suspect's span, every other group moved (with the margin). */
	low: number;
	high: number;
}

export interface EmfRange {
	low: number;
	nominal: number;
	high: number;
}

/** Factor on the summed deviations for what first order leaves out (invented; see the header). */
export const SPREAD_MARGIN = 1.25;

/** A reading at EMF `e`: piecewise linear through the three solved EMFs, extended along the end segments. */
export function readingAt(nominal: number, s: Spread, emf: EmfRange, e: number): number {
	const seg = (e0: number, r0: number, e1: number, r1: number) => (e1 === e0 ? r0 : r0 + ((r1 - r0) * (e - e0)) / (e1 - e0));
	return e <= emf.nominal ? seg(emf.low, s.atLow, emf.nominal, nominal) : seg(emf.nominal, nominal, emf.high, s.atHigh);
}

/**
 * The band of a reading with the EMF anywhere in [eLow, eHigh]: the nominal-EMF band carried to
 * each EMF the way the representative reading moves — in proportion where the reading is of
 * some size (a feed reads in proportion to the battery; a regulated one does not move), shifted
 * where it is near zero (a drop across a clean joint).
 */
export function bandAt(nominal: number, s: Spread, emf: EmfRange, eLow: number, eHigh: number): ReadingRange {
	const at = [eLow, eHigh];
	if (eLow < emf.nominal && emf.nominal < eHigh) at.push(emf.nominal);
	let low = Infinity;
	let high = -Infinity;
	for (const e of at) {
		const r = readingAt(nominal, s, emf, e);
		const scale = Math.abs(nominal) >= 0.05 ? r / nominal : null;
		const lo = scale !== null ? s.low * scale : s.low + (r - nominal);
		const hi = scale !== null ? s.high * scale : s.high + (r - nominal);
		low = Math.min(low, lo, hi);
		high = Math.max(high, lo, hi);
	}
	return { low, high };
}

/**
 * The EMF at which this suspect's battery reading would be `x`, and how much one volt of reading
 * moves it (for turning the meter's tolerance into an EMF tolerance); null when the reading does
 * not follow the EMF (a suspect that cuts the battery off).
 */
export function emfFromReading(nominal: number, s: Spread, emf: EmfRange, x: number): { emf: number; perVolt: number } | null {
	const lowSlope = emf.nominal === emf.low ? 0 : (nominal - s.atLow) / (emf.nominal - emf.low);
	const highSlope = emf.high === emf.nominal ? 0 : (s.atHigh - nominal) / (emf.high - emf.nominal);
	const below = Math.sign(highSlope || lowSlope) * (x - nominal) < 0;
	const slope = below ? lowSlope || highSlope : highSlope || lowSlope;
	if (!(Math.abs(slope) > 0.05)) return null;
	return { emf: emf.nominal + (x - nominal) / slope, perVolt: 1 / Math.abs(slope) };
}
