import { describe, expect, it } from 'vitest';
import {
	chargingVoltage,
	earthedTerminal,
	lampResistance,
	liveTerminal,
	resolveParams,
	restVoltage,
	senderResistance,
	stabilizerSetPoint,
	PARAM_SCHEMAS
} from './parts';

describe('lamp hot resistance', () => {
	// R = V²/P follows from P = V·I and V = I·R (Ohm's law), worked by hand:
	// 12² / 21 = 144 / 21 = 6.857 Ω; 12² / 5 = 28.8 Ω; 6² / 36 = 1 Ω.
	it.each([
		[12, 21, 6.857],
		[12, 5, 28.8],
		[6, 36, 1.0],
		[12, 60, 2.4]
	])('%s V %s W → %s Ω', (v, w, r) => {
		expect(lampResistance(v, w)).toBeCloseTo(r, 3);
	});
});

describe('system voltage defaults (common practice, TRADE.md)', () => {
	it('battery at rest ≈ 12.6 V, charging ≈ 14 V, stabilized gauges ≈ 10 V on 12 V', () => {
		expect(restVoltage(12)).toBeCloseTo(12.6, 6);
		expect(Math.abs(chargingVoltage(12) - 14)).toBeLessThan(0.5);
		expect(stabilizerSetPoint(12)).toBeCloseTo(10, 6);
		expect(restVoltage(6)).toBeCloseTo(6.3, 6);
		expect(stabilizerSetPoint(24)).toBeCloseTo(20, 6);
	});
	it('resolveParams fills the voltage-dependent defaults', () => {
		const v = { systemVoltage: 12, earth: 'negative' } as const;
		const bat = resolveParams('battery', PARAM_SCHEMAS.battery.parse({}), v);
		expect(bat.emf).toBeCloseTo(12.6, 9);
		expect(resolveParams('lamp', PARAM_SCHEMAS.lamp.parse({ watts: 21 }), v).volts).toBe(12);
		expect(resolveParams('stabilizer', PARAM_SCHEMAS.stabilizer.parse({}), { ...v, systemVoltage: 6 }).setPoint).toBeCloseTo(5, 9);
		const relay = resolveParams('relay', PARAM_SCHEMAS.relay.parse({ pullIn: 8 }), v);
		expect(relay.pullIn).toBe(8);
		expect(relay.dropOut).toBe(3);
	});
	it('positive earth earths the + terminal', () => {
		expect(earthedTerminal('positive')).toBe('+');
		expect(liveTerminal('positive')).toBe('-');
		expect(liveTerminal('negative')).toBe('+');
	});
});

describe('sender resistance', () => {
	// TRADE.md: fuel sender ≈ 145 Ω empty to 21 Ω full (enthusiast measurement).
	it('moves linearly between its ends for a float sender', () => {
		const p = PARAM_SCHEMAS.sender.parse({});
		expect(senderResistance(p, 0)).toBe(145);
		expect(senderResistance(p, 1)).toBe(21);
		expect(senderResistance(p, 0.5)).toBe(83);
	});
	it('follows a thermistor-like curve for a temperature sender', () => {
		// TRADE.md: 150 Ω at 60 °C … 24 Ω at 120 °C; 77 Ω at 80 °C, 41 Ω at 100 °C.
		// Geometric interpolation at 1/3 and 2/3 of the span gives 81.4 Ω and 44.2 Ω: within 10 % of the measurement.
		const p = PARAM_SCHEMAS.sender.parse({ ohmsAt0: 150, ohmsAt1: 24, taper: 'logarithmic' });
		expect(Math.abs(senderResistance(p, 1 / 3) - 77) / 77).toBeLessThan(0.1);
		expect(Math.abs(senderResistance(p, 2 / 3) - 41) / 41).toBeLessThan(0.1);
	});
});
