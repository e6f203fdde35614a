// The benchmarks' meter: what a person reads for a true value stays within the meter's stated
// accuracy, as a ±(% + counts) specification covers the displayed reading (TRADE.md, "Meters").
import { describe, expect, it } from 'vitest';
import { ENTRY_DMM } from '../meter';
import { prng } from './generate';
import { meterShows } from './worlds';

describe('meterShows', () => {
	it('shows 0.01 V steps and never strays past ±(0.5 % + 2 counts) of the true volts, rounding included', () => {
		const rng = prng(11);
		for (let i = 0; i < 2000; i++) {
			const truth = rng.range(-14, 14);
			const shown = meterShows('volts', truth, ENTRY_DMM.volts, ENTRY_DMM, rng) as number;
			expect(Math.abs(shown * 100 - Math.round(shown * 100))).toBeLessThan(1e-9);
			expect(Math.abs(shown - truth)).toBeLessThanOrEqual(ENTRY_DMM.volts.abs + ENTRY_DMM.volts.rel * Math.abs(truth) + 1e-9);
		}
	});
	it('without a generator shows the display only, and "OL" over the ohms range', () => {
		expect(meterShows('drop', 0.0049, ENTRY_DMM.volts, ENTRY_DMM, null)).toBe(0);
		expect(meterShows('volts', 12.345, ENTRY_DMM.volts, ENTRY_DMM, null)).toBe(12.35);
		expect(meterShows('ohms', 5e7, ENTRY_DMM.ohms, ENTRY_DMM, null)).toBe('OL');
	});
});
