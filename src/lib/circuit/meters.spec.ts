import { describe, expect, it } from 'vitest';
import { assertDocument } from './schema';
import { defaultScenario } from './scenario';
import { measureDrop, measureOhms, measureVolts, testLamp } from './meters';

/**
 * Battery → fuse → feed wire → a 2 Ω corroded joint (drawn as a resistor) → lamp holder wire,
 * bulb removed. All wires 1 mm², 0.5 m.
 */
function corroded(systemVoltage: 6 | 12, joint = 2) {
	const doc = assertDocument({
		schemaVersion: 1,
		vehicle: { systemVoltage, earth: 'positive' },
		parts: [
			{ id: 'bat', key: '1', kind: 'battery', params: { internalResistance: 0.02 } },
			{ id: 'f', key: '2', kind: 'fuse' },
			{ id: 'joint', key: '3', kind: 'resistor', params: { resistance: joint } },
			{ id: 'lamp', key: '4', kind: 'lamp', params: { watts: 21 } },
			{ id: 'e', key: '5', kind: 'earth-point' }
		],
		wires: [
			{ id: 'strap', from: { part: 'bat', terminal: '+' }, to: { part: 'e', terminal: 'stud' }, code: 'B', lengthM: 0.5 },
			{ id: 'a', from: { part: 'bat', terminal: '-' }, to: { part: 'f', terminal: 'in' }, code: 'N', lengthM: 0.5 },
			{ id: 'b', from: { part: 'f', terminal: 'out' }, to: { part: 'joint', terminal: '1' }, code: 'R', lengthM: 0.5 },
			{ id: 'c', from: { part: 'joint', terminal: '2' }, to: { part: 'lamp', terminal: 'feed' }, code: 'R', lengthM: 0.5 },
			{ id: 'd', from: { part: 'lamp', terminal: 'earth' }, to: { part: 'e', terminal: 'stud' }, code: 'B', lengthM: 0.5 }
		]
	});
	// Bulb out of its holder: probe the holder's contact, the lamp end of wire c.
	return { doc, scenario: { ...defaultScenario(doc), disconnected: ['lamp'] }, point: { wire: 'c', end: 'to' } as const };
}

describe('a 2 Ω corroded joint: full voltage on a DMM, a dim test lamp (worked by hand)', () => {
	it('6 V: DMM ≈ 6.3 V, 5 W lamp at about two-thirds power', () => {
		const { doc, scenario, point } = corroded(6);
		// Source side: Rint 0.02 + fuse 0.005 + 3 wires of 0.5/58 Ω + 5 joints of 0.002 Ω (the probe
		// sits behind the sixth) + 2 Ω ≈ 2.061 Ω.
		const rs = 0.02 + 0.005 + 3 * (0.5 / 58) + 5 * 0.002 + 2;
		// Earth side of the meter: the strap, 0.5/58 + 0.004 and the earth point 0.005 — not in
		// the meter's loop (the black lead is on the battery post), so only rs counts.
		const dmm = measureVolts(doc, scenario, point);
		// 10 MΩ meter: V = 6.3 × 10e6 / (10e6 + 2.061) = 6.3 − 1.3 µV. Negative: positive earth.
		expect(dmm.volts).toBeCloseTo(-6.3 * 10e6 / (10e6 + rs), 9);
		expect(Math.abs(dmm.volts)).toBeGreaterThan(6.2999);
		// 5 W 6 V test lamp: R = 36/5 = 7.2 Ω; I = 6.3/(7.2 + 2.061) = 0.680 A; V = 4.90 V; P = 3.33 W.
		const lamp = testLamp(doc, scenario, point, { watts: 5 });
		const i = 6.3 / (7.2 + rs);
		expect(lamp.current).toBeCloseTo(i, 6);
		expect(lamp.volts).toBeCloseTo(i * 7.2, 6);
		expect(lamp.brightness).toBeCloseTo((i * i * 7.2) / 5, 6);
		expect(lamp.brightness).toBeLessThan(0.7); // visibly dim
	});
	it('12 V: DMM within 10 µV of 12.6 V, the test lamp loses an eighth of its power and shows a 0.8 V drop', () => {
		const { doc, scenario, point } = corroded(12);
		const good = corroded(12, 0.001);
		const dmm = measureVolts(doc, scenario, point);
		expect(Math.abs(dmm.volts)).toBeGreaterThan(12.6 - 1e-5);
		const dim = testLamp(doc, scenario, point, { watts: 5 });
		const bright = testLamp(good.doc, good.scenario, good.point, { watts: 5 });
		// 28.8 Ω lamp: on the corroded feed V = 12.6 × 28.8 / 30.863 ≈ 11.76 V, 4.80 W;
		// on a sound feed ≈ 12.58 V, 5.49 W. Power ratio ≈ 0.875; light falls faster still.
		expect(dim.volts).toBeCloseTo((12.6 * 28.8) / (28.8 + 0.02 + 0.005 + 3 * (0.5 / 58) + 5 * 0.002 + 2), 6);
		expect(dim.brightness / bright.brightness).toBeLessThan(0.9);
		expect(bright.volts - dim.volts).toBeGreaterThan(0.8);
	});
	it('volt drop across the joint: nothing without load, the whole story with the bulb in', () => {
		const { doc, scenario } = corroded(12);
		const across = [{ part: 'joint', terminal: '1' }, { part: 'joint', terminal: '2' }] as const;
		const idle = measureDrop(doc, scenario, across[0], across[1]);
		expect(Math.abs(idle.volts)).toBeLessThan(1e-5);
		// 21 W bulb in: 6.857 Ω; I ≈ 12.6 / (6.857 + 2.063 + earth side ≈ 0.035) ≈ 1.407 A; drop ≈ 2.81 V.
		const loaded = measureDrop(doc, { ...scenario, disconnected: [] }, across[0], across[1]);
		expect(Math.abs(loaded.volts)).toBeGreaterThan(2.7);
		expect(Math.abs(loaded.volts)).toBeLessThan(2.9);
	});
});

describe('ohms with the battery disconnected', () => {
	it('reads a resistor through its joints, and OL across an open circuit', () => {
		const { doc, scenario } = corroded(12);
		// 2 Ω resistor + 2 joints of 0.002 Ω: with 1 mA the meter reads 2.004 Ω.
		const r = measureOhms(doc, scenario, { wire: 'b', end: 'to' }, { wire: 'c', end: 'from' });
		expect(r.ohms).toBeCloseTo(2.004, 6);
		const open = measureOhms(doc, scenario, { part: 'f', terminal: 'in' }, 'chassis');
		expect(open.overLimit).toBe(true);
		// The lamp in place: 12² / 21 = 6.857 Ω hot (a cold filament reads lower in life).
		const lamp = measureOhms(doc, { ...scenario, disconnected: [] }, { part: 'lamp', terminal: 'feed' }, { part: 'lamp', terminal: 'earth' });
		// With the battery out, nothing is in parallel with the filament.
		expect(lamp.ohms).toBeCloseTo(144 / 21, 6);
	});
	it('the battery is out of the loop even though it is drawn in', () => {
		const { doc, scenario } = corroded(12);
		// The − lead, off its post, to the chassis: wire a → fuse → b → 2 Ω → c → lamp → d → earth point.
		// Not through the battery: had it stayed in, its 0.02 Ω and the strap would short the path.
		const r = measureOhms(doc, { ...scenario, disconnected: [] }, { wire: 'a', end: 'from' }, 'chassis');
		const expected = 0.5 / 58 + 0.002 + 0.005 + 2 * (0.5 / 58 + 0.004) + 2 + 144 / 21 + (0.5 / 58 + 0.004) + 0.005;
		expect(r.ohms).toBeCloseTo(expected, 6);
	});
});
