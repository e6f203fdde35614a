import { describe, expect, it } from 'vitest';
import { IEC_60757, TRADE_LETTERS } from '$lib/circuit/colours';
import { emptyDocument, parseDocument, type HarnessDocument } from '$lib/circuit/schema';
import { clipCentre, readClip, writeClip } from './clipboard';
import { addParts, addWire, copyItems, createPart, pasteItems } from './ops';

// Codes and names from IEC 60757 (GN green, YE yellow, BU blue, VT violet) and the trade
// single-letter set in palettes.ts (G green, Y yellow, U blue; no violet). The diagrams are invented.

function iecLoom(): HarnessDocument {
	let doc = emptyDocument({ systemVoltage: 12, earth: 'negative' }, 'iec-60757');
	const fuse = createPart(doc, 'fuse', { x: 100, y: 40 }, { id: 'fuse', key: '5', label: 'Horn fuse' });
	const horn = createPart(doc, 'load', { x: 300, y: 120 }, { id: 'horn', key: '6', label: 'Horn' });
	const earth = createPart(doc, 'earth-point', { x: 500, y: 200 }, { id: 'earth', key: '7' });
	doc = addParts(doc, [fuse, horn, earth]);
	doc = addWire(doc, { part: 'fuse', terminal: 'out' }, { part: 'horn', terminal: '1' }, { id: 'w1', code: 'GN/YE' }).doc;
	doc = addWire(doc, { part: 'horn', terminal: '2' }, { part: 'earth', terminal: 'stud' }, { id: 'w2', code: 'VT' }).doc;
	return doc;
}

describe('copied parts as text', () => {
	it('round-trips the parts, the wires among them and the palette, through JSON', () => {
		const doc = iecLoom();
		const clip = copyItems(doc, new Set(['fuse', 'horn']));
		const text = writeClip({ clip, palette: IEC_60757, diagramId: 'd-1' });
		expect(JSON.parse(text).loomwright).toBe('loomwright/parts');
		const back = readClip(text);
		expect(back).toEqual({ ok: true, copied: { clip, palette: IEC_60757, diagramId: 'd-1' } });
		// Only w1 runs between fuse and horn; w2 ends on the earth point, left out.
		expect(clip.wires.map((w) => w.id)).toEqual(['w1']);
	});

	it('ignores other text, and names the path of damaged Loomwright text', () => {
		expect(readClip('G/B 1.0 mm²')).toBeNull();
		expect(readClip('{"parts": []}')).toBeNull();
		const text = JSON.parse(writeClip({ clip: copyItems(iecLoom(), new Set(['fuse'])), palette: IEC_60757 }));
		text.parts[0].kind = 'flux-capacitor';
		const r = readClip(JSON.stringify(text));
		expect(r?.ok).toBe(false);
		expect(r && !r.ok && r.error).toMatch(/^The copied parts cannot be read \(parts\[0\]\.kind: /);
	});

	it('pastes into a diagram with another palette: codes rewritten by colour, a missing colour noted', () => {
		const from = iecLoom();
		const text = writeClip({ clip: copyItems(from, new Set(['fuse', 'horn', 'earth'])), palette: IEC_60757 });
		const read = readClip(text);
		if (!read?.ok) throw new Error('not read');
		const into = emptyDocument({ systemVoltage: 12, earth: 'negative' }, 'trade-letters');
		const r = pasteItems(into, read.copied.clip, { x: 0, y: 0 }, read.copied.palette);
		const parsed = parseDocument(JSON.parse(JSON.stringify(r.doc)));
		expect(parsed.ok).toBe(true);
		// GN/YE green/yellow → G/Y; VT violet has no trade-letter colour: first colour (B, black), noted.
		expect(r.doc.wires.map((w) => w.code)).toEqual(['G/Y', TRADE_LETTERS.colours[0].code]);
		expect(r.recoded).toEqual(['VT']);
		expect(r.doc.wires[1].notes).toBe('Pasted with code VT, which this diagram’s palette has no colour for.');
		// Fresh ids; the wires join the pasted parts, not the originals.
		expect(r.partIds.some((id) => ['fuse', 'horn', 'earth'].includes(id))).toBe(false);
		expect(r.doc.wires.every((w) => r.partIds.includes(w.from.part) && r.partIds.includes(w.to.part))).toBe(true);
		// Key numbers free in the new diagram are kept.
		expect(r.doc.parts.map((p) => p.key)).toEqual(['5', '6', '7']);
	});

	it('finds the middle of the copied parts (by their corners: x 100…500, y 40…200)', () => {
		expect(clipCentre(copyItems(iecLoom(), new Set(['fuse', 'horn', 'earth'])))).toEqual({ x: 300, y: 120 });
	});
});
