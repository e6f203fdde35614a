// Orthogonal wire routes: every segment horizontal or vertical, as wires are drawn on a
// schematic (IEC 61082-1 prefers straight lines at right angles, common practice). A wire
// leaves its terminal straight out of the part's side for a short stub, so it never runs back
// across the symbol it belongs to, then steps to the other end through any waypoints the user set.

export type Side = 'left' | 'right' | 'top' | 'bottom';
export type Point = { x: number; y: number };

export type RouteParams = {
	source: Point;
	sourceSide: Side;
	target: Point;
	targetSide: Side;
	/** Bends the user placed; the route passes through each in order. */
	waypoints?: Point[];
	/** How far a wire runs straight out of its terminal before it may turn. */
	stub?: number;
};

export type Route = {
	points: Point[];
	/** SVG path data ("M x y L x y ..."). */
	path: string;
	/** Where the colour code label sits: the middle of the longest segment. */
	label: Point;
	/** Whether that segment is vertical (the label may then be drawn beside it). */
	labelVertical: boolean;
	length: number;
};

const direction: Record<Side, Point> = {
	left: { x: -1, y: 0 },
	right: { x: 1, y: 0 },
	top: { x: 0, y: -1 },
	bottom: { x: 0, y: 1 }
};

const horizontal = (side: Side) => side === 'left' || side === 'right';

/** Two points joined with at most two bends, leaving `a` along `fromSide` where it can. */
function connect(a: Point, b: Point, leaveHorizontally: boolean, forward: boolean): Point[] {
	if (a.x === b.x || a.y === b.y) return [a, b];
	if (leaveHorizontally) {
		if (forward) {
			const midX = (a.x + b.x) / 2;
			return [a, { x: midX, y: a.y }, { x: midX, y: b.y }, b];
		}
		const midY = (a.y + b.y) / 2;
		return [a, { x: a.x, y: midY }, { x: b.x, y: midY }, b];
	}
	if (forward) {
		const midY = (a.y + b.y) / 2;
		return [a, { x: a.x, y: midY }, { x: b.x, y: midY }, b];
	}
	const midX = (a.x + b.x) / 2;
	return [a, { x: midX, y: a.y }, { x: midX, y: b.y }, b];
}

/** Is `to` ahead of `from` in the direction `side` points? */
function ahead(from: Point, to: Point, side: Side): boolean {
	const d = direction[side];
	return (to.x - from.x) * d.x + (to.y - from.y) * d.y >= 0;
}

/** Drops repeated points and middle points of straight runs (but keeps U-turns). */
export function simplify(points: Point[]): Point[] {
	const out: Point[] = [];
	for (const p of points) {
		const last = out[out.length - 1];
		if (last && last.x === p.x && last.y === p.y) continue;
		out.push({ x: p.x, y: p.y });
		while (out.length >= 3) {
			const [a, b, c] = out.slice(-3);
			const collinear = (a.x === b.x && b.x === c.x) || (a.y === b.y && b.y === c.y);
			const between =
				Math.min(a.x, c.x) <= b.x && b.x <= Math.max(a.x, c.x) && Math.min(a.y, c.y) <= b.y && b.y <= Math.max(a.y, c.y);
			if (collinear && between) out.splice(out.length - 2, 1);
			else break;
		}
	}
	return out;
}

/**
 * The orthogonal route of one wire between two terminals.
 * @example
 * orthogonalRoute({ source: { x: 0, y: 0 }, sourceSide: 'right', target: { x: 100, y: 40 }, targetSide: 'left' })
 * // points: (0,0) (50,0) (50,40) (100,40)
 */
export function orthogonalRoute({ source, sourceSide, target, targetSide, waypoints = [], stub = 16 }: RouteParams): Route {
	const ds = direction[sourceSide];
	const dt = direction[targetSide];
	const s1 = { x: source.x + ds.x * stub, y: source.y + ds.y * stub };
	const t1 = { x: target.x + dt.x * stub, y: target.y + dt.y * stub };

	const stops = [s1, ...waypoints, t1];
	const points: Point[] = [source];
	let side: Side = sourceSide;
	for (let i = 0; i < stops.length - 1; i++) {
		const a = stops[i];
		const b = stops[i + 1];
		const fwd = ahead(a, b, side);
		// Into the last stop, arrive so the final stub points back at the terminal.
		const leg = i === stops.length - 2 ? arrive(a, b, side, targetSide, fwd) : connect(a, b, horizontal(side), fwd);
		points.push(...leg);
		const p = leg[leg.length - 2] ?? a;
		side = sideOf(p, b) ?? side;
	}
	points.push(target);
	const simple = simplify(points);
	return finish(simple);
}

/** The last leg: from `a` leaving along `side` to the target stub `b`, arriving against `targetSide`. */
function arrive(a: Point, b: Point, side: Side, targetSide: Side, forward: boolean): Point[] {
	const leaveH = horizontal(side);
	const arriveH = horizontal(targetSide);
	if (a.x === b.x || a.y === b.y) return [a, b];
	if (leaveH && arriveH) return connect(a, b, true, forward);
	if (!leaveH && !arriveH) return connect(a, b, false, forward);
	// One bend: go along the leaving axis first, then along the arriving axis.
	return leaveH ? [a, { x: b.x, y: a.y }, b] : [a, { x: a.x, y: b.y }, b];
}

function sideOf(a: Point, b: Point): Side | null {
	if (a.y === b.y && a.x !== b.x) return b.x > a.x ? 'right' : 'left';
	if (a.x === b.x && a.y !== b.y) return b.y > a.y ? 'bottom' : 'top';
	return null;
}

function finish(points: Point[]): Route {
	let path = '';
	let length = 0;
	let best = { len: -1, mid: points[0], vertical: false };
	for (let i = 0; i < points.length; i++) {
		const p = points[i];
		path += `${i ? ' L' : 'M'} ${round(p.x)} ${round(p.y)}`;
		if (i) {
			const q = points[i - 1];
			const len = Math.abs(p.x - q.x) + Math.abs(p.y - q.y);
			length += len;
			if (len > best.len) best = { len, mid: { x: (p.x + q.x) / 2, y: (p.y + q.y) / 2 }, vertical: p.x === q.x };
		}
	}
	return { points, path, label: best.mid, labelVertical: best.vertical, length };
}

const round = (n: number) => Math.round(n * 10) / 10;

export type BendParams = {
	/** The wire's route as drawn (orthogonalRoute(...).points): terminal to terminal. */
	points: Point[];
	/** Which segment is dragged: points[index] to points[index + 1]. */
	index: number;
	/** How far the pointer moved, in drawing units; only the part across the segment counts. */
	delta: Point;
	sourceSide: Side;
	targetSide: Side;
	stub?: number;
};

/**
 * The waypoints that make a wire's route run with one segment moved sideways (a horizontal run
 * up or down, a vertical run left or right), every other segment kept. A segment that ends on a
 * terminal keeps a straight stub out of the terminal and steps over to the moved run, so the
 * wire still leaves its part square. Feeding the result to orthogonalRoute draws that route.
 * @example
 * bendSegment({ points: [{ x: 0, y: 0 }, { x: 50, y: 0 }, { x: 50, y: 40 }, { x: 100, y: 40 }], index: 1, delta: { x: 30, y: 5 }, sourceSide: 'right', targetSide: 'left' })
 * // [{ x: 80, y: 0 }, { x: 80, y: 40 }]: the vertical run moved 30 to the right
 */
export function bendSegment({ points, index, delta, sourceSide, targetSide, stub = 16 }: BendParams): Point[] {
	if (points.length < 2) throw new Error('bendSegment: a route has at least two points');
	if (!Number.isInteger(index) || index < 0 || index > points.length - 2) throw new Error(`bendSegment: no segment ${index} in a route of ${points.length - 1}`);
	const a = points[index];
	const b = points[index + 1];
	const vertical = a.x === b.x && a.y !== b.y;
	const move = (p: Point): Point => (vertical ? { x: Math.round(p.x + delta.x), y: p.y } : { x: p.x, y: Math.round(p.y + delta.y) });
	const last = points.length - 1;
	const out: Point[] = [];
	for (let i = 0; i <= last; i++) {
		const p = points[i];
		const moved = i === index || i === index + 1;
		if (!moved) {
			out.push(p);
			continue;
		}
		if (i === 0) {
			// The source terminal stays: out along its side for the stub, then across to the moved run.
			const s = { x: p.x + direction[sourceSide].x * stub, y: p.y + direction[sourceSide].y * stub };
			out.push(p, s, move(s));
		} else if (i === last) {
			const t = { x: p.x + direction[targetSide].x * stub, y: p.y + direction[targetSide].y * stub };
			out.push(move(t), t, p);
		} else out.push(move(p));
	}
	return simplify(out).slice(1, -1);
}

/** Where the bend handles of a route sit: the middle of each segment long enough to grab. */
export function bendHandles(points: Point[], minLength = 20): { index: number; x: number; y: number; vertical: boolean }[] {
	const out: { index: number; x: number; y: number; vertical: boolean }[] = [];
	for (let i = 0; i < points.length - 1; i++) {
		const a = points[i];
		const b = points[i + 1];
		if (Math.abs(a.x - b.x) + Math.abs(a.y - b.y) < minLength) continue;
		out.push({ index: i, x: (a.x + b.x) / 2, y: (a.y + b.y) / 2, vertical: a.x === b.x });
	}
	return out;
}
