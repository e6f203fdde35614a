import { describe, expect, it } from 'vitest';
import { centredAt, droppedKind, freeSpot } from './place';

// Positions worked by hand on a grid of box + gap (100 + 24 = 124 across, 50 + 24 = 74 down).
describe('freeSpot', () => {
	const size = { width: 100, height: 50 };
	it('takes the spot asked for when it is free', () => {
		expect(freeSpot({ boxes: [], near: { x: 10, y: 20 }, size })).toEqual({ x: 10, y: 20 });
	});
	it('steps one box and a gap to the right of an occupied middle', () => {
		expect(freeSpot({ boxes: [{ x: 0, y: 0, width: 100, height: 50 }], near: { x: 0, y: 0 }, size })).toEqual({ x: 124, y: 0 });
	});
	it('never overlaps any box, however crowded', () => {
		const boxes = [];
		for (let i = -2; i <= 2; i++) for (let j = -2; j <= 2; j++) if (i || j) boxes.push({ x: i * 124, y: j * 74, width: 100, height: 50 });
		boxes.push({ x: 0, y: 0, width: 100, height: 50 });
		const p = freeSpot({ boxes, near: { x: 0, y: 0 }, size });
		for (const b of boxes) {
			const clear = p.x >= b.x + b.width + 24 || b.x >= p.x + 100 + 24 || p.y >= b.y + b.height + 24 || b.y >= p.y + 50 + 24;
			expect(clear).toBe(true);
		}
		// The first free ring is the third: distance from the middle is at least 2 steps down.
		expect(Math.max(Math.abs(p.x / 124), Math.abs(p.y / 74))).toBe(3);
	});
});

describe('dropping a part from the tray', () => {
	it('centres the part on the drop point (worked by hand: 100 − 120/2 = 40, 50 − 60/2 = 20)', () => {
		expect(centredAt({ x: 100, y: 50 }, { width: 120, height: 60 })).toEqual({ x: 40, y: 20 });
		expect(centredAt({ x: 10.4, y: -7.6 }, { width: 21, height: 10 })).toEqual({ x: 0, y: -13 });
	});

	it('accepts only the kinds the circuit core knows', () => {
		expect(droppedKind('relay')).toBe('relay');
		expect(droppedKind('earth-point')).toBe('earth-point');
		expect(droppedKind('flux-capacitor')).toBeNull();
		expect(droppedKind('')).toBeNull();
		expect(droppedKind(undefined)).toBeNull();
	});
});
