/**
 * Marks → what a hypothesis must predict, and whether it does.
 *
 * A mark says how a part behaves: reads-low, reads-high, dead, erratic or normal. Each part
 * kind is judged by one quantity, compared with the same quantity in the healthy circuit of the
 * same scenario (same switch and sender positions): a gauge by its winding current (a thermal
 * gauge's needle follows its heater current), a lamp by its filament power (brightness), any
 * other part by its current. With r = faulted / healthy:
 *
 *   dead       r < dead               reads-low   dead ≤ r < low
 *   normal     low ≤ r ≤ high         reads-high  r > high
 *   erratic    a fault that can come and go (loose, corroded, broken inside) moving the part
 *              off normal
 *
 * The thresholds (`MARK_THRESHOLDS`) are invented defaults of the order a person notices: a
 * gauge 15 % off its usual reading, a lamp at 70 % of its power (about 84 % of its voltage).
 */
import type { Circuit } from './circuit';
import { INTERMITTENT_KINDS, type Hypothesis } from './faults';
import type { Part } from './schema';

export const MARKS = ['reads-low', 'reads-high', 'dead', 'erratic', 'normal'] as const;
export type Mark = (typeof MARKS)[number];

export interface PartMark {
	part: string;
	mark: Mark;
}

export type Judged = 'gauge' | 'lamp' | 'current';

/** Fractions of the healthy quantity (invented defaults; see the file header). */
export const MARK_THRESHOLDS: Record<Judged, { dead: number; low: number; high: number }> = {
	gauge: { dead: 0.1, low: 0.85, high: 1.15 },
	lamp: { dead: 0.1, low: 0.7, high: 1.3 },
	current: { dead: 0.1, low: 0.8, high: 1.2 }
};

/** The element whose current shows how a part behaves, and how it is judged; null when a part cannot be marked. */
export function observedElement(c: Circuit, part: Part): { element: number; judged: Judged } | null {
	const role: Partial<Record<Part['kind'], [string, Judged]>> = {
		lamp: ['filament', 'lamp'],
		gauge: ['winding', 'gauge'],
		motor: ['winding', 'current'],
		'ignition-coil': ['winding', 'current'],
		load: ['resistance', 'current'],
		resistor: ['resistance', 'current'],
		relay: ['coil', 'current']
	};
	const r = role[part.kind];
	if (!r) return null;
	const k = c.elements.findIndex((e) => e.ref.kind === 'part' && e.ref.part === part.id && e.ref.role === r[0]);
	return k < 0 ? null : { element: k, judged: r[1] };
}

/** The quantity a part is judged by, from the element's conductance and voltage. */
export function quantity(judged: Judged, g: number, volts: number): number {
	return judged === 'lamp' ? g * volts * volts : Math.abs(g * volts);
}

/**
 * Below this share of what a part takes straight across the system voltage it is off to a person
 * (a lamp with no visible glow, a gauge needle at rest, a motor still): a sneak path's few
 * milliamps through a part that is switched off are not its "normal". Invented: a lamp below
 * about a tenth of its voltage does not glow (power ∝ V², so 1 % of rated power); other parts
 * below 2 % of their full current.
 */
export const OFF_BELOW: Record<Judged, number> = { lamp: 0.01, gauge: 0.02, current: 0.02 };

/** Is a part drawing enough in a solved circuit to be seen working (and so to be marked)? */
export function seenOn(c: Circuit, element: number, judged: Judged, q: number): boolean {
	const v = c.doc.vehicle.systemVoltage;
	const g = c.elements[element].gClosed;
	const full = judged === 'lamp' ? g * v * v : g * v;
	return q > OFF_BELOW[judged] * full;
}

/** The mark a ratio to healthy earns (erratic aside). */
export function markOf(judged: Judged, ratio: number): Exclude<Mark, 'erratic'> {
	const t = MARK_THRESHOLDS[judged];
	if (ratio < t.dead) return 'dead';
	if (ratio < t.low) return 'reads-low';
	if (ratio > t.high) return 'reads-high';
	return 'normal';
}

/**
 * How clearly a ratio sits inside its mark's band: 1 well inside, down to 0.5 on a threshold.
 * Distances are taken on a log scale and saturate at a factor of 1.25 from the nearest edge.
 */
export function clarity(judged: Judged, ratio: number): number {
	const t = MARK_THRESHOLDS[judged];
	const r = Math.max(ratio, 1e-9);
	const edges = [t.dead, t.low, t.high];
	const d = Math.min(...edges.map((e) => Math.abs(Math.log(r / e))));
	return 0.5 + 0.5 * Math.min(1, d / Math.log(1.25));
}

export interface Explanation {
	explains: boolean;
	/** Product of the marks' clarity (1 = every mark clearly as predicted). */
	fit: number;
	/** Per mark: the predicted mark. */
	predicted: Exclude<Mark, 'erratic'>[];
}

/**
 * Would a person who sees a part at `ratio` of its usual quantity give it this mark? The mark's
 * band of ratios is widened by the factor 1 + slack at each edge: where a gauge 15 % off starts
 * to look low is itself a judgement, and the healthy quantity a person remembers is not exact.
 */
export function markFits(judged: Judged, ratio: number, mark: Exclude<Mark, 'erratic'>, slack = 0): boolean {
	const t = MARK_THRESHOLDS[judged];
	const k = 1 + slack;
	if (mark === 'dead') return ratio < t.dead * k;
	if (mark === 'reads-low') return ratio >= t.dead / k && ratio < t.low * k;
	if (mark === 'reads-high') return ratio > t.high / k;
	return ratio >= t.low / k && ratio <= t.high * k;
}

/**
 * How far a ratio lies outside its mark's band, on a log scale (0 inside; erratic: how far inside
 * the normal band). Summed over the marks, it says which of a fault's sizes comes nearest to
 * explaining them, so the sizes around that one are tried next.
 */
export function markMiss(judged: Judged, ratio: number, mark: Mark): number {
	const t = MARK_THRESHOLDS[judged];
	const r = Math.max(ratio, 1e-9);
	if (mark === 'erratic') return r < t.low || r > t.high ? 0 : Math.min(Math.log(r / t.low), Math.log(t.high / r));
	const [low, high] = mark === 'dead' ? [0, t.dead] : mark === 'reads-low' ? [t.dead, t.low] : mark === 'reads-high' ? [t.high, Infinity] : [t.low, t.high];
	return r < low ? Math.log(low / r) : r > high ? Math.log(r / high) : 0;
}

/** Two parts judged alike whose quantities are within this fraction look the same side by side (invented). */
export const SIDE_ALIKE = 0.02;

/** Marks from which one may be a step off (invented: with many parts marked, one borderline judgement is likely). */
export const FORGIVE_FROM = 4;

const MARK_ORDER: Record<Exclude<Mark, 'erratic'>, number> = { dead: 0, 'reads-low': 1, normal: 2, 'reads-high': 3 };

/**
 * Does a hypothesis, with these ratios per mark, explain every mark (each within `slack`, see
 * markFits)? `sideSlack` is the margin of the side-by-side rule below (the marks' own slack unless
 * given: a wide slack that looks for near fits must not also demand wide gaps between parts).
 */
export function explain(h: Pick<Hypothesis, 'kind'>, marks: readonly PartMark[], judged: readonly Judged[], ratios: readonly number[], slack = 0, sideSlack = slack): Explanation {
	let fit = 1;
	let explains = true;
	let misses = 0;
	let forgivable = true;
	const predicted = marks.map((m, i) => {
		const p = markOf(judged[i], ratios[i]);
		const ok = m.mark === 'erratic' ? p !== 'normal' && INTERMITTENT_KINDS.has(h.kind as never) : markFits(judged[i], ratios[i], m.mark, slack);
		if (!ok) {
			explains = false;
			misses++;
			if (m.mark === 'erratic' || Math.abs(MARK_ORDER[m.mark] - MARK_ORDER[p]) !== 1) forgivable = false;
		}
		fit *= clarity(judged[i], ratios[i]);
		return p;
	});
	// Among four or more marks, one a step off (dead for low, low for normal) is how people see
	// parts side by side, not a contradiction: the hypothesis stays, at a quarter of its fit.
	if (slack > 0 && !explains && misses === 1 && forgivable && marks.length >= FORGIVE_FROM) {
		explains = true;
		fit *= 0.25;
	}
	// Two parts judged alike and marked differently are seen side by side: the one marked lower
	// must really read lower. Alike to within SIDE_ALIKE, they cannot be told apart (a stabilizer
	// that moves both gauges alike cannot make one read low and the other normal — common
	// practice, TRADE.md); closer than the slack, the marks are a borderline judgement, kept at a
	// quarter of the fit.
	let close = false;
	if (explains && slack > 0)
		for (let i = 0; i < marks.length && explains; i++)
			for (let j = 0; j < marks.length; j++) {
				const a = marks[i].mark;
				const b = marks[j].mark;
				if (judged[i] !== judged[j] || a === 'erratic' || b === 'erratic' || !(MARK_ORDER[a] < MARK_ORDER[b])) continue;
				if (ratios[i] * (1 + SIDE_ALIKE) > ratios[j]) {
					explains = false;
					break;
				}
				if (ratios[i] * (1 + sideSlack) > ratios[j]) close = true;
			}
	if (explains && close) fit *= 0.25;
	return { explains, fit, predicted };
}
