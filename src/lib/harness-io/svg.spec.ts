import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { TRADE_LETTERS } from '../circuit/colours';
import { parseDocument, type HarnessDocument } from '../circuit/schema';
import { partGeometry } from '../editor/geometry';
import { drawingSvg, xmlEscape } from './svg';

/** Element nesting check (XML 1.0 §3: every start tag has its end tag, properly nested). */
function balanced(svg: string): boolean {
	const stack: string[] = [];
	const body = svg.replace(/<\?xml[^>]*\?>/, '');
	for (const m of body.matchAll(/<(\/?)([A-Za-z][\w:-]*)([^>]*?)(\/?)>/g)) {
		const [, close, name, , self] = m;
		if (self) continue;
		if (close) {
			if (stack.pop() !== name) return false;
		} else stack.push(name);
	}
	return stack.length === 0;
}

const colour = (code: string) => TRADE_LETTERS.colours.find((c) => c.code === code)!.display;

function doc(raw: unknown): HarnessDocument {
	const r = parseDocument(raw);
	if (!r.ok) throw new Error(JSON.stringify(r.errors));
	return r.document;
}

const small = doc({
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'negative' },
	parts: [
		{ id: 'f', key: '6', kind: 'fuse', label: 'Fuse <A&B>', position: { x: 100, y: 50 } },
		{ id: 'l', key: '14', kind: 'lamp', label: 'Panel lamp', position: { x: 400, y: 50 } }
	],
	wires: [{ id: 'w', from: { part: 'f', terminal: 'out' }, to: { part: 'l', terminal: 'feed' }, code: 'G/B' }]
});

describe('drawingSvg', () => {
	it('is a balanced standalone SVG with one group per part and wire', () => {
		const demo = demoHarness();
		const svg = drawingSvg(demo, { title: 'Demo tourer' });
		expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
		expect(balanced(svg)).toBe(true);
		expect(svg.match(/<g class="part"/g)).toHaveLength(demo.parts.length);
		expect(svg.match(/<g class="wire"/g)).toHaveLength(demo.wires.length);
		expect(svg).not.toMatch(/<script|href=/);
	});

	it('draws G/B as green with a black tracer stripe over it, and writes the code', () => {
		const svg = drawingSvg(small);
		const wire = /<g class="wire"[^]*?<\/g>/.exec(svg)![0];
		const strokes = [...wire.matchAll(/stroke="(#[0-9a-f]{6})" stroke-width="(\d+)"/g)].map((m) => [m[1], m[2]]);
		// Outline, base (the palette's green), then the narrower tracer (the palette's black).
		expect(strokes).toEqual([
			['#1b1f24', '8'],
			[colour('G'), '6'],
			[colour('B'), '2']
		]);
		expect(wire).toContain('>G/B</text>');
	});

	it('escapes labels (XML 1.0 §2.4) and shows key numbers and terminal names', () => {
		const svg = drawingSvg(small);
		expect(svg).toContain('Fuse &lt;A&amp;B&gt;');
		expect(svg).toContain('<tspan class="key">6</tspan>');
		expect(svg).toMatch(/class="term">feed<\/text>/);
		expect(xmlEscape(`a"b'c`)).toBe('a&quot;b&apos;c');
	});

	it('frames every part inside the view box with the margin', () => {
		// Worked by hand: the fuse at x 100 and the lamp at x 400 with the editor's box widths;
		// a 40 px margin each side.
		const svg = drawingSvg(small);
		const [x, y, w, h] = /viewBox="([-\d.]+) ([-\d.]+) ([-\d.]+) ([-\d.]+)"/.exec(svg)!.slice(1).map(Number);
		const lamp = partGeometry('lamp', ['feed', 'earth']);
		const fuse = partGeometry('fuse', ['in', 'out']);
		expect(x).toBe(100 - 40);
		expect(x + w).toBe(400 + lamp.width + 40);
		expect(y).toBe(50 - 40);
		expect(y + h).toBe(50 + Math.max(lamp.height, fuse.height) + 40);
	});

	it('draws an unknown code grey and dashed', () => {
		const bad = { ...small, wires: [{ ...small.wires[0], code: 'ZZ' }] };
		expect(drawingSvg(bad)).toContain('stroke-dasharray="8 5"');
	});
});
