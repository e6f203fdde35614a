/**
 * "True worlds" for tests and the benchmark: a vehicle as it really is, next to the document the
 * restorer drew. The drawing gives nominal values; the real battery, bulbs, gauges, wire runs and
 * stabilizer sit somewhere in their tolerance, and the senders wherever the tank and the coolant
 * happen to be. A true world changes values only, never topology, so `buildCircuit` of it has the
 * same element and node numbering as the drawn document's, and a fault's changes apply to both.
 *
 * Ranges (TRADE.md, "Tolerances for the uncertainty model" and "Charging and batteries"):
 * - battery at rest 11.9–12.8 V per 12 V: the BCI rest table spans 11.89 V (discharged) to
 *   12.65 V (full), a surface charge reads a little higher; engine running 13.5–14.5 V per 12 V
 *   (alternator systems, common practice);
 * - incandescent lamps' rated watts, gauge heaters' and loads' (motors, `load` parts)
 *   resistance ±10 % (from memory);
 * - wire lengths ×0.5–1.5: lengths drawn from a manual are estimates (our default);
 * - a healthy stabilizer's set-point 9.5–10.5 V per 12 V (enthusiast technical pages);
 * - each sender's position anywhere in 0..1: unknown unless the restorer sets it.
 * All draws are uniform. Relay coils, ignition coils, resistors, contacts and joints stay nominal.
 *
 * Also here: a sized fault's true size over its mode's span, and what a 3½-digit meter shows for a
 * true value (its error and its display), so a test can read a true world as a person would.
 */
import type { Circuit } from '../circuit';
import { atSize, sizeRange, type Change, type Hypothesis } from '../faults';
import { faultedCircuit } from '../predict';
import { solveCircuit, type Solution } from '../solve';
import { markOf, observedElement, quantity, seenOn, type PartMark } from '../symptoms';
import type { MeterProfile } from '../meter';
import { chargingVoltage } from '../parts';
import type { Scenario } from '../scenario';
import type { HarnessDocument } from '../schema';
import type { Prng } from './generate';

/** The spans a true world is drawn from (see the header for their sources). Per 12 V where marked. */
export const WORLD_SPANS = {
	batteryRestPer12: { low: 11.9, high: 12.8 },
	batteryRunningPer12: { low: 13.5, high: 14.5 },
	/** ± fraction on lamp watts, gauge heater and load resistance. */
	rated: 0.1,
	wireLengthFactor: { low: 0.5, high: 1.5 },
	stabilizerSetPointPer12: { low: 9.5, high: 10.5 },
	senderPosition: { low: 0, high: 1 }
} as const;

export interface TrueWorld {
	/** The document with every drawn value as it really is (same parts, wires and ids). */
	doc: HarnessDocument;
	/** The scenario with the senders where they really are. */
	scenario: Scenario;
}

/**
 * The scenario a restorer gives the engine: as given, but every sender at the document's own
 * position (the fuel level and coolant temperature are not known).
 */
export function restorerScenario(doc: HarnessDocument, scenario: Scenario): Scenario {
	const senders: Record<string, number> = {};
	for (const p of doc.parts) if (p.kind === 'sender') senders[p.id] = p.params.position;
	return { ...scenario, senders };
}

/** The world exactly as drawn: the document itself and the restorer's scenario. */
export function nominalWorld(doc: HarnessDocument, scenario: Scenario): TrueWorld {
	return { doc, scenario: restorerScenario(doc, scenario) };
}

/**
 * Draw a true world around a drawn document in a scenario (engine running or not decides which
 * battery span applies). Pure: the same generator state gives the same world; the input is not
 * changed. Draws run over the parts, then the wires, then the senders, in document order.
 */
export function drawWorld(doc: HarnessDocument, scenario: Scenario, rng: Prng): TrueWorld {
	const per12 = doc.vehicle.systemVoltage / 12;
	const running = scenario.engineRunning ?? false;
	const rated = (x: number) => x * rng.range(1 - WORLD_SPANS.rated, 1 + WORLD_SPANS.rated);
	const out: HarnessDocument = structuredClone(doc);
	let charging: number | null = null;
	for (const p of out.parts) {
		switch (p.kind) {
			case 'battery':
				if (running) {
					const s = WORLD_SPANS.batteryRunningPer12;
					// With the engine running the battery's EMF is its charging voltage (circuit.ts).
					p.params.chargingVoltage = rng.range(s.low, s.high) * per12;
					charging ??= p.params.chargingVoltage;
				} else {
					const s = WORLD_SPANS.batteryRestPer12;
					p.params.emf = rng.range(s.low, s.high) * per12;
				}
				break;
			case 'lamp':
				p.params.watts = rated(p.params.watts);
				break;
			case 'gauge':
			case 'motor':
			case 'load':
				p.params.resistance = rated(p.params.resistance);
				break;
			case 'stabilizer': {
				const s = WORLD_SPANS.stabilizerSetPointPer12;
				p.params.setPoint = rng.range(s.low, s.high) * per12;
				break;
			}
			default:
				break;
		}
	}
	// The charging system is lumped into the battery: a generator left at its default output
	// follows the battery's drawn charging voltage rather than fight it.
	if (running) {
		for (const p of out.parts) {
			if (p.kind === 'generator' && p.params.outputVoltage === undefined) p.params.outputVoltage = charging ?? chargingVoltage(doc.vehicle.systemVoltage);
		}
	}
	for (const w of out.wires) {
		const s = WORLD_SPANS.wireLengthFactor;
		w.lengthM = w.lengthM * rng.range(s.low, s.high);
	}
	const senders: Record<string, number> = {};
	for (const p of out.parts) if (p.kind === 'sender') senders[p.id] = rng.range(WORLD_SPANS.senderPosition.low, WORLD_SPANS.senderPosition.high);
	return { doc: out, scenario: { ...scenario, senders } };
}

/**
 * A sized fault's true size (faults.ts `sizeRange`): log-uniform over the span for resistances
 * (a corroded joint is as likely a few ohms as a few hundred), uniform for a stabilizer's
 * set-point factor; null for a fault with one size (open, blown, stuck).
 */
export function drawFaultSize(h: Pick<Hypothesis, 'kind' | 'changes'>, rng: Prng): number | null {
	const span = sizeRange(h);
	if (!span) return null;
	if (h.kind === 'stabilizer:low' || h.kind === 'stabilizer:high') return rng.range(span.low, span.high);
	return Math.exp(rng.range(Math.log(span.low), Math.log(span.high)));
}

/** A hypothesis's changes at a drawn true size (unchanged for a fault with one size). */
export function drawFault(h: Pick<Hypothesis, 'kind' | 'changes'>, rng: Prng): { changes: Change[]; size: number | null } {
	const size = drawFaultSize(h, rng);
	return { changes: size === null ? h.changes : atSize(h, size), size };
}

export type ShownKind = 'volts' | 'drop' | 'ohms' | 'lamp';

/**
 * Display step of a 3½-digit meter (1999 counts) for a value: 0.01 V on the 20 V range, 0.1 V on
 * 200 V; 0.1 Ω on 200 Ω, 1 Ω on 2 kΩ and so on up (TRADE.md, "Meters": a 3½-digit meter resolves
 * 10 mV on its 20 V range). Volts and drops are read on the 20 V range or above, as the probes'
 * settings say.
 */
export function displayStep(kind: 'volts' | 'drop' | 'ohms', value: number): number {
	let step = kind === 'ohms' ? 0.1 : 0.01;
	while (Math.abs(value) >= 1999.5 * step) step *= 10;
	return step;
}

/**
 * What a person reads for a true value (a probe's table value: volts, lamp brightness in %, ohms):
 * the meter's error drawn uniformly within ±(rel·|x| + abs) of its accuracy (no pulsing band: that
 * is the engine's allowance, not the meter's error; the display stays within that spec), then the display: volts to their range's
 * step, ohms likewise and "OL" at or above the top of range, lamp brightness judged to whole
 * points and never below dark. With no generator the error is left out (the display only).
 */
export function meterShows(
	kind: ShownKind,
	value: number,
	accuracy: { abs: number; rel: number },
	profile: Pick<MeterProfile, 'ohms'>,
	rng: Prng | null
): number | 'OL' {
	const top = profile.ohms.overLimit;
	if (kind === 'ohms' && !(value < top)) return 'OL';
	const half = (accuracy.rel ?? 0) * Math.abs(value) + (accuracy.abs ?? 0);
	const x = rng ? value + rng.range(-half, half) : value;
	// A meter's ±(% + counts) is stated for what its display shows, rounding included: a reading
	// rounded past the spec is shown one step nearer the true value.
	const within = (shown: number, step: number) => (rng && Math.abs(shown - value) > half + 1e-9 ? toStep(shown - Math.sign(shown - value) * step, step) : shown);
	if (kind === 'lamp') return Math.max(0, within(Math.round(x), 1));
	if (kind === 'ohms') {
		if (!(x < top)) return 'OL';
		const shown = Math.max(0, x);
		const step = displayStep('ohms', shown);
		return Math.max(0, within(toStep(shown, step), step));
	}
	const step = displayStep(kind, x);
	return within(toStep(x, step), step);
}

/** x rounded to a whole number of steps, printed to the step's decimals (12.34 stays 12.34, not 12.340000000000002). */
function toStep(x: number, step: number): number {
	const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
	return Number((Math.round(x / step) * step).toFixed(decimals)) || 0;
}

/**
 * The marks a person makes with a fault present: every observable part seen working (symptoms.ts
 * seenOn) that misbehaves against the same harness without it, and up to two that do not (the
 * benchmarks' planted cases).
 */
export function marksSeen(c: Circuit, healthy: Solution, changes: readonly Change[]): PartMark[] {
	const s = solveCircuit(faultedCircuit(c, changes));
	const marks: PartMark[] = [];
	const normal: PartMark[] = [];
	for (const p of c.doc.parts) {
		const o = observedElement(c, p);
		if (!o) continue;
		const e = c.elements[o.element];
		const h = quantity(o.judged, healthy.g[o.element], healthy.at(e.a) - healthy.at(e.b));
		if (!seenOn(c, o.element, o.judged, h)) continue;
		const q = quantity(o.judged, s.g[o.element], s.at(e.a) - s.at(e.b));
		const mark = markOf(o.judged, q / h);
		(mark === 'normal' ? normal : marks).push({ part: p.id, mark });
	}
	return marks.length ? [...marks, ...normal.slice(0, 2)] : [];
}
