// Incremental predictions against full re-solves (the circuit core's own DC solve, itself
// checked against ngspice in spice.spec.ts) on generated harnesses: every hypothesis × meter.
import { describe, expect, it } from 'vitest';
import { buildCircuit } from './circuit';
import { defaultScenario } from './scenario';
import { assertDocument } from './schema';
import { solveCircuit } from './solve';
import { generateHypotheses } from './faults';
import { Base, emptyFallbacks, faultedCircuit, fullReading, predictReadings, type Meter } from './predict';
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

	it('dead islands (an opening that cuts a dead branch off) go the island route and read as a full re-solve', () => {
		// On this generated harness openings cut off dead branches (parts hanging on the leakage):
		// the island route must be taken, and every reading must match a full solve (as above).
		const { doc, scenario } = generateHarness(5, { parts: 20 });
		const c = buildCircuit(doc, scenario);
		const hyps = generateHypotheses(c);
		const meters: Meter[] = doc.parts.flatMap((p) => p.terminals.map((t) => ({ kind: 'volts', a: { part: p.id, terminal: t }, b: 'earth', inputOhms: 10e6 }) as Meter));
		const fb = emptyFallbacks();
		const inc = predictReadings(new Base(c), hyps, meters, fb);
		expect(fb.deadIslands).toBeGreaterThan(0);
		let worst = 0;
		hyps.forEach((h, hi) => meters.forEach((m, mi) => {
			const full = fullReading(c, h.changes, m);
			worst = Math.max(worst, Math.abs(full - inc[mi][hi]) / Math.max(Math.abs(full), 1));
		}));
		expect(worst).toBeLessThanOrEqual(1e-9);
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

describe('the state bound: a meter whose current could move a relay is checked one by one', () => {
	// Worked by hand. A relay (coil 80 Ω, pull-in 0.6 × 12 = 7.2 V: the relay part's defaults) has
	// its coil fed from the battery (12.6 V) at 86 and earthed at 85 through a poor 100 Ω earth
	// path (a resistor), so the coil gets 12.6 × 80 / 180 = 5.6 V: released, and the circuit settles
	// in solve.ts's first round. Its 30–87 contact feeds a 3 Ω horn.
	// - A 10 MΩ voltmeter at 85 reads 12.6 × 100 / 180 = 7.0 V and draws 0.7 µA: far too little
	//   to move the relay (the bound passes, no check one by one).
	// - A 5 W test lamp (12² / 5 = 28.8 Ω) at 85 gives the coil a better earth: 100 ∥ 28.8 = 22.4 Ω,
	//   so the coil gets 12.6 × 80 / 102.4 = 9.8 V, above pull-in: the relay pulls in and the horn
	//   sounds (common practice: a test lamp can complete a circuit a DMM does not). The lamp then
	//   sees 2.75 V less the battery's drop under the horn's 4 A: its brightness is not the one of
	//   the released state, so the pair must fail the bound and be solved with the lamp in.
	const doc = assertDocument({
		schemaVersion: 1,
		vehicle: { systemVoltage: 12, earth: 'negative' },
		parts: [
			{ id: 'bat', key: '1', kind: 'battery' },
			{ id: 'k', key: '2', kind: 'relay' },
			{ id: 'poor', key: '3', kind: 'resistor', params: { resistance: 100 } },
			{ id: 'horn', key: '4', kind: 'load', params: { resistance: 3 } },
			{ id: 'e', key: '5', kind: 'earth-point' }
		],
		wires: [
			{ id: 'strap', from: { part: 'bat', terminal: '-' }, to: { part: 'e', terminal: 'stud' }, code: 'B' },
			{ id: 'feed30', from: { part: 'bat', terminal: '+' }, to: { part: 'k', terminal: '30' }, code: 'N' },
			{ id: 'coil', from: { part: 'bat', terminal: '+' }, to: { part: 'k', terminal: '86' }, code: 'P' },
			{ id: 'coilE', from: { part: 'k', terminal: '85' }, to: { part: 'poor', terminal: '1' }, code: 'P/B' },
			{ id: 'poorE', from: { part: 'poor', terminal: '2' }, to: { part: 'e', terminal: 'stud' }, code: 'B' },
			{ id: 'hornFeed', from: { part: 'k', terminal: '87' }, to: { part: 'horn', terminal: '1' }, code: 'P' },
			{ id: 'hornE', from: { part: 'horn', terminal: '2' }, to: { part: 'e', terminal: 'stud' }, code: 'B' }
		]
	});
	const scenario = defaultScenario(doc);
	const c = buildCircuit(doc, scenario);
	const at85 = { part: 'k', terminal: '85' };
	const volts: Meter = { kind: 'volts', a: at85, b: 'earth', inputOhms: 10e6 };
	const lamp: Meter = { kind: 'lamp', a: at85, b: 'earth', ohms: 28.8, watts: 5 };

	it('keeps the relay released without a meter, and pulls it in with the test lamp at 85', () => {
		const base = new Base(c);
		expect(base.settledFirstRound).toBe(true);
		expect(base.solution.energised.has('k')).toBe(false);
		const withLamp = faultedCircuit(c, [{ type: 'to-chassis', node: c.terminalNode(at85), ohms: 28.8 }]);
		expect(solveCircuit(withLamp).energised.has('k')).toBe(true);
	});

	it('reads the voltmeter through the bound and the lamp one by one, both as a full re-solve does', () => {
		const base = new Base(c);
		const fb = emptyFallbacks();
		const [v, l] = predictReadings(base, [{ changes: [] }], [volts, lamp], fb);
		// 7.0 V by hand; the wires, joints and battery (milliohms beside 180 Ω) move it by well under 10 mV.
		expect(Math.abs(v[0] - 7.0)).toBeLessThan(0.01);
		expect(Math.abs(v[0] - fullReading(c, [], volts))).toBeLessThanOrEqual(1e-9);
		// Only the lamp failed the bound, and it moved the relay: read by a full solve with the lamp in.
		expect(fb.checkedOneByOne).toBe(1);
		expect(fb.meterFlips).toBe(1);
		const full = fullReading(c, [], lamp);
		expect(Math.abs(l[0] - full)).toBeLessThanOrEqual(1e-9 * full);
		// The released state's brightness ((2.75 V)² / 28.8 Ω / 5 W ≈ 0.052) is not what the lamp shows
		// with the horn pulling the battery down: the case would fail if the flip were missed.
		const released = (12.6 * 22.36) / 102.36;
		expect(Math.abs(full - (released * released) / 28.8 / 5)).toBeGreaterThan(1e-4);
	});
});

describe('the first-round bound: a test lamp that changes solve.ts\'s settling path is replayed', () => {
	// Worked by hand. A self-latching relay: its coil (80 Ω, pull-in 7.2 V: the relay part's
	// defaults) is fed at 86 through a weak 46 Ω feed, and its own 30–87 contact joins 86 to the
	// battery once it pulls in. From relays released (solve.ts's start) the coil gets
	// 12.6 × 80 / 126 = 8.0 V: it pulls in, latches at 12.6 V and the circuit settles in the second
	// round. A 5 W test lamp (28.8 Ω) at 86 pulls the first round's coil voltage down to
	// 12.6 × (80 ∥ 28.8) / (46 + 80 ∥ 28.8) = 12.6 × 21.2 / 67.2 = 4.0 V: the relay never pulls in,
	// and the lamp reads about 4 V (brightness 4.0² / 28.8 / 5 ≈ 0.11). The latched state with the
	// lamp (86 at the battery) would be self-consistent, so only the settling path tells them
	// apart: the pair must not be read from the settled state (brightness about 1.1).
	const doc = assertDocument({
		schemaVersion: 1,
		vehicle: { systemVoltage: 12, earth: 'negative' },
		parts: [
			{ id: 'bat', key: '1', kind: 'battery' },
			{ id: 'k', key: '2', kind: 'relay' },
			{ id: 'weak', key: '3', kind: 'resistor', params: { resistance: 46 } },
			{ id: 'e', key: '4', kind: 'earth-point' }
		],
		wires: [
			{ id: 'strap', from: { part: 'bat', terminal: '-' }, to: { part: 'e', terminal: 'stud' }, code: 'B' },
			{ id: 'feed30', from: { part: 'bat', terminal: '+' }, to: { part: 'k', terminal: '30' }, code: 'N' },
			{ id: 'feedWeak', from: { part: 'bat', terminal: '+' }, to: { part: 'weak', terminal: '1' }, code: 'N' },
			{ id: 'coil', from: { part: 'weak', terminal: '2' }, to: { part: 'k', terminal: '86' }, code: 'P' },
			{ id: 'latch', from: { part: 'k', terminal: '87' }, to: { part: 'k', terminal: '86' }, code: 'P' },
			{ id: 'coilE', from: { part: 'k', terminal: '85' }, to: { part: 'e', terminal: 'stud' }, code: 'B' }
		]
	});
	const c = buildCircuit(doc, defaultScenario(doc));
	const lamp: Meter = { kind: 'lamp', a: { part: 'k', terminal: '86' }, b: 'earth', ohms: 28.8, watts: 5 };

	it('settles latched in the second round, and stays released with the lamp at 86', () => {
		const base = new Base(c);
		expect(base.settledSecondRound).toBe(true);
		expect(base.solution.energised.has('k')).toBe(true);
		const withLamp = solveCircuit(faultedCircuit(c, [{ type: 'to-chassis', node: c.terminalNode({ part: 'k', terminal: '86' }), ohms: 28.8 }]));
		expect(withLamp.energised.has('k')).toBe(false);
	});

	it('reads the lamp as a full re-solve does (about 4 V, not the latched 12.6 V)', () => {
		const fb = emptyFallbacks();
		const [l] = predictReadings(new Base(c), [{ changes: [] }], [lamp], fb);
		const full = fullReading(c, [], lamp);
		expect(Math.abs(l[0] - full)).toBeLessThanOrEqual(1e-9 * full);
		// 4.0 V by hand (wires and joints are milliohms beside 46 Ω): brightness 0.11, well below the latched 1.1.
		expect(Math.abs(Math.sqrt(full * 28.8 * 5) - 3.97)).toBeLessThan(0.05);
		expect(fb.meterFlips).toBe(1);
	});
});
