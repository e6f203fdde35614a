/**
 * Benchmark of the drawing board's document edits on a large loom (not a test): copying every
 * part to Loomwright's clipboard text and reading it back, pasting it into another diagram
 * with another palette (codes rewritten by colour), switching the palette of the whole
 * document, changing a part's kind, and bending every wire once (route, bend, route again).
 *
 * Target: each under 100 ms for about 1,000 parts, so a paste or a palette switch of a big loom
 * feels immediate, and a bend redraws within a frame (≤ 16 ms) per wire.
 *
 * Run: `npm run bench -- editor`.
 */
import { generateHarness } from '../../src/lib/circuit/testing/generate';
import { emptyDocument } from '../../src/lib/circuit/schema';
import { TRADE_LETTERS } from '../../src/lib/circuit/colours';
import { readClip, writeClip } from '../../src/lib/editor/clipboard';
import { changeKind, changePalette, copyItems, pasteItems, recodeFor } from '../../src/lib/editor/ops';
import { bendHandles, bendSegment, orthogonalRoute } from '../../src/lib/editor/route';

const ms = (x: number) => x.toFixed(1).padStart(8);

function time<T>(fn: () => T, runs = 5): { median: number; value: T } {
	let value!: T;
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		value = fn();
		times.push(performance.now() - start);
	}
	times.sort((a, b) => a - b);
	return { median: times[Math.floor(runs / 2)], value };
}

export async function run(): Promise<void> {
	console.log('edit                                                   parts  wires  median ms');
	for (const size of [250, 1000]) {
		const { doc: generated } = generateHarness(5150 + size, { parts: size, crossLinks: 0.08, floating: 0.02 });
		const doc = { ...generated, palette: 'trade-letters' as const };
		const all = new Set(doc.parts.map((p) => p.id));
		const row = (name: string, t: number) => console.log(`${name.padEnd(54)} ${String(doc.parts.length).padStart(5)} ${String(doc.wires.length).padStart(6)} ${ms(t)}`);

		const copied = time(() => writeClip({ clip: copyItems(doc, all), palette: TRADE_LETTERS, diagramId: 'bench' }));
		row(`copy all to clipboard text (${(copied.value.length / 1024).toFixed(0)} kB)`, copied.median);
		const read = time(() => readClip(copied.value));
		row('read clipboard text back (zod-checked)', read.median);
		const clip = read.value;
		if (!clip?.ok) throw new Error('clipboard text not read back');
		const iec = emptyDocument(doc.vehicle, 'iec-60757');
		row('paste into an IEC 60757 diagram (recoded by colour)', time(() => pasteItems(iec, clip.copied.clip, { x: 0, y: 0 }, clip.copied.palette)).median);
		row('paste into the same diagram (fresh ids, free keys)', time(() => pasteItems(doc, clip.copied.clip, { x: 32, y: 32 })).median);
		// An account palette with every trade colour under another code (invented: letter + "X").
		const own = { id: 'account-bench', name: 'Bench codes', colours: TRADE_LETTERS.colours.map((c) => ({ ...c, code: `${c.code}X` })) };
		row('switch the whole document to an own palette', time(() => changePalette(doc, own)).median);
		const report = time(() => recodeFor(doc, 'iec-60757'));
		row(`report before switching to IEC 60757 (${report.value.unmapped.length} codes it lacks)`, report.median);
		const lamp = doc.parts.find((p) => p.kind === 'lamp') ?? doc.parts[0];
		row('change one part’s kind (to a motor)', time(() => changeKind(doc, lamp.id, 'motor')).median);
		const bends = time(() => {
			let worst = 0;
			for (let i = 0; i < doc.wires.length; i++) {
				const start = performance.now();
				const a = { x: (i * 37) % 900, y: (i * 53) % 700 };
				const b = { x: (i * 91) % 900, y: (i * 29) % 700 + 40 };
				const route = orthogonalRoute({ source: a, sourceSide: 'right', target: b, targetSide: 'left' });
				const h = bendHandles(route.points)[0];
				if (h) orthogonalRoute({ source: a, sourceSide: 'right', target: b, targetSide: 'left', waypoints: bendSegment({ points: route.points, index: h.index, delta: { x: 24, y: 24 }, sourceSide: 'right', targetSide: 'left' }) });
				worst = Math.max(worst, performance.now() - start);
			}
			return worst;
		}, 3);
		row(`bend every wire once (worst single wire ${bends.value.toFixed(3)} ms)`, bends.median);
	}
}
