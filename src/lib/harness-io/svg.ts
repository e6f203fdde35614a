/**
 * The drawing as a standalone SVG file (SVG 1.1, no scripts, no external references), drawn
 * from the document the way the drawing board draws it: each part a box of the editor's
 * geometry with its key number, label and terminal names; each wire on its orthogonal route
 * with the base colour, the tracer as a narrower stripe along its middle, and the colour code.
 * Pure: a string out, so the server, the browser and the tests share it. PNG is made in the
 * browser by drawing this SVG onto a canvas (png.ts).
 */
import { displayColours, resolvePalette } from '../circuit/colours';
import type { HarnessDocument, Part } from '../circuit/schema';
import { partGeometry, type PartGeometry } from '../editor/geometry';
import { orthogonalRoute, type Point } from '../editor/route';

const INK = '#1b1f24';
const PAPER = '#ffffff';
const UNKNOWN = '#9aa1a9';
const MARGIN = 40;

/** Escapes text and attribute values for XML (XML 1.0 §2.4: &, <, > and the quote). */
export function xmlEscape(text: string): string {
	return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

const n = (x: number) => String(Math.round(x * 10) / 10);

function geometryOf(part: Part): PartGeometry {
	return partGeometry(part.kind, part.terminals, part.kind === 'connector' ? part.params.pins : undefined);
}

export interface SvgOptions {
	/** Title written at the top (and as the SVG's <title>). */
	title?: string;
}

/**
 * The drawing as an SVG document.
 * @example drawingSvg(demoHarness(), { title: 'Tourer, demo' }) // '<?xml version="1.0" …<svg …'
 */
export function drawingSvg(doc: HarnessDocument, options: SvgOptions = {}): string {
	const palette = resolvePalette(doc.palette);
	const geometry = new Map(doc.parts.map((p) => [p.id, geometryOf(p)]));
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	let minX = Infinity;
	let minY = Infinity;
	let maxX = -Infinity;
	let maxY = -Infinity;
	const grow = (x: number, y: number) => {
		minX = Math.min(minX, x);
		minY = Math.min(minY, y);
		maxX = Math.max(maxX, x);
		maxY = Math.max(maxY, y);
	};
	for (const p of doc.parts) {
		const g = geometry.get(p.id)!;
		grow(p.position.x, p.position.y);
		grow(p.position.x + g.width, p.position.y + g.height);
	}

	const wireMarkup: string[] = [];
	for (const w of doc.wires) {
		const a = parts.get(w.from.part);
		const b = parts.get(w.to.part);
		const ta = a && geometry.get(a.id)!.terminals.find((t) => t.name === w.from.terminal);
		const tb = b && geometry.get(b.id)!.terminals.find((t) => t.name === w.to.terminal);
		if (!a || !b || !ta || !tb) continue;
		const route = orthogonalRoute({
			source: { x: a.position.x + ta.x, y: a.position.y + ta.y },
			sourceSide: ta.side,
			target: { x: b.position.x + tb.x, y: b.position.y + tb.y },
			targetSide: tb.side,
			waypoints: w.waypoints
		});
		for (const p of route.points) grow(p.x, p.y);
		let base = UNKNOWN;
		let tracer: string | null = null;
		let description = `code ${w.code} is not in the palette`;
		try {
			const d = displayColours(w.code, palette);
			base = d.base;
			tracer = d.tracer;
			description = d.description;
		} catch {
			// Drawn grey and dashed, as the drawing board does.
		}
		const label: Point = route.label;
		const labelAt = route.labelVertical ? `x="${n(label.x + 8)}" y="${n(label.y + 4)}" text-anchor="start"` : `x="${n(label.x)}" y="${n(label.y - 8)}" text-anchor="middle"`;
		wireMarkup.push(
			`<g class="wire" data-wire="${xmlEscape(w.id)}"><title>${xmlEscape(`${a.key} ${w.from.terminal} → ${b.key} ${w.to.terminal}: ${w.code} (${description})`)}</title>` +
				`<path d="${route.path}" stroke="${INK}" stroke-width="8"/>` +
				`<path d="${route.path}" stroke="${base}" stroke-width="6"${base === UNKNOWN ? ' stroke-dasharray="8 5"' : ''}/>` +
				(tracer ? `<path d="${route.path}" stroke="${tracer}" stroke-width="2" class="tracer"/>` : '') +
				`<text ${labelAt} class="code">${xmlEscape(w.code)}</text></g>`
		);
	}

	const partMarkup: string[] = [];
	for (const p of doc.parts) {
		const g = geometry.get(p.id)!;
		const x = p.position.x;
		const y = p.position.y;
		const top = g.caption === 'top' ? 22 : 0;
		const body = { y: y + top + (g.terminals.some((t) => t.side === 'top') ? 18 : 0) };
		const bodyBottom = y + g.symbol.y + g.symbol.height + 4;
		const captionY = g.caption === 'top' ? y + 15 : y + g.height - 6;
		const terms = g.terminals
			.map((t) => {
				const tx = x + t.x;
				const ty = y + t.y;
				const inset = t.side === 'left' ? `x="${n(tx + 6)}" y="${n(ty + 4)}" text-anchor="start"` : t.side === 'right' ? `x="${n(tx - 6)}" y="${n(ty + 4)}" text-anchor="end"` : t.side === 'top' ? `x="${n(tx)}" y="${n(ty + 30)}" text-anchor="middle"` : `x="${n(tx)}" y="${n(ty - 22)}" text-anchor="middle"`;
				const lead = t.side === 'top' ? `<line x1="${n(tx)}" y1="${n(ty)}" x2="${n(tx)}" y2="${n(ty + 18)}"/>` : t.side === 'bottom' ? `<line x1="${n(tx)}" y1="${n(ty)}" x2="${n(tx)}" y2="${n(ty - 18)}"/>` : '';
				return `${lead}<circle cx="${n(tx)}" cy="${n(ty)}" r="3.5" class="terminal"/><text ${inset} class="term">${xmlEscape(t.name)}</text>`;
			})
			.join('');
		partMarkup.push(
			`<g class="part" data-part="${xmlEscape(p.id)}" data-kind="${p.kind}"><title>${xmlEscape(`${p.key} ${p.label} (${p.kind})`)}</title>` +
				`<rect x="${n(x)}" y="${n(body.y)}" width="${n(g.width)}" height="${n(Math.max(20, bodyBottom - body.y))}" rx="6" class="box"/>` +
				`<text x="${n(x + 4)}" y="${n(captionY)}" class="caption"><tspan class="key">${xmlEscape(p.key)}</tspan>${p.label ? ` ${xmlEscape(p.label)}` : ''}</text>` +
				`<text x="${n(x + g.width / 2)}" y="${n(y + g.symbol.y + g.symbol.height / 2 + 4)}" text-anchor="middle" class="kind">${xmlEscape(p.kind)}</text>` +
				terms +
				`</g>`
		);
	}

	if (!Number.isFinite(minX)) {
		minX = 0;
		minY = 0;
		maxX = 320;
		maxY = 120;
	}
	const titleHeight = options.title ? 36 : 0;
	const x0 = minX - MARGIN;
	const y0 = minY - MARGIN - titleHeight;
	const width = maxX - minX + 2 * MARGIN;
	const height = maxY - minY + 2 * MARGIN + titleHeight;
	const title = options.title ? xmlEscape(options.title) : 'Harness drawing';
	return [
		'<?xml version="1.0" encoding="UTF-8"?>',
		`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${n(width)}" height="${n(height)}" viewBox="${n(x0)} ${n(y0)} ${n(width)} ${n(height)}">`,
		`<title>${title}</title>`,
		'<style>',
		`text{font-family:"IBM Plex Sans",Arial,Helvetica,sans-serif;fill:${INK}}`,
		`.caption{font-size:13px}.key{font-weight:700}.term{font-size:10px}.kind{font-size:10px;fill:#5b636c}`,
		`.code{font-size:11px;font-weight:600;paint-order:stroke;stroke:${PAPER};stroke-width:3px}`,
		`.box{fill:#fbfaf7;stroke:${INK};stroke-width:1.5}.terminal{fill:${PAPER};stroke:${INK};stroke-width:1.5}`,
		`.wire path{fill:none;stroke-linejoin:round;stroke-linecap:round}line{stroke:${INK};stroke-width:1.5}`,
		'</style>',
		`<rect x="${n(x0)}" y="${n(y0)}" width="${n(width)}" height="${n(height)}" fill="${PAPER}"/>`,
		options.title ? `<text x="${n(x0 + MARGIN)}" y="${n(y0 + MARGIN)}" font-size="20" font-weight="600">${title}</text>` : '',
		`<g class="wires">${wireMarkup.join('')}</g>`,
		`<g class="parts">${partMarkup.join('')}</g>`,
		'</svg>',
		''
	]
		.filter(Boolean)
		.join('\n');
}
