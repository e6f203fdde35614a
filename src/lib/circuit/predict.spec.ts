// Incremental predictions against full re-solves (the circuit core's own DC solve, itself
// checked against ngspice in spice.spec.ts) on generated harnesses: every hypothesis × meter.
import { describe, expect, it } from 'vitest';
import { buildCircuit } from './circuit';
import { generateHypotheses } from './faults';
import { Base, emptyFallbacks, fullReading, predictReadings, type Meter } from './predict';
import { generateHarness, prng } from './testing/generate';

// Relative agreement asked of the incremental method: 1e-9 of the larger reading, with a floor
// of one display unit (1 V, 10 mA, full lamp brightness) so rounding in readings near zero does
// not count as a disagreement.
const floor: Record<Meter['kind'], number> = { volts: 1, lamp: 1, ohms: 1, current: 0.01 };

describe('incremental predictions = full re-solve (within 1e-9 relative)', () => {
	// 22 generated harnesses of three sizes, every seed taken: parts hanging on the leakage, relays,
	// stabilizers and shorts bridging a dead part to the chassis all occur among them.
	const cases = [12, 20, 30].flatMap((parts) => Array.from({ length: parts === 12 ? 6 : 8 }, (_, i) => [parts, i + 1] as const));
	it.each(cases)('generated harness of %i parts, seed %i: every hypothesis, volts, test lamp and part currents', (parts, seed) => {
		const { doc, scenario } = generateHarness(seed, { parts });
		const c = buildCircuit(doc, scenario);
		const base = new Base(c);
		const hyps = generateHypotheses(c);
		const r = prng(seed * 7);
		const meters: Meter[] = [];
		for (let i = 0; i < 4; i++) {
			const p = r.pick(doc.parts);
			const a = { part: p.id, terminal: r.pick(p.terminals) };
			meters.push(i % 2 ? { kind: 'lamp', a, b: 'earth', ohms: 28.8, watts: 5 } : { kind: 'volts', a, b: 'earth', inputOhms: 10e6 });
		}
		const loads = c.elements.flatMap((e, k) => (e.ref.kind === 'part' && ['filament', 'winding', 'track', 'resistance'].includes(e.ref.role) ? [k] : []));
		for (let i = 0; i < 2 && loads.length; i++) meters.push({ kind: 'current', element: r.pick(loads) });
		const fb = emptyFallbacks();
		const inc = predictReadings(base, hyps, meters, fb);
		let worst = 0;
		hyps.forEach((h, hi) =>
			meters.forEach((m, mi) => {
				const full = fullReading(c, h.changes, m);
				const got = inc[mi][hi];
				worst = Math.max(worst, Math.abs(full - got) / Math.max(Math.abs(full), Math.abs(got), floor[m.kind]));
			})
		);
		expect(worst).toBeLessThanOrEqual(1e-9);
		// Most hypotheses are done incrementally (the rest are counted fallbacks).
		expect(fb.incremental).toBeGreaterThan(hyps.length / 2);
	});

	it('ohms with the battery disconnected: an injected test current, same as a full solve', () => {
		const { doc, scenario } = generateHarness(11, { parts: 30 });
		const batteries = doc.parts.filter((p) => p.kind === 'battery').map((p) => p.id);
		const off = { ...scenario, disconnected: [...scenario.disconnected, ...batteries] };
		const c = buildCircuit(doc, off);
		const hyps = generateHypotheses(c);
		const lamps = doc.parts.filter((p) => p.kind === 'lamp' || p.kind === 'gauge').slice(0, 3);
		const meters: Meter[] = lamps.map((p) => ({ kind: 'ohms', a: { part: p.id, terminal: p.terminals[0] }, b: { part: p.id, terminal: p.terminals[1] }, testCurrent: 1e-3 }));
		const inc = predictReadings(new Base(c), hyps, meters);
		hyps.forEach((h, hi) =>
			meters.forEach((m, mi) => {
				const full = fullReading(c, h.changes, m);
				expect(Math.abs(full - inc[mi][hi]) / Math.max(Math.abs(full), 1)).toBeLessThanOrEqual(1e-9);
			})
		);
	});
});
