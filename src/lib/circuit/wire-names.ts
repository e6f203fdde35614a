/**
 * Names for a wire and for one of its ends, as a restorer reads them off the harness: the colour
 * code and the terminals (key number.terminal). Several wires of one code often meet at one
 * terminal (the earths at a body stud, say); an end's name then also says where that wire goes,
 * so no two suspects or probes read the same.
 */
import type { HarnessDocument, Wire } from './schema';

export type WireNames = {
	/** "wire G between 6.out and 19.in" */
	wire(w: Wire): string;
	/** "wire B at 49.stud" or, when another wire of that code ends there too, "wire B at 49.stud (the one to 19.E)" */
	end(w: Wire, end: 'from' | 'to'): string;
	/** Where an end is, without the wire: "49.stud" or "49.stud (the one to 19.E)". */
	terminal(w: Wire, end: 'from' | 'to'): string;
	/** What `end` adds after the terminal: "" or " (the one to 19.E)", for names that spell the terminal their own way. */
	whichOne(w: Wire, end: 'from' | 'to'): string;
};

export function wireNames(doc: Pick<HarnessDocument, 'parts' | 'wires'>): WireNames {
	const keys = new Map(doc.parts.map((p) => [p.id, p.key]));
	const at = (ref: Wire['from']) => `${keys.get(ref.part) ?? ref.part}.${ref.terminal}`;
	// Wires per code and terminal, and per code and pair of terminals, to know when a name needs more.
	const byEnd = new Map<string, number>();
	const byPair = new Map<string, number>();
	const pairKey = (w: Wire) => [at(w.from), at(w.to)].sort().join('|') + '|' + w.code;
	for (const w of doc.wires) {
		for (const ref of [w.from, w.to]) {
			const k = `${w.code}@${at(ref)}`;
			byEnd.set(k, (byEnd.get(k) ?? 0) + 1);
		}
		byPair.set(pairKey(w), (byPair.get(pairKey(w)) ?? 0) + 1);
	}
	// Two wires of one code between the same two terminals: only the drawing's wire id tells them apart.
	const twin = (w: Wire) => ((byPair.get(pairKey(w)) ?? 0) > 1 ? ` [${w.id}]` : '');
	const whichOne = (w: Wire, end: 'from' | 'to') => {
		const shared = (byEnd.get(`${w.code}@${at(w[end])}`) ?? 0) > 1;
		return `${shared ? ` (the one to ${at(w[end === 'from' ? 'to' : 'from'])})` : ''}${twin(w)}`;
	};
	const terminal = (w: Wire, end: 'from' | 'to') => `${at(w[end])}${whichOne(w, end)}`;
	return {
		wire: (w) => `wire ${w.code} between ${at(w.from)} and ${at(w.to)}${twin(w)}`,
		end: (w, end) => `wire ${w.code} at ${terminal(w, end)}`,
		terminal,
		whichOne
	};
}
