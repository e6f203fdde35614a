// The overview of a large loom zoomed far out: every part as its box and every wire as its
// route in its base colour, drawn on one canvas instead of thousands of live parts and wires.
// At that zoom the words are a few pixels high and nobody edits; what matters is the shape
// of the harness and that zooming stays smooth.
import type { PartNode, WireEdge } from './flow';
import { handleBox } from './geometry';
import { orthogonalRoute, type Point, type Side } from './route';

/** Below this zoom a large loom is drawn as its overview (the words are unreadable by then). */
export const OVERVIEW_ZOOM = 0.35;

export type OverviewPart = { x: number; y: number; width: number; height: number; selected: boolean };
export type OverviewWire = { points: Point[]; base: string; tracer: string | null; known: boolean; selected: boolean };
export type Overview = { parts: OverviewPart[]; wires: OverviewWire[] };

/**
 * Where the canvas draws a wire's end: the middle of the terminal's outer edge, as the live
 * drawing places it (a left terminal's left edge, a top terminal's top edge and so on).
 */
export function terminalEnd(node: PartNode, terminal: string): { point: Point; side: Side } | null {
	const t = node.data.geometry.terminals.find((x) => x.name === terminal);
	if (!t) return null;
	const b = handleBox(t);
	const { x, y } = node.position;
	switch (t.side) {
		case 'left':
			return { point: { x: x + b.x, y: y + b.y + b.height / 2 }, side: t.side };
		case 'right':
			return { point: { x: x + b.x + b.width, y: y + b.y + b.height / 2 }, side: t.side };
		case 'top':
			return { point: { x: x + b.x + b.width / 2, y: y + b.y }, side: t.side };
		case 'bottom':
			return { point: { x: x + b.x + b.width / 2, y: y + b.y + b.height }, side: t.side };
	}
}

/** The boxes and wire routes of the drawing, routed as the live wires are. */
export function overviewOf(nodes: readonly PartNode[], edges: readonly WireEdge[]): Overview {
	const byId = new Map(nodes.map((n) => [n.id, n]));
	const parts = nodes.map((n) => ({ x: n.position.x, y: n.position.y, width: n.data.geometry.width, height: n.data.geometry.height, selected: !!n.selected }));
	const wires: OverviewWire[] = [];
	for (const e of edges) {
		const from = byId.get(e.source);
		const to = byId.get(e.target);
		const a = from && terminalEnd(from, e.sourceHandle ?? '');
		const b = to && terminalEnd(to, e.targetHandle ?? '');
		if (!a || !b || !e.data) continue;
		const route = orthogonalRoute({ source: a.point, sourceSide: a.side, target: b.point, targetSide: b.side, waypoints: e.data.wire.waypoints });
		wires.push({ points: route.points, base: e.data.look.base, tracer: e.data.look.tracer, known: e.data.look.known, selected: !!e.selected });
	}
	return { parts, wires };
}

export type View = { x: number; y: number; zoom: number };

/** Draws the overview on a 2D canvas for a view (canvas pixels = CSS pixels × ratio). */
export function drawOverview(ctx: CanvasRenderingContext2D, overview: Overview, view: View, size: { width: number; height: number }, ratio: number) {
	const { x, y, zoom } = view;
	ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
	ctx.clearRect(0, 0, size.width, size.height);
	ctx.setTransform(ratio * zoom, 0, 0, ratio * zoom, ratio * x, ratio * y);
	// What is on screen, in drawing coordinates, with a margin for line widths.
	const left = -x / zoom - 20;
	const top = -y / zoom - 20;
	const right = (size.width - x) / zoom + 20;
	const bottom = (size.height - y) / zoom + 20;
	const onScreen = (ps: Point[]) => {
		let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
		for (const p of ps) {
			if (p.x < x0) x0 = p.x;
			if (p.x > x1) x1 = p.x;
			if (p.y < y0) y0 = p.y;
			if (p.y > y1) y1 = p.y;
		}
		return x1 >= left && x0 <= right && y1 >= top && y0 <= bottom;
	};
	const visible = overview.wires.filter((w) => onScreen(w.points));
	// Line widths as the live drawing's (casing 8, base 6, tracer 2), but never under a pixel.
	const px = 1 / zoom;
	const stroke = (wires: OverviewWire[], colour: (w: OverviewWire) => string | null, width: number) => {
		const groups = new Map<string, OverviewWire[]>();
		for (const w of wires) {
			const c = colour(w);
			if (!c) continue;
			const list = groups.get(c);
			if (list) list.push(w);
			else groups.set(c, [w]);
		}
		ctx.lineWidth = width;
		for (const [c, list] of groups) {
			ctx.strokeStyle = c;
			ctx.beginPath();
			for (const w of list) {
				ctx.moveTo(w.points[0].x, w.points[0].y);
				for (let i = 1; i < w.points.length; i++) ctx.lineTo(w.points[i].x, w.points[i].y);
			}
			ctx.stroke();
		}
	};
	ctx.lineJoin = 'round';
	stroke(visible.filter((w) => w.selected), () => '#f3b27a', Math.max(16, 5 * px));
	stroke(visible, () => '#1b1f24', Math.max(8, 2 * px));
	stroke(visible, (w) => w.base, Math.max(6, 1.2 * px));
	if (zoom > 0.15) stroke(visible, (w) => w.tracer, Math.max(2, 0.6 * px));
	ctx.lineWidth = Math.max(1.5, px);
	for (const p of overview.parts) {
		if (p.x > right || p.y > bottom || p.x + p.width < left || p.y + p.height < top) continue;
		ctx.fillStyle = p.selected ? '#f3dcc8' : '#fffdf8';
		ctx.fillRect(p.x, p.y, p.width, p.height);
		ctx.strokeStyle = p.selected ? '#9a4a12' : '#1b1f24';
		ctx.strokeRect(p.x, p.y, p.width, p.height);
	}
}
