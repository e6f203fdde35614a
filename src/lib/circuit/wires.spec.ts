import { describe, expect, it } from 'vitest';
import { awgDiameterMm, awgAreaMm2, ohmsPerKm, wireResistance, COPPER_RESISTIVITY_20C } from './wires';

describe('wire resistance against IEC 60228', () => {
	// IEC 60228:2004 Table 3, class 5 (flexible) plain annealed copper conductors:
	// maximum resistance at 20 °C in Ω/km (from memory, as tabulated in cable makers' catalogues).
	// A nominal cross-section of pure copper must come out below the maximum, and not far below
	// (stranding and tolerances add roughly 10–15 %).
	it.each([
		[0.5, 39.0],
		[0.75, 26.0],
		[1.0, 19.5],
		[1.5, 13.3],
		[2.5, 7.98],
		[4, 4.95],
		[6, 3.3]
	])('%s mm² is within the class 5 maximum of %s Ω/km', (mm2, max) => {
		const r = ohmsPerKm({ mm2 });
		expect(r).toBeLessThanOrEqual(max);
		expect(r).toBeGreaterThan(0.85 * max);
	});
	it('uses the IEC 60028 annealed copper resistivity 1/58 Ω·mm²/m', () => {
		expect(COPPER_RESISTIVITY_20C).toBeCloseTo(0.017241, 6);
		expect(wireResistance({ size: { mm2: 1 }, lengthM: 1 })).toBeCloseTo(0.017241, 6);
	});
	it('rises with temperature by α = 0.00393 /K (IEC 60028)', () => {
		const r20 = wireResistance({ size: { mm2: 1 }, lengthM: 2 });
		const r80 = wireResistance({ size: { mm2: 1 }, lengthM: 2, temperatureC: 80 });
		expect(r80 / r20).toBeCloseTo(1 + 0.00393 * 60, 12);
	});
	it('refuses nonsense with a clear error', () => {
		expect(() => wireResistance({ size: { mm2: 0 }, lengthM: 1 })).toThrow(/cross-section/);
		expect(() => wireResistance({ size: { mm2: 1 }, lengthM: -1 })).toThrow(/length/);
		expect(() => awgDiameterMm(41)).toThrow(/gauge 41/);
	});
});

describe('AWG', () => {
	// ASTM B258 defines d = 0.005 in × 92^((36 − n)/39); published table values in inches
	// (rounded to 0.0001 in), e.g. in the ASTM B258 table and engineering handbooks.
	it.each([
		[-3, 0.46],
		[0, 0.3249],
		[10, 0.1019],
		[12, 0.0808],
		[14, 0.0641],
		[16, 0.0508],
		[18, 0.0403],
		[20, 0.032],
		[22, 0.0253],
		[36, 0.005]
	])('AWG %s is %s in', (awg, inches) => {
		expect(Math.abs(awgDiameterMm(awg) / 25.4 - inches)).toBeLessThan(0.00006);
	});
	it('area follows the diameter; AWG 18 ≈ 0.823 mm² (ASTM B258 table)', () => {
		expect(awgAreaMm2(18)).toBeCloseTo(0.823, 3);
		expect(wireResistance({ size: { awg: 18 }, lengthM: 1 })).toBeCloseTo(COPPER_RESISTIVITY_20C / awgAreaMm2(18), 12);
	});
});
