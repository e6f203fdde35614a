import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { defaultScenario } from '$lib/circuit/scenario';
import { brightnessDetail, brightnessWords, formatVolts, senderOhms, terminalReading } from './readings';

const doc = demoHarness();
const on = defaultScenario(doc);

describe('terminalReading on the demo (12 V, positive earth)', () => {
	it('a gauge feed reads the stabilized ~10 V, negative on positive earth, and fluctuates', () => {
		// About 10 V average on a 12 V system (common practice, DESIGN.md); positive earth: feeds read negative.
		const r = terminalReading(doc, on, { part: 'fuel-gauge', terminal: 'feed' });
		expect(r.volts.volts).toBeGreaterThan(-10.2);
		expect(r.volts.volts).toBeLessThan(-9.8);
		expect(r.volts.pulsing).toBe(true);
		expect(r.voltsText).toMatch(/^-(9\.[89]\d|10\.[01]\d) V$/);
		expect(r.lamp.brightness).toBeGreaterThan(0.3);
		expect(r.blackLead).toContain('+');
	});

	it('the battery post at rest reads near 12.6 V', () => {
		// A charged 12 V lead-acid battery rests near 12.6 V (common practice, TRADE.md); the ignition loads draw a little.
		const r = terminalReading(doc, on, { part: 'battery', terminal: '-' });
		expect(Math.abs(r.volts.volts)).toBeGreaterThan(12.3);
		expect(Math.abs(r.volts.volts)).toBeLessThan(12.7);
		expect(r.volts.pulsing).toBe(false);
		expect(r.lampText.startsWith('full')).toBe(true);
	});

	it('ignition off: the gauge feed is dead and a test lamp stays dark', () => {
		const off = { ...on, switches: { ...on.switches, ignition: 'off' } };
		const r = terminalReading(doc, off, { part: 'fuel-gauge', terminal: 'feed' });
		expect(r.voltsText).toBe('0.00 V');
		expect(r.lampText).toBe('dark (no glow)');
	});
});

describe('formatting', () => {
	// Worked by hand: two decimals, the sign kept, no "-0.00".
	it.each([
		[-10.028, '-10.03 V'],
		[12.6, '12.60 V'],
		[-0.001, '0.00 V'],
		[0, '0.00 V']
	])('formatVolts(%d) = %s', (v, text) => expect(formatVolts(v)).toBe(text));

	it.each([
		// Above rated power the eye sees full brightness: no percentage above 100 in the words (common practice).
		[1.09, 'full brightness (bulb above its rated voltage)'],
		[1.0, 'full (100 % of full brightness)'],
		[0.7, 'dim (70 % of full brightness)'],
		[0.05, 'very dim (5 % of full brightness)'],
		[0.001, 'dark (no glow)']
	])('brightnessWords(%d) = %s', (b, text) => expect(brightnessWords(b)).toBe(text));

	it('sender ohms: the demo fuel sender is linear 145 Ω empty to 21 Ω full', () => {
		const sender = doc.parts.find((p) => p.id === 'fuel-sender');
		if (sender?.kind !== 'sender') throw new Error('demo has no fuel sender');
		// By hand: 145 + (21 − 145) × 0.6 = 70.6 Ω.
		expect(senderOhms(sender, 0.6)).toBeCloseTo(70.6, 9);
		expect(senderOhms(sender, 0)).toBe(145);
	});
});

describe('brightnessDetail', () => {
	it('keeps the number above 100 % for the detail, and nothing below', () => {
		expect(brightnessDetail(1.09)).toBe('109 % of the bulb\u2019s rated power');
		expect(brightnessDetail(0.7)).toBeNull();
	});
});
