/**
 * A small drawing of a diagnosis's region for the checklist: only the parts and wires its steps
 * touch (and the marked parts), drawn by the drawing's own SVG export (harness-io/svg.ts) from a
 * sub-document, with a numbered tag at each terminal where a step puts the red lead, so the page
 * says "step 3 is here" without colour.
 */
import type { HarnessDocument } from '$lib/circuit/schema';
import { partGeometry } from '$lib/editor/geometry';
import { drawingSvg, xmlEscape } from '$lib/harness-io/svg';

export interface RegionStep {
	number: number;
	part: string;
	terminal: string;
}

/** The document cut down to the given parts, and the wires whose two ends are among them. */
export function subDocument(doc: HarnessDocument, partIds: readonly string[], wireIds: readonly string[]): HarnessDocument {
	const keep = new Set(partIds);
	const wires = new Set(wireIds);
	return {
		...doc,
		parts: doc.parts.filter((p) => keep.has(p.id)),
		wires: doc.wires.filter((w) => wires.has(w.id) && keep.has(w.from.part) && keep.has(w.to.part))
	};
}

/**
 * The region as an SVG document (no scripts, no external references), step tags included.
 * @example regionSvg(doc, { parts: ['fuse-ign'], wires: [] }, [{ number: 1, part: 'fuse-ign', terminal: 'out' }]) // '<?xml …<svg …'
 */
export function regionSvg(doc: HarnessDocument, region: { parts: readonly string[]; wires: readonly string[] }, steps: readonly RegionStep[], title = 'Region of the diagnosis'): string {
	const sub = subDocument(doc, region.parts, region.wires);
	const svg = drawingSvg(sub, { title });
	// Steps at one terminal share a tag: "4, 5".
	const at = new Map<string, number[]>();
	for (const s of steps) {
		const k = `${s.part}\u0000${s.terminal}`;
		(at.get(k) ?? at.set(k, []).get(k)!).push(s.number);
	}
	const parts = new Map(sub.parts.map((p) => [p.id, p]));
	const tags: string[] = [];
	for (const [k, numbers] of at) {
		const [partId, terminal] = k.split('\u0000');
		const p = parts.get(partId);
		if (!p) continue;
		const g = partGeometry(p.kind, p.terminals, p.kind === 'connector' ? p.params.pins : undefined);
		const t = g.terminals.find((x) => x.name === terminal);
		if (!t) continue;
		const text = numbers.join(', ');
		const w = 18 + text.length * 10.5;
		const h = 26;
		// Outside the box, away from the terminal's name, on the side the wire leaves.
		const off = 16;
		const cx = p.position.x + t.x + (t.side === 'left' ? -off - w / 2 : t.side === 'right' ? off + w / 2 : 0);
		const cy = p.position.y + t.y + (t.side === 'top' ? -off - h / 2 : t.side === 'bottom' ? off + h / 2 : -h / 2 - 4);
		const r = (x: number) => Math.round(x * 10) / 10;
		tags.push(
			`<g class="step-tag" data-steps="${xmlEscape(text)}"><title>${xmlEscape(`Step ${text}: ${p.key} terminal ${terminal}`)}</title>` +
				`<rect x="${r(cx - w / 2)}" y="${r(cy - h / 2)}" width="${r(w)}" height="${h}" rx="13" fill="#1b1f24"/>` +
				`<text x="${r(cx)}" y="${r(cy + 6.5)}" text-anchor="middle" font-size="18" font-weight="700" style="fill:#ffffff">${xmlEscape(text)}</text></g>`
		);
	}
	return svg.replace(/<\/svg>\s*$/, `<g class="step-tags">${tags.join('')}</g>\n</svg>\n`);
}

/** The SVG as a data: URL, for an <img> that needs no request and keeps the drawing's styles to itself. */
export function svgDataUrl(svg: string): string {
	const bytes = new TextEncoder().encode(svg);
	let binary = '';
	for (const b of bytes) binary += String.fromCharCode(b);
	return `data:image/svg+xml;base64,${btoa(binary)}`;
}
