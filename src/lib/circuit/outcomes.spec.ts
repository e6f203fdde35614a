import { describe, expect, it } from 'vitest';
import {
	acceptRange,
	binReadings,
	checkTable,
	consistent,
	formatRange,
	maxOutcomes,
	placeReading,
	TableError,
	toldApart,
	toleranceAt,
	type Tolerance
} from './outcomes';
import { randomReadings, rng } from './testing/tables';

// An entry-level 3½-digit meter on its 20 V range: ±(0.5 % of reading + 2 counts), one count
// = 10 mV (TRADE.md "Meters": the resolution is a fact of 3½ digits; the accuracy figure is
// from memory and is a meter-profile setting).
const dmm20V: Tolerance = { abs: 0.02, rel: 0.005 };

describe('toleranceAt / toldApart (worked by hand)', () => {
	it('gives ±0.083 V at 12.60 V', () => {
		// 0.5 % × 12.60 = 0.063, plus 2 × 0.01 = 0.02 → 0.083.
		expect(toleranceAt(dmm20V, 12.6)).toBeCloseTo(0.083, 12);
		expect(acceptRange(dmm20V, 12.6)).toEqual({ low: expect.closeTo(12.517, 12), high: expect.closeTo(12.683, 12) });
	});

	it('cannot tell a 12.60 V prediction from 12.45 V, can tell it from 12.20 V', () => {
		// t(12.45) = 0.06225 + 0.02 = 0.08225; combined 0.16525 > 0.15 apart → not told apart.
		expect(toldApart(dmm20V, 12.6, 12.45)).toBe(false);
		// t(12.20) = 0.061 + 0.02 = 0.081; combined 0.164 < 0.40 apart → told apart.
		expect(toldApart(dmm20V, 12.6, 12.2)).toBe(true);
	});

	it('widens the tolerance by the swing of a pulsing stabilizer output', () => {
		// About 10 V average from a bimetal stabilizer (TRADE.md); a ±1 V swing on the display is
		// an invented figure for the example. t(10) = 0.02 + 0.05 + 1 = 1.07 → 8.93–11.07 V.
		const gauge: Tolerance = { ...dmm20V, band: 1 };
		expect(acceptRange(gauge, 10)).toEqual({ low: expect.closeTo(8.93, 12), high: expect.closeTo(11.07, 12) });
		// Stuck closed (full battery voltage) is told apart; a low output of 8 V is not
		// (t(8) = 1.06 → up to 9.06 V, which overlaps 8.93 V).
		expect(toldApart(gauge, 10, 12.6)).toBe(true);
		expect(toldApart(gauge, 10, 8)).toBe(false);
	});

	it('judges a measured reading against the predicted one', () => {
		expect(consistent(dmm20V, 12.6, 12.52)).toBe(true);
		expect(consistent(dmm20V, 12.6, 12.5)).toBe(false);
	});
});

describe('binReadings', () => {
	it('bins feed readings of four suspects (worked by hand)', () => {
		// Suspects: 0 healthy feed 12.60, 1 open wire 0.00, 2 high-resistance joint 11.20,
		// 3 earth open (no current, no drop) 12.66. 12.60 and 12.66 overlap (0.06 ≤ 0.083 + 0.0833).
		const out = binReadings([12.6, 0, 11.2, 12.66], dmm20V);
		expect(out.unread).toEqual([]);
		expect(out.bins.map((b) => b.suspects)).toEqual([[1], [2], [0, 3]]);
		expect(out.bins[2].predicted).toEqual({ low: 12.6, high: 12.66 });
		// 12.60 − 0.083 = 12.517; 12.66 + (0.0633 + 0.02) = 12.7433.
		expect(out.bins[2].accepts.low).toBeCloseTo(12.517, 12);
		expect(out.bins[2].accepts.high).toBeCloseTo(12.7433, 12);
		expect(placeReading(out, 12.7)).toBe(2);
		expect(placeReading(out, 0.01)).toBe(0);
		// 6 V is within tolerance of nobody: no bin matches.
		expect(placeReading(out, 6)).toBeNull();
	});

	it('keeps suspects without a defined reading out of the bins', () => {
		const out = binReadings([12.6, null, 0], dmm20V);
		expect(out.unread).toEqual([1]);
		expect(out.bins.map((b) => b.suspects)).toEqual([[2], [0]]);
	});

	it('chains readings that are pairwise within tolerance, and unchains them in a subset', () => {
		// ±0.08 flat: 0 ~ 0.15 (0.15 ≤ 0.16) and 0.15 ~ 0.30, yet 0 and 0.30 are told apart.
		// This is the non-transitivity of tolerance: all three share one bin.
		const tol: Tolerance = { abs: 0.08, rel: 0 };
		const r = [0, 0.15, 0.3];
		expect(toldApart(tol, 0, 0.3)).toBe(true);
		expect(binReadings(r, tol).bins.map((b) => b.suspects)).toEqual([[0, 1, 2]]);
		// Without the middle suspect the chain breaks into two bins.
		expect(binReadings(r, tol, [0, 2]).bins.map((b) => b.suspects)).toEqual([[0], [2]]);
		// At most two of the three can be pairwise told apart.
		expect(maxOutcomes(r, tol)).toBe(2);
	});

	// Against the definition: bins are the connected components of the graph "acceptance
	// intervals overlap", computed here by brute force over all pairs with a union-find.
	it('equals the components of the overlap graph on 300 random probes', () => {
		const random = rng(20261201);
		for (let k = 0; k < 300; k++) {
			const n = 1 + Math.floor(random() * 9);
			const tol: Tolerance = { abs: random() * 0.5, rel: random() * 0.05, band: random() < 0.3 ? random() : undefined };
			const readings = randomReadings(random, n, 0.15);
			const parent = readings.map((_, i) => i);
			const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
			for (let a = 0; a < n; a++)
				for (let b = a + 1; b < n; b++) {
					const ra = readings[a];
					const rb = readings[b];
					if (ra !== null && rb !== null && !toldApart(tol, ra, rb)) parent[find(a)] = find(b);
				}
			const expected = new Map<number, number[]>();
			readings.forEach((r, i) => {
				if (r !== null) expected.set(find(i), [...(expected.get(find(i)) ?? []), i]);
			});
			const out = binReadings(readings, tol);
			const got = out.bins.map((b) => b.suspects.join(',')).sort();
			expect(got).toEqual([...expected.values()].map((g) => g.join(',')).sort());
			expect(out.unread).toEqual(readings.flatMap((r, i) => (r === null ? [i] : [])));
			// Bins come in ascending order and their ranges never overlap.
			for (let i = 1; i < out.bins.length; i++) expect(out.bins[i].accepts.low).toBeGreaterThan(out.bins[i - 1].accepts.high);
			// Any reading inside a bin's range is consistent with at least one suspect of that bin.
			for (const b of out.bins) {
				const x = b.accepts.low + random() * (b.accepts.high - b.accepts.low);
				expect(b.suspects.some((s) => consistent(tol, readings[s]!, x))).toBe(true);
				expect(placeReading(out, x)).toBe(out.bins.indexOf(b));
			}
			// maxOutcomes against the largest pairwise told-apart subset, by enumeration.
			let best = 0;
			for (let mask = 1; mask < 1 << n; mask++) {
				const pick = readings.flatMap((r, i) => ((mask >> i) & 1 && r !== null ? [r] : []));
				if (pick.length <= best) continue;
				if (pick.every((x, i) => pick.every((y, j) => i === j || toldApart(tol, x, y)))) best = pick.length;
			}
			expect(maxOutcomes(readings, tol)).toBe(best);
		}
	});
});

describe('checkTable', () => {
	it('names each problem by its path', () => {
		const bad = {
			suspects: [
				{ id: 'a', prior: 1 },
				{ id: 'a', prior: 0 }
			],
			probes: [{ id: 'p', cost: 0, tolerance: { abs: -1, rel: 0 } }],
			readings: [[1, Number.POSITIVE_INFINITY]]
		};
		try {
			checkTable(bad, 'minimalProbeSet');
			expect.unreachable();
		} catch (e) {
			expect(e).toBeInstanceOf(TableError);
			const msg = (e as TableError).message;
			expect(msg).toMatch(/^minimalProbeSet: invalid prediction table/);
			expect((e as TableError).problems).toEqual([
				'suspects[1].id: duplicate id "a"',
				'suspects[1].prior: must be a finite number > 0, got 0',
				'probes[0].cost: must be a finite number > 0, got 0',
				'probes[0].tolerance.abs: must be a finite number ≥ 0, got -1',
				'readings[0][1]: must be a finite number or null, got Infinity'
			]);
		}
	});

	it('reports a readings row of the wrong length', () => {
		expect(() =>
			checkTable({ suspects: [{ id: 'a', prior: 1 }], probes: [{ id: 'p', cost: 1, tolerance: dmm20V }], readings: [[1, 2]] })
		).toThrow(/readings\[0\]: has 2 entries, expected one per suspect \(1\)/);
	});
});

describe('formatRange', () => {
	it('prints with an en dash and the unit', () => {
		expect(formatRange({ low: 8.93, high: 11.07 }, 'V', 1)).toBe('8.9–11.1 V');
		expect(formatRange({ low: 0, high: 0 }, 'V', 1)).toBe('0.0 V');
	});
	it('writes a minus sign (U+2212, ISO 80000-1) and "to" below zero, and no sign on a rounded zero', () => {
		expect(formatRange({ low: -12.6, high: -12.43 }, 'V')).toBe('\u221212.60 to \u221212.43 V');
		expect(formatRange({ low: -0.02, high: 0.02 }, 'V')).toBe('\u22120.02 to 0.02 V');
		expect(formatRange({ low: -0.001, high: 0.001 }, 'V')).toBe('0.00 V');
	});
});
