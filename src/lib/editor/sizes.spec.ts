import { describe, expect, it } from 'vitest';
import { formatSize, parseSize } from './sizes';

// Gauge numbering 0000…0 as −3…0 follows ASTM B258; metric sizes in mm² as ISO 6722 lists them
// (0.5, 0.75, 1, 1.5, 2.5 …; common practice).
describe('parseSize', () => {
	it.each([
		{ text: '1', size: { mm2: 1 } },
		{ text: '1.5 mm²', size: { mm2: 1.5 } },
		{ text: '0,75mm2', size: { mm2: 0.75 } },
		{ text: '.5', size: { mm2: 0.5 } },
		{ text: '16 AWG', size: { awg: 16 } },
		{ text: '14awg', size: { awg: 14 } },
		{ text: '00 AWG', size: { awg: -1 } },
		{ text: '0000 awg', size: { awg: -3 } }
	])('reads $text', ({ text, size }) => {
		expect(parseSize(text)).toEqual({ ok: true, size });
	});
	it.each(['', 'thick', '0', '300 mm²', '16.5 AWG', '45 AWG'])('refuses “%s” with a reason', (text) => {
		const r = parseSize(text);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.error.length).toBeGreaterThan(10);
	});
	it('writes sizes back the same way', () => {
		expect(formatSize({ mm2: 1.5 })).toBe('1.5 mm²');
		expect(formatSize({ awg: 16 })).toBe('16 AWG');
		expect(formatSize({ awg: -2 })).toBe('000 AWG');
		for (const s of [{ mm2: 0.75 }, { awg: 12 }, { awg: -3 }]) expect(parseSize(formatSize(s))).toEqual({ ok: true, size: s });
	});
});
