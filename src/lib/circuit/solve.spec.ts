import { describe, expect, it } from 'vitest';
import { assertDocument, type DocumentInput } from './schema';
import { defaultScenario } from './scenario';
import { buildCircuit, JOINT_RESISTANCE } from './circuit';
import { solve, solveCircuit } from './solve';
import { COPPER_RESISTIVITY_20C } from './wires';

type Earth = 'negative' | 'positive';
const term = (earth: Earth, which: 'live' | 'earthed') => ((earth === 'negative') === (which === 'live') ? '+' : '-');

/** Battery, one 21 W lamp, one earth point; wires of known size. */
function lampCircuit(earth: Earth, extra: Partial<DocumentInput> = {}) {
	return assertDocument({
		schemaVersion: 1,
		vehicle: { systemVoltage: 12, earth },
		parts: [
			{ id: 'bat', key: '1', kind: 'battery', params: { emf: 12.6, internalResistance: 0.02 } },
			{ id: 'lamp', key: '2', kind: 'lamp', params: { volts: 12, watts: 21 } },
			{ id: 'e1', key: '3', kind: 'earth-point', params: { resistance: 0.005 } },
			{ id: 'spare', key: '4', kind: 'lamp' }
		],
		wires: [
			{ id: 'w1', from: { part: 'bat', terminal: term(earth, 'live') }, to: { part: 'lamp', terminal: 'feed' }, code: 'N', size: { mm2: 1 }, lengthM: 1 },
			{ id: 'w2', from: { part: 'lamp', terminal: 'earth' }, to: { part: 'e1', terminal: 'stud' }, code: 'B', size: { mm2: 1 }, lengthM: 0.5 },
			{ id: 'w3', from: { part: 'bat', terminal: term(earth, 'earthed') }, to: { part: 'e1', terminal: 'stud' }, code: 'B', size: { mm2: 6 }, lengthM: 0.5 }
		],
		...extra
	});
}

describe('DC solve, worked by hand', () => {
	// Series loop: R = Rint + (w1 + 2 joints) + lamp + (w2 + 2 joints) + (w3 + 2 joints). The lamp's
	// earth wire and the battery strap share the earth point's stud, so the stud-to-chassis
	// resistance carries no current and is not in the loop.
	// Wire R = L / (58 A) (IEC 60028 copper); lamp hot R = 12² / 21 = 6.857 Ω (V²/P).
	const rW1 = 1 * COPPER_RESISTIVITY_20C / 1 + 2 * JOINT_RESISTANCE;
	const rW2 = 0.5 * COPPER_RESISTIVITY_20C / 1 + 2 * JOINT_RESISTANCE;
	const rW3 = 0.5 * COPPER_RESISTIVITY_20C / 6 + 2 * JOINT_RESISTANCE;
	const rLamp = 144 / 21;
	const total = 0.02 + rW1 + rLamp + rW2 + rW3;
	const current = 12.6 / total;

	it('a lamp on a battery: current, terminal voltages and power', () => {
		const doc = lampCircuit('negative');
		const s = solve(doc, defaultScenario(doc));
		expect(s.converged).toBe(true);
		const c = s.circuit;
		const vFeed = s.at(c.terminalNode({ part: 'lamp', terminal: 'feed' }));
		const vEarth = s.at(c.terminalNode({ part: 'lamp', terminal: 'earth' }));
		// R ≈ 6.9164 Ω, so I ≈ 12.6 / 6.9164 ≈ 1.8217 A; lamp feed ≈ 12.6 − I (0.02 + 0.0212) ≈ 12.525 V.
		expect(current).toBeCloseTo(1.8217, 4);
		expect(vFeed).toBeCloseTo(12.6 - current * (0.02 + rW1), 9);
		expect(vEarth).toBeCloseTo(current * (rW2 + rW3), 9);
		expect(Math.abs(s.power.get('e1')!)).toBeLessThan(1e-12);
		expect(s.power.get('lamp')).toBeCloseTo(current * current * rLamp, 9);
		// The battery delivers EMF × I less its own I²R: negative power taken.
		// (to 1e-8 W: the 1e-12 S leakages take a few picoamperes)
		expect(s.power.get('bat')).toBeCloseTo(-(12.6 * current - current * current * 0.02), 8);
		// Energy balance: everything sums to zero.
		let sum = 0;
		for (const w of s.power.values()) sum += w;
		expect(Math.abs(sum)).toBeLessThan(1e-9);
	});

	it('a floating part reads 0 V (gmin leakage)', () => {
		const doc = lampCircuit('negative');
		const s = solve(doc, defaultScenario(doc));
		expect(s.at(s.circuit.terminalNode({ part: 'spare', terminal: 'feed' }))).toBe(0);
	});

	it('positive earth gives the mirror-image voltages', () => {
		const neg = lampCircuit('negative');
		const pos = lampCircuit('positive');
		const a = solve(neg, defaultScenario(neg));
		const b = solve(pos, defaultScenario(pos));
		for (const ref of [{ part: 'lamp', terminal: 'feed' }, { part: 'lamp', terminal: 'earth' }, { part: 'e1', terminal: 'stud' }]) {
			const va = a.at(a.circuit.terminalNode(ref));
			const vb = b.at(b.circuit.terminalNode(ref));
			expect(vb).toBeCloseTo(-va, 12);
		}
		expect(b.power.get('lamp')).toBeCloseTo(a.power.get('lamp')!, 12);
	});

	it('charging lifts the system to about 14 V (common practice: 13.5–14.5 V)', () => {
		const doc = lampCircuit('negative');
		const s = solve(doc, { ...defaultScenario(doc), engineRunning: true });
		const v = s.at(s.circuit.terminalNode({ part: 'bat', terminal: '+' }));
		expect(v).toBeGreaterThan(13.5);
		expect(v).toBeLessThan(14.5);
	});
});

/** A stabilizer feeding a thermal gauge and its sender. */
function gaugeCircuit(earth: Earth, emf: number, senderPos = 0.5) {
	const doc = assertDocument({
		schemaVersion: 1,
		vehicle: { systemVoltage: 12, earth },
		parts: [
			{ id: 'bat', key: '1', kind: 'battery', params: { emf } },
			{ id: 'st', key: '2', kind: 'stabilizer' },
			{ id: 'g', key: '3', kind: 'gauge' },
			{ id: 's', key: '4', kind: 'sender' },
			{ id: 'e', key: '5', kind: 'earth-point' }
		],
		wires: [
			{ id: 'a', from: { part: 'bat', terminal: term(earth, 'live') }, to: { part: 'st', terminal: 'in' }, code: 'W' },
			{ id: 'b', from: { part: 'st', terminal: 'out' }, to: { part: 'g', terminal: 'feed' }, code: 'LG' },
			{ id: 'c', from: { part: 'g', terminal: 'sender' }, to: { part: 's', terminal: 'feed' }, code: 'G/B' },
			{ id: 'd', from: { part: 's', terminal: 'earth' }, to: { part: 'e', terminal: 'stud' }, code: 'B' },
			{ id: 'f', from: { part: 'st', terminal: 'earth' }, to: { part: 'e', terminal: 'stud' }, code: 'B' },
			{ id: 'strap', from: { part: 'bat', terminal: term(earth, 'earthed') }, to: { part: 'e', terminal: 'stud' }, code: 'B' }
		]
	});
	return { doc, scenario: { ...defaultScenario(doc), senders: { s: senderPos } } };
}

describe('voltage stabilizer (averaged model)', () => {
	it('holds its output at the 10 V set-point above its earth (common practice: ≈ 10 V average on 12 V)', () => {
		for (const earth of ['negative', 'positive'] as const) {
			const { doc, scenario } = gaugeCircuit(earth, 12.6);
			const s = solve(doc, scenario);
			expect(s.converged).toBe(true);
			const c = s.circuit;
			const out = s.at(c.terminalNode({ part: 'st', terminal: 'out' }));
			const se = s.at(c.terminalNode({ part: 'st', terminal: 'earth' }));
			expect(c.polarity * (out - se)).toBeCloseTo(10, 6);
			expect(s.regulating.get('st')).toBe(true);
			// The average contact current is what flows on: gauge plus the bimetal heater behind the contacts.
			const contact = c.elements.findIndex((e) => e.ref.kind === 'part' && e.ref.role === 'regulator');
			const heater = c.elements.findIndex((e) => e.ref.kind === 'part' && e.ref.role === 'heater');
			const gauge = c.elements.findIndex((e) => e.ref.kind === 'part' && e.ref.part === 'g');
			expect(s.currents[contact]).toBeCloseTo(s.currents[gauge] + s.currents[heater], 9);
			// Gauge current ≈ 10 V / (58 + 83 Ω + wiring) ≈ 71 mA at half tank.
			expect(Math.abs(s.currents[gauge])).toBeCloseTo(10 / (58 + 83), 3);
		}
	});
	it('passes its input through when the input is below the set-point', () => {
		const { doc, scenario } = gaugeCircuit('negative', 9);
		const s = solve(doc, scenario);
		const c = s.circuit;
		expect(s.regulating.get('st')).toBe(false);
		const vin = s.at(c.terminalNode({ part: 'st', terminal: 'in' }));
		const out = s.at(c.terminalNode({ part: 'st', terminal: 'out' }));
		expect(vin - out).toBeGreaterThan(0);
		expect(vin - out).toBeLessThan(0.1); // 0.2 Ω contacts × (≈ 64 mA gauge + ≈ 0.22 A heater)
	});
	it('reads high when its earth is lost: the heater never opens the contacts (TRADE.md failure report)', () => {
		const { doc, scenario } = gaugeCircuit('negative', 12.6);
		const s = solve(doc, { ...scenario, disconnected: ['f'] });
		expect(s.regulating.get('st')).toBe(false);
		const out = s.at(s.circuit.terminalNode({ part: 'st', terminal: 'out' }));
		expect(out).toBeGreaterThan(12);
	});
});

describe('relays', () => {
	function hornCircuit(button: 'pressed' | 'released', buzzer = false) {
		const doc = assertDocument({
			schemaVersion: 1,
			vehicle: { systemVoltage: 12, earth: 'negative' },
			parts: [
				{ id: 'bat', key: '1', kind: 'battery' },
				{ id: 'k', key: '2', kind: 'relay' },
				{ id: 'push', key: '3', kind: 'switch', terminals: ['1', '2'], params: { positions: [{ name: 'released' }, { name: 'pressed', closed: [['1', '2']] }] } },
				{ id: 'horn', key: '4', kind: 'load', params: { resistance: 3 } },
				{ id: 'e', key: '5', kind: 'earth-point' }
			],
			wires: [
				{ id: 'strap', from: { part: 'bat', terminal: '-' }, to: { part: 'e', terminal: 'stud' }, code: 'B' },
				{ id: 'feed30', from: { part: 'bat', terminal: '+' }, to: { part: 'k', terminal: '30' }, code: 'N' },
				buzzer
					? { id: 'coil', from: { part: 'k', terminal: '87a' }, to: { part: 'k', terminal: '86' }, code: 'P' }
					: { id: 'coil', from: { part: 'bat', terminal: '+' }, to: { part: 'k', terminal: '86' }, code: 'P' },
				{ id: 'btn', from: { part: 'k', terminal: '85' }, to: { part: 'push', terminal: '1' }, code: 'P/B' },
				{ id: 'btnE', from: { part: 'push', terminal: '2' }, to: { part: 'e', terminal: 'stud' }, code: 'B' },
				{ id: 'hornFeed', from: { part: 'k', terminal: '87' }, to: { part: 'horn', terminal: '1' }, code: 'P' },
				{ id: 'hornE', from: { part: 'horn', terminal: '2' }, to: { part: 'e', terminal: 'stud' }, code: 'B' }
			]
		});
		return solve(doc, { switches: { push: button }, senders: {}, disconnected: [] });
	}
	it('pulls in when the horn push earths its coil', () => {
		const on = hornCircuit('pressed');
		expect(on.converged).toBe(true);
		expect(on.energised.has('k')).toBe(true);
		// Horn 3 Ω on ≈ 12.6 V: ≈ 4 A, ≈ 50 W.
		expect(on.power.get('horn')!).toBeGreaterThan(45);
		const off = hornCircuit('released');
		expect(off.energised.has('k')).toBe(false);
		expect(off.power.get('horn')!).toBeLessThan(1e-12);
	});
	it('reports a relay that feeds its own coil through its break contact as not settling', () => {
		const s = hornCircuit('pressed', true);
		expect(s.converged).toBe(false);
		expect(s.warnings[0]).toMatch(/did not settle .*: 2 kept changing/);
	});
});

describe('circuit elements', () => {
	it('keeps every wire end joint and every wire as its own conductance, and open ones at g = 0', () => {
		const doc = lampCircuit('negative');
		const c = buildCircuit(doc, { ...defaultScenario(doc), disconnected: ['w2'] });
		const joints = c.elements.filter((e) => e.ref.kind === 'joint');
		expect(joints).toHaveLength(6);
		expect(joints.filter((e) => e.g === 0)).toHaveLength(2);
		expect(c.elements.filter((e) => e.ref.kind === 'wire')).toHaveLength(3);
		const s = solveCircuit(c);
		expect(s.power.get('lamp')!).toBeLessThan(1e-12);
	});
});
