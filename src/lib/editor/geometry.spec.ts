import { describe, expect, it } from 'vitest';
import { DEFAULT_TERMINALS, PART_KINDS } from '$lib/circuit/parts';
import { handleBox, HANDLE_SIZE, partGeometry, terminalSides } from './geometry';

// Layout rules checked against schematic habit (IEC 61082-1: signal flow left to right, earth
// downwards; common practice) and against the box arithmetic worked by hand.

describe('partGeometry', () => {
	it('puts a fuse in left and out right, on the middle row (worked by hand)', () => {
		const g = partGeometry('fuse', ['in', 'out']);
		// Caption 22 on top, body max(44, 1 × 24 + 8) = 44 high, so the row is at 22 + 22 = 44.
		expect(g.height).toBe(66);
		expect(g.width).toBe(128);
		expect(g.terminals).toEqual([
			{ name: 'in', side: 'left', x: 0, y: 44 },
			{ name: 'out', side: 'right', x: 128, y: 44 }
		]);
	});

	it('stacks relay contacts above the coil terminals', () => {
		const g = partGeometry('relay', ['85', '86', '30', '87', '87a']);
		const at = Object.fromEntries(g.terminals.map((t) => [t.name, t]));
		expect(at['30'].side).toBe('left');
		expect(at['85'].side).toBe('left');
		expect(at['30'].y).toBeLessThan(at['85'].y);
		expect([at['87'].y < at['87a'].y, at['87a'].y < at['86'].y]).toEqual([true, true]);
		// Keeps the part's own terminal order.
		expect(g.terminals.map((t) => t.name)).toEqual(['85', '86', '30', '87', '87a']);
	});

	it('takes an earth point wire from above and writes the caption below', () => {
		const g = partGeometry('earth-point', ['stud']);
		expect(g.caption).toBe('bottom');
		expect(g.terminals[0]).toEqual({ name: 'stud', side: 'top', x: 64, y: 0 });
	});

	it('sends a stabilizer earth downwards to the bottom edge', () => {
		const g = partGeometry('stabilizer', ['in', 'out', 'earth']);
		const earth = g.terminals.find((t) => t.name === 'earth')!;
		expect(earth.side).toBe('bottom');
		expect(earth.y).toBe(g.height);
	});

	it.each(PART_KINDS.map((kind) => ({ kind })))('gives every $kind terminal its own place inside the box', ({ kind }) => {
		const terms = kind === 'switch' ? ['30', '15', '50', 'ACC', 'IGN'] : [...DEFAULT_TERMINALS[kind]];
		const g = partGeometry(kind, terms);
		expect(g.terminals).toHaveLength(terms.length);
		const keys = new Set(g.terminals.map((t) => `${t.x},${t.y}`));
		expect(keys.size).toBe(terms.length);
		for (const t of g.terminals) {
			expect(t.x).toBeGreaterThanOrEqual(0);
			expect(t.x).toBeLessThanOrEqual(g.width);
			expect(t.y).toBeGreaterThanOrEqual(0);
			expect(t.y).toBeLessThanOrEqual(g.height);
			// The handle box touches the side and holds the wire end on that side.
			const b = handleBox(t);
			expect(b.width).toBe(HANDLE_SIZE);
			const end = { left: [b.x, b.y + b.height / 2], right: [b.x + b.width, b.y + b.height / 2], top: [b.x + b.width / 2, b.y], bottom: [b.x + b.width / 2, b.y + b.height] }[t.side];
			expect(end).toEqual([t.x, t.y]);
		}
	});
});

describe('terminalSides', () => {
	it('splits user-named terminals half and half', () => {
		const s = terminalSides('switch', ['30', '15', '50']);
		expect([...s.entries()]).toEqual([
			['30', 'left'],
			['15', 'left'],
			['50', 'right']
		]);
	});
	it('puts connector pin pairs opposite each other', () => {
		const s = terminalSides('connector', ['A1', 'A2', 'B1', 'B2'], [
			['A1', 'B1'],
			['A2', 'B2']
		]);
		expect(s.get('A2')).toBe('left');
		expect(s.get('B2')).toBe('right');
	});
});
