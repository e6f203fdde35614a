// Where each part's terminals sit on its drawn box. One function gives the box size and the
// terminal points, used both to draw the node and to tell the canvas where wires end, so wires
// can be routed before (or without) the node being on screen.
//
// Terminal sides follow schematic habit (IEC 61082-1, common practice): current flows left to
// right through a part, earths leave downwards, an earth point takes its wire from above.
import type { PartKind } from '$lib/circuit/parts';
import type { Side } from './route';

export type TerminalPlace = { name: string; side: Side; /** Point where a wire meets the box. */ x: number; y: number };

export type PartGeometry = {
	width: number;
	height: number;
	/** Where the key number and label are written. */
	caption: 'top' | 'bottom';
	/** The area the symbol is drawn in. */
	symbol: { x: number; y: number; width: number; height: number };
	terminals: TerminalPlace[];
};

/** Size of the grab target of a terminal (px); big enough for a finger with the connection radius. */
export const HANDLE_SIZE = 14;
export const ROW = 24;
export const CAPTION = 22;
const WIDTH = 128;

/** Fixed sides for the terminals of kinds whose terminals are fixed (see FIXED_TERMINALS). */
const fixedSides: Partial<Record<PartKind, Record<string, Side>>> = {
	battery: { '+': 'left', '-': 'right' },
	'earth-point': { stud: 'top' },
	fuse: { in: 'left', out: 'right' },
	relay: { '30': 'left', '85': 'left', '87': 'right', '87a': 'right', '86': 'right' },
	lamp: { feed: 'left', earth: 'right' },
	gauge: { feed: 'left', sender: 'right' },
	sender: { feed: 'left', earth: 'bottom' },
	stabilizer: { in: 'left', out: 'right', earth: 'bottom' },
	resistor: { '1': 'left', '2': 'right' },
	motor: { feed: 'left', earth: 'bottom' },
	'ignition-coil': { '15': 'left', '1': 'right' },
	generator: { D: 'right', E: 'bottom' }
};

/** Order of terminals down a side, where a kind has a habit (relay: contacts above the coil). */
const sideOrder: Partial<Record<PartKind, string[]>> = {
	relay: ['30', '85', '87', '87a', '86']
};

/**
 * Which side each terminal goes on. User-named kinds put the first half on the left and the
 * rest on the right; a connector puts each pin pair's halves opposite each other.
 */
export function terminalSides(kind: PartKind, terminals: readonly string[], pins?: readonly (readonly [string, string])[]): Map<string, Side> {
	const sides = new Map<string, Side>();
	const fixed = fixedSides[kind];
	if (kind === 'connector' && pins?.length) {
		for (const [a, b] of pins) {
			if (terminals.includes(a)) sides.set(a, 'left');
			if (terminals.includes(b)) sides.set(b, 'right');
		}
	}
	const rest = terminals.filter((t) => !sides.has(t) && !fixed?.[t]);
	for (const t of terminals) if (fixed?.[t]) sides.set(t, fixed[t]);
	const half = Math.ceil(rest.length / 2);
	if (kind === 'splice') {
		// A junction: alternate sides so wires fan out both ways.
		rest.forEach((t, i) => sides.set(t, i % 2 === 0 ? 'left' : 'right'));
	} else {
		rest.forEach((t, i) => sides.set(t, i < half ? 'left' : 'right'));
	}
	return sides;
}

/**
 * The drawn box of a part and where its terminals are.
 * @example partGeometry('fuse', ['in', 'out']).terminals // in at (0, 44) left, out at (128, 44) right
 */
export function partGeometry(kind: PartKind, terminals: readonly string[], pins?: readonly (readonly [string, string])[]): PartGeometry {
	const sides = terminalSides(kind, terminals, pins);
	const order = sideOrder[kind];
	const ordered = order ? [...terminals].sort((a, b) => rank(order, a) - rank(order, b)) : [...terminals];
	const bySide: Record<Side, string[]> = { left: [], right: [], top: [], bottom: [] };
	for (const t of ordered) bySide[sides.get(t)!].push(t);

	const rows = Math.max(1, bySide.left.length, bySide.right.length);
	// An earth point takes its wire from above, so its caption goes underneath.
	const caption: PartGeometry['caption'] = bySide.top.length && !bySide.bottom.length ? 'bottom' : 'top';
	const topPad = caption === 'top' ? CAPTION : 0;
	const topLead = bySide.top.length ? 18 : 0;
	const bottomLead = bySide.bottom.length ? 18 : 0;
	const bodyTop = topPad + topLead;
	const bodyHeight = Math.max(44, rows * ROW + 8);
	const bottomPad = caption === 'bottom' ? CAPTION : 0;
	const height = bodyTop + bodyHeight + bottomLead + bottomPad;
	const width = Math.max(WIDTH, Math.max(bySide.top.length, bySide.bottom.length) * 36 + 28);

	const places: TerminalPlace[] = [];
	const rowY = (i: number, n: number) => bodyTop + bodyHeight / 2 + (i - (n - 1) / 2) * ROW;
	bySide.left.forEach((name, i) => places.push({ name, side: 'left', x: 0, y: rowY(i, bySide.left.length) }));
	bySide.right.forEach((name, i) => places.push({ name, side: 'right', x: width, y: rowY(i, bySide.right.length) }));
	const colX = (i: number, n: number) => width / 2 + (i - (n - 1) / 2) * 36;
	bySide.top.forEach((name, i) => places.push({ name, side: 'top', x: colX(i, bySide.top.length), y: 0 }));
	bySide.bottom.forEach((name, i) => places.push({ name, side: 'bottom', x: colX(i, bySide.bottom.length), y: bodyTop + bodyHeight + bottomLead }));

	// Keep the terminals in the part's own order (the canvas looks them up by name).
	places.sort((a, b) => terminals.indexOf(a.name) - terminals.indexOf(b.name));
	const symbolWidth = 56;
	return {
		width,
		height,
		caption,
		symbol: { x: (width - symbolWidth) / 2, y: bodyTop + 4, width: symbolWidth, height: bodyHeight - 8 },
		terminals: places
	};
}

function rank(order: string[], t: string): number {
	const i = order.indexOf(t);
	return i === -1 ? order.length : i;
}

/** The handle box of a terminal, inside the part's box, touching its side. */
export function handleBox(t: TerminalPlace): { x: number; y: number; width: number; height: number } {
	const s = HANDLE_SIZE;
	switch (t.side) {
		case 'left':
			return { x: 0, y: t.y - s / 2, width: s, height: s };
		case 'right':
			return { x: t.x - s, y: t.y - s / 2, width: s, height: s };
		case 'top':
			return { x: t.x - s / 2, y: 0, width: s, height: s };
		case 'bottom':
			return { x: t.x - s / 2, y: t.y - s, width: s, height: s };
	}
}
