// Where a new part goes: the spot nearest the middle of the view where its box overlaps no
// other part, searched on rings of a grid one box (plus a gap) apart.
import { PART_KINDS, type PartKind } from '$lib/circuit/parts';
import type { Position } from '$lib/circuit/schema';

/** The drag-and-drop data type a part kind travels under from the tray to the canvas. */
export const PART_DRAG_TYPE = 'application/x-loomwright-part-kind';
/** The attribute that marks the drawing as the place a part slid out of the tray by touch may land. */
export const PART_DROP_ZONE = 'data-part-drop-zone';

/** The kind a drop carries, or null when it is not a part from the tray. */
export function droppedKind(data: string | undefined | null): PartKind | null {
	return data && (PART_KINDS as readonly string[]).includes(data) ? (data as PartKind) : null;
}

/**
 * The top-left corner that puts a box's middle on the drop point, in whole drawing units.
 * @example centredAt({ x: 100, y: 50 }, { width: 120, height: 60 }) // { x: 40, y: 20 }
 */
export function centredAt(point: Position, size: { width: number; height: number }): Position {
	// `+ 0` turns a rounded -0 into 0.
	return { x: Math.round(point.x - size.width / 2) + 0, y: Math.round(point.y - size.height / 2) + 0 };
}

export type Box = { x: number; y: number; width: number; height: number };

const overlaps = (a: Box, b: Box, gap: number) =>
	a.x < b.x + b.width + gap && b.x < a.x + a.width + gap && a.y < b.y + b.height + gap && b.y < a.y + a.height + gap;

/**
 * The top-left corner for a box of `size` nearest `near` (rightwards preferred) that keeps `gap` clear of every box.
 * @example freeSpot({ boxes: [{ x: 0, y: 0, width: 100, height: 50 }], near: { x: 0, y: 0 }, size: { width: 100, height: 50 } })
 * // { x: 124, y: 0 }: one box and a gap to the right
 */
export function freeSpot({ boxes, near, size, gap = 24, rings = 12 }: { boxes: readonly Box[]; near: Position; size: { width: number; height: number }; gap?: number; rings?: number }): Position {
	const stepX = size.width + gap;
	const stepY = size.height + gap;
	const candidates: { x: number; y: number; d: number; order: number }[] = [];
	let order = 0;
	for (let r = 0; r <= rings; r++) {
		for (let i = -r; i <= r; i++) {
			for (let j = -r; j <= r; j++) {
				if (Math.max(Math.abs(i), Math.abs(j)) !== r) continue;
				const x = near.x + i * stepX;
				const y = near.y + j * stepY;
				// Counted in grid steps, a step down costing more: wires run left to right, so parts
				// of one circuit sit side by side.
				candidates.push({ x, y, d: Math.abs(i) + 1.5 * Math.abs(j), order: order++ });
			}
		}
	}
	// Cheapest first; on a tie, right before left, then above before below.
	candidates.sort((a, b) => a.d - b.d || b.x - a.x || a.y - b.y || a.order - b.order);
	for (const c of candidates) {
		const box = { x: c.x, y: c.y, width: size.width, height: size.height };
		if (!boxes.some((b) => overlaps(box, b, gap))) return { x: Math.round(c.x), y: Math.round(c.y) };
	}
	return { x: Math.round(near.x), y: Math.round(near.y) };
}
