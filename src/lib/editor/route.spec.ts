import { describe, expect, it } from 'vitest';
import { bendHandles, bendSegment, orthogonalRoute, simplify, type Point, type Side } from './route';

// Checks are against the definition of an orthogonal route (every segment horizontal or
// vertical, IEC 61082-1 layout practice, common practice) and against routes worked by hand.

function axisAligned(points: Point[]): boolean {
	return points.every((p, i) => i === 0 || p.x === points[i - 1].x || p.y === points[i - 1].y);
}

describe('orthogonalRoute', () => {
	it('matches a Z route worked by hand', () => {
		// Right side of one part at (0,0) to the left side of another at (100,40):
		// out 16 to (16,0), across to the middle x = (16 + 84) / 2 = 50, down to 40, on to (84,40), in to (100,40).
		const r = orthogonalRoute({ source: { x: 0, y: 0 }, sourceSide: 'right', target: { x: 100, y: 40 }, targetSide: 'left' });
		expect(r.points).toEqual([
			{ x: 0, y: 0 },
			{ x: 50, y: 0 },
			{ x: 50, y: 40 },
			{ x: 100, y: 40 }
		]);
		expect(r.path).toBe('M 0 0 L 50 0 L 50 40 L 100 40');
		// Lengths 50 + 40 + 50 = 140; the longest segment is the first (ties keep the first).
		expect(r.length).toBe(140);
		expect(r.label).toEqual({ x: 25, y: 0 });
	});

	it('goes straight when the terminals face each other on one line', () => {
		const r = orthogonalRoute({ source: { x: 0, y: 10 }, sourceSide: 'right', target: { x: 80, y: 10 }, targetSide: 'left' });
		expect(r.points).toEqual([
			{ x: 0, y: 10 },
			{ x: 80, y: 10 }
		]);
	});

	it('loops round when the target is behind the source', () => {
		// Source leaves right at (100,0); target's left side is at (0,60), behind it.
		// Stubs (116,0) and (-16,60); mid y = 30: (116,0) → (116,30) → (-16,30) → (-16,60) → (0,60).
		const r = orthogonalRoute({ source: { x: 100, y: 0 }, sourceSide: 'right', target: { x: 0, y: 60 }, targetSide: 'left' });
		expect(r.points).toEqual([
			{ x: 100, y: 0 },
			{ x: 116, y: 0 },
			{ x: 116, y: 30 },
			{ x: -16, y: 30 },
			{ x: -16, y: 60 },
			{ x: 0, y: 60 }
		]);
	});

	it('makes one bend from a bottom terminal to a left terminal', () => {
		// Stubs (0,16) and (84,100): down to y = 100, then across.
		const r = orthogonalRoute({ source: { x: 0, y: 0 }, sourceSide: 'bottom', target: { x: 100, y: 100 }, targetSide: 'left' });
		expect(r.points).toEqual([
			{ x: 0, y: 0 },
			{ x: 0, y: 100 },
			{ x: 100, y: 100 }
		]);
	});

	it('passes through the waypoints in order', () => {
		const waypoints = [
			{ x: 40, y: 200 },
			{ x: 300, y: 220 }
		];
		const r = orthogonalRoute({ source: { x: 0, y: 0 }, sourceSide: 'right', target: { x: 400, y: 0 }, targetSide: 'left', waypoints });
		// Index of the segment each waypoint lies on (it may sit inside a straight run).
		const onSegment = (w: Point) =>
			r.points.findIndex((p, i) => {
				const q = r.points[i + 1];
				if (!q) return false;
				const inX = Math.min(p.x, q.x) <= w.x && w.x <= Math.max(p.x, q.x);
				const inY = Math.min(p.y, q.y) <= w.y && w.y <= Math.max(p.y, q.y);
				return inX && inY && (p.x === q.x || p.y === q.y);
			});
		const idx = waypoints.map(onSegment);
		expect(idx[0]).toBeGreaterThanOrEqual(0);
		expect(idx[1]).toBeGreaterThan(idx[0]);
		expect(axisAligned(r.points)).toBe(true);
	});

	const sides: Side[] = ['left', 'right', 'top', 'bottom'];
	// A deterministic spread of end points (a small linear congruential sequence).
	let seed = 7;
	const next = () => ((seed = (seed * 48271) % 2147483647) % 600) - 300;
	const cases = Array.from({ length: 64 }, (_, i) => ({
		source: { x: next(), y: next() },
		target: { x: next(), y: next() },
		sourceSide: sides[i % 4],
		targetSide: sides[(i >> 2) % 4]
	}));
	it.each(cases)('is orthogonal, leaves and arrives square ($sourceSide → $targetSide)', (c) => {
		const r = orthogonalRoute(c);
		expect(axisAligned(r.points)).toBe(true);
		expect(r.points[0]).toEqual(c.source);
		expect(r.points[r.points.length - 1]).toEqual(c.target);
		// The first segment runs out of the source's side; the last runs into the target's side.
		const [a, b] = r.points;
		const dir = { left: [-1, 0], right: [1, 0], top: [0, -1], bottom: [0, 1] } as const;
		const [sx, sy] = dir[c.sourceSide];
		expect(Math.sign(b.x - a.x) === sx && Math.sign(b.y - a.y) === sy).toBe(true);
		const y = r.points[r.points.length - 2];
		const z = r.points[r.points.length - 1];
		const [tx, ty] = dir[c.targetSide];
		expect(Math.sign(y.x - z.x) === tx && Math.sign(y.y - z.y) === ty).toBe(true);
	});
});

describe('simplify', () => {
	it('drops duplicates and straight-run middles but keeps U-turns', () => {
		expect(
			simplify([
				{ x: 0, y: 0 },
				{ x: 0, y: 0 },
				{ x: 5, y: 0 },
				{ x: 10, y: 0 },
				{ x: 10, y: 5 },
				{ x: 10, y: 0 }
			])
		).toEqual([
			{ x: 0, y: 0 },
			{ x: 10, y: 0 },
			{ x: 10, y: 5 },
			{ x: 10, y: 0 }
		]);
	});
});

describe('bendSegment', () => {
	const z = orthogonalRoute({ source: { x: 0, y: 0 }, sourceSide: 'right', target: { x: 100, y: 40 }, targetSide: 'left' });
	const reroute = (waypoints: Point[], source = { x: 0, y: 0 }, target = { x: 100, y: 40 }) =>
		orthogonalRoute({ source, sourceSide: 'right', target, targetSide: 'left', waypoints }).points;

	it('moves the middle run of a Z route sideways only (worked by hand)', () => {
		// The vertical run at x = 50 dragged by (+30, +5): it moves to x = 80; the 5 along it is ignored.
		const w = bendSegment({ points: z.points, index: 1, delta: { x: 30, y: 5 }, sourceSide: 'right', targetSide: 'left' });
		expect(w).toEqual([
			{ x: 80, y: 0 },
			{ x: 80, y: 40 }
		]);
		expect(reroute(w)).toEqual([
			{ x: 0, y: 0 },
			{ x: 80, y: 0 },
			{ x: 80, y: 40 },
			{ x: 100, y: 40 }
		]);
	});

	it('keeps a square stub out of the terminal when the run on a terminal is dragged', () => {
		// First run (0,0)–(50,0) dragged down 24: out 16 to (16,0), down to (16,24), across to (50,24),
		// down to the old bend height 40 … on to the target as before.
		const w = bendSegment({ points: z.points, index: 0, delta: { x: 0, y: 24 }, sourceSide: 'right', targetSide: 'left' });
		expect(w).toEqual([
			{ x: 16, y: 0 },
			{ x: 16, y: 24 },
			{ x: 50, y: 24 },
			{ x: 50, y: 40 }
		]);
		const r = reroute(w);
		expect(axisAligned(r)).toBe(true);
		expect(r).toEqual([{ x: 0, y: 0 }, ...w, { x: 100, y: 40 }]);
	});

	it('bends a straight wire into a detour with both stubs kept', () => {
		// A straight run from (0,10) to (80,10) dragged up 30: (16,10) (16,-20) (64,-20) (64,10).
		const straight = orthogonalRoute({ source: { x: 0, y: 10 }, sourceSide: 'right', target: { x: 80, y: 10 }, targetSide: 'left' }).points;
		const w = bendSegment({ points: straight, index: 0, delta: { x: 3, y: -30 }, sourceSide: 'right', targetSide: 'left' });
		expect(w).toEqual([
			{ x: 16, y: 10 },
			{ x: 16, y: -20 },
			{ x: 64, y: -20 },
			{ x: 64, y: 10 }
		]);
		expect(reroute(w, { x: 0, y: 10 }, { x: 80, y: 10 })).toEqual([{ x: 0, y: 10 }, ...w, { x: 80, y: 10 }]);
	});

	it('drags the same run twice: the second starts from the first', () => {
		const once = reroute(bendSegment({ points: z.points, index: 1, delta: { x: 20, y: 0 }, sourceSide: 'right', targetSide: 'left' }));
		const twice = bendSegment({ points: once, index: 1, delta: { x: -45, y: 0 }, sourceSide: 'right', targetSide: 'left' });
		// 50 + 20 − 45 = 25.
		expect(twice).toEqual([
			{ x: 25, y: 0 },
			{ x: 25, y: 40 }
		]);
	});

	it('names a segment that is not there', () => {
		expect(() => bendSegment({ points: z.points, index: 3, delta: { x: 1, y: 1 }, sourceSide: 'right', targetSide: 'left' })).toThrow(/bendSegment: no segment 3/);
	});

	it('puts a handle in the middle of each run long enough to grab', () => {
		expect(bendHandles(z.points)).toEqual([
			{ index: 0, x: 25, y: 0, vertical: false },
			{ index: 1, x: 50, y: 20, vertical: true },
			{ index: 2, x: 75, y: 40, vertical: false }
		]);
		expect(bendHandles(z.points, 45).map((h) => h.index)).toEqual([0, 2]);
	});
});
