// Wire cross-sections as a person writes them in a table: "1", "1.5 mm²", "0,75mm2", "16 AWG".
import type { WireSize } from '$lib/circuit/wires';

export function formatSize(size: WireSize): string {
	return 'mm2' in size ? `${size.mm2} mm²` : `${size.awg < 0 ? '0'.repeat(1 - size.awg) : size.awg} AWG`;
}

/**
 * Reads a cross-section. A bare number is mm² (the unit of ISO 6722 and of most manuals using
 * metric sizes); AWG needs the word. 0, 00, 000, 0000 AWG are gauges 0, −1, −2, −3 (ASTM B258).
 */
export function parseSize(text: string): { ok: true; size: WireSize } | { ok: false; error: string } {
	const t = text.trim().toLowerCase().replace(',', '.');
	const awg = t.match(/^(\d+(?:\.\d+)?)\s*(?:awg|ga|gauge)$/) ?? t.match(/^(?:awg)\s*(\d+)$/);
	if (awg) {
		const digits = awg[1];
		if (!/^\d+$/.test(digits)) return { ok: false, error: `“${text}”: an AWG gauge is a whole number.` };
		const n = /^0{2,}$/.test(digits) ? 1 - digits.length : Number(digits);
		if (n < -3 || n > 40) return { ok: false, error: `“${text}”: AWG runs from 0000 to 40.` };
		return { ok: true, size: { awg: n } };
	}
	const mm = t.match(/^(\d+(?:\.\d+)?|\.\d+)\s*(?:mm²|mm2|mm\^2|sq\s*mm|qmm)?$/);
	if (mm) {
		const n = Number(mm[1]);
		if (!(n > 0) || n > 200) return { ok: false, error: `“${text}”: a cross-section is above 0 and at most 200 mm².` };
		return { ok: true, size: { mm2: n } };
	}
	return { ok: false, error: `“${text}” is not a size; write it like 1.5 mm² or 16 AWG.` };
}
