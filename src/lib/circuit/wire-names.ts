/**
 * Names for a wire and for one of its ends, as a restorer reads them off the harness: the colour
 * code with its colours in words, and the terminals by the part's key number and name ("wire N
 * (brown) at the − post of 1 (Battery)"). Several wires of one code often meet at one terminal (the
 * earths at a body stud, say); an end's name then also says where that wire goes, so no two
 * suspects or probes read the same. The drawing's own ids never appear.
 */
import { parseCode, resolvePalette, type Palette } from './colours';
import type { HarnessDocument, Part, Wire } from './schema';

export type WireNames = {
	/** "wire G (green) between terminal out of 6 (Fuse) and terminal in of 19 (Stabilizer)" */
	wire(w: Wire): string;
	/** "wire B (black) at terminal stud of 49", or, when another wire of that code ends there too, "… (the one to terminal E of 19 Stabilizer)" */
	end(w: Wire, end: 'from' | 'to'): string;
	/** Where an end is, without the wire: "terminal stud of 49" or "terminal stud of 49 (the one to terminal E of 19 Stabilizer)". */
	terminal(w: Wire, end: 'from' | 'to'): string;
	/** What `end` adds after the terminal: "" or " (the one to terminal E of 19 Stabilizer)", for names that spell the terminal their own way. */
	whichOne(w: Wire, end: 'from' | 'to'): string;
};

type NamedPart = Pick<Part, 'id' | 'key'> & Partial<Pick<Part, 'label' | 'kind'>>;

/** "the − post" of a battery (its terminals are its posts), "terminal 30" of anything else. */
function terminalWords(part: NamedPart | undefined, terminal: string): string {
	if (part?.kind === 'battery' && (terminal === '+' || terminal === '-')) return `the ${terminal === '-' ? '\u2212' : '+'} post`;
	return `terminal ${terminal}`;
}

export function wireNames(doc: { parts: readonly NamedPart[]; wires: readonly Wire[]; palette?: HarnessDocument['palette'] }): WireNames {
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	let palette: Palette | null = null;
	try {
		palette = doc.palette === undefined ? null : resolvePalette(doc.palette);
	} catch {
		palette = null;
	}
	const colourName = (code: string) => palette?.colours.find((c) => c.code.toUpperCase() === code.toUpperCase())?.name;
	/** "W (white)", "G/B (green with black tracer)"; the code alone where the palette does not know it. */
	const codeWords = (code: string) => {
		if (!palette) return code;
		const parsed = parseCode(code, palette);
		if (!parsed.ok) return code;
		const base = colourName(parsed.code.base);
		const tracer = parsed.code.tracer ? colourName(parsed.code.tracer) : null;
		if (!base) return code;
		return `${code} (${tracer ? `${base} with ${tracer} tracer` : base})`;
	};
	/** "terminal in of 6 (Fuse, ignition accessories)", "the − post of 1 (Battery)". */
	const at = (ref: Wire['from']) => {
		const p = parts.get(ref.part);
		const name = p ? (p.label ? `${p.key} (${p.label})` : p.key) : 'a part not in the drawing';
		return `${terminalWords(p, ref.terminal)} of ${name}`;
	};
	/** The same place without inner brackets, to sit inside a bracketed remark. */
	const atPlain = (ref: Wire['from']) => {
		const p = parts.get(ref.part);
		const name = p ? (p.label ? `${p.key} ${p.label}` : p.key) : 'a part not in the drawing';
		return `${terminalWords(p, ref.terminal)} of ${name}`;
	};
	// Wires per code and terminal, and per code and pair of terminals, to know when a name needs more.
	const refKey = (ref: Wire['from']) => `${ref.part}\u0000${ref.terminal}`;
	const byEnd = new Map<string, number>();
	const byPair = new Map<string, Wire[]>();
	const pairKey = (w: Wire) => [refKey(w.from), refKey(w.to)].sort().join('|') + '|' + w.code;
	for (const w of doc.wires) {
		for (const ref of [w.from, w.to]) {
			const k = `${w.code}@${refKey(ref)}`;
			byEnd.set(k, (byEnd.get(k) ?? 0) + 1);
		}
		const list = byPair.get(pairKey(w)) ?? byPair.set(pairKey(w), []).get(pairKey(w))!;
		list.push(w);
	}
	// Two wires of one code between the same two terminals: only their order in the wire list tells them apart.
	const twin = (w: Wire) => {
		const list = byPair.get(pairKey(w)) ?? [];
		return list.length > 1 ? ` (${list.findIndex((x) => x.id === w.id) + 1} of ${list.length} alike in the wire list)` : '';
	};
	const whichOne = (w: Wire, end: 'from' | 'to') => {
		const shared = (byEnd.get(`${w.code}@${refKey(w[end])}`) ?? 0) > 1;
		return `${shared ? ` (the one to ${atPlain(w[end === 'from' ? 'to' : 'from'])})` : ''}${twin(w)}`;
	};
	const terminal = (w: Wire, end: 'from' | 'to') => `${at(w[end])}${whichOne(w, end)}`;
	return {
		wire: (w) => `wire ${codeWords(w.code)} between ${at(w.from)} and ${at(w.to)}${twin(w)}`,
		end: (w, end) => `wire ${codeWords(w.code)} at ${terminal(w, end)}`,
		terminal,
		whichOne
	};
}
