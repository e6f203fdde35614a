// Plain words for trace results: a point named the way a restorer finds it on the car, and
// the sentence that says what several misbehaving parts have in common.
import type { HarnessDocument, Part } from '$lib/circuit/schema';
import type { Side, TracePoint } from '$lib/circuit/trace';

const partName = (p: Part | undefined, id: string) => (p ? `${p.key} ${p.label || p.kind}`.trim() : id);

/**
 * Names a trace point.
 * @example pointName(doc, { type: 'node', node: 'stabilizer:out', terminals: [{ part: 'stabilizer', terminal: 'out' }] })
 * // 'terminal out of 19 Instrument voltage stabilizer'
 */
export function pointName(doc: HarnessDocument, point: TracePoint): string {
	const part = (id: string) => doc.parts.find((p) => p.id === id);
	if (point.type === 'wire') {
		const w = doc.wires.find((x) => x.id === point.wire);
		if (!w) return `wire ${point.wire}`;
		return `wire ${w.code} from ${part(w.from.part)?.key ?? '?'} ${w.from.terminal} to ${part(w.to.part)?.key ?? '?'} ${w.to.terminal}`;
	}
	if (point.type === 'part') {
		const p = part(point.part);
		return point.contact ? `contacts ${point.contact[0]}–${point.contact[1]} of ${partName(p, point.part)}` : partName(p, point.part);
	}
	if (point.node === 'chassis') return 'the chassis (body) earth';
	const first = point.terminals[0];
	const p = first ? part(first.part) : undefined;
	if (p?.kind === 'splice') return partName(p, first.part);
	if (point.terminals.length === 1) return `terminal ${first.terminal} of ${partName(p, first.part)}`;
	return point.terminals.map((t) => `${part(t.part)?.key ?? '?'} ${t.terminal}`).join(' / ');
}

function countWord(n: number): string {
	return n === 2 ? 'Both' : `All ${['', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten'][n] ?? n}`;
}

export interface SharedWords {
	side: Side;
	/** Selected part ids. */
	parts: readonly string[];
	/** The shared point nearest the parts, or null when they share nothing but the battery. */
	nearest: TracePoint | null;
	/** Parts with no path on this side at all. */
	unreached: readonly string[];
	/** Earths found by way of another part (a gauge earths through its sender): part id → that part's id. */
	via?: ReadonlyMap<string, string>;
}

/**
 * The plain sentence for a shared feed or earth of two or more parts.
 * @example sharedSentence(doc, { side: 'feed', parts: ['fuel-gauge', 'temp-gauge'], nearest, unreached: [] })
 * // 'Both get their feed through terminal out of 19 Instrument voltage stabilizer; a fault there or above it explains both.'
 */
export function sharedSentence(doc: HarnessDocument, w: SharedWords): string {
	const name = (id: string) => partName(doc.parts.find((p) => p.id === id), id);
	const reached = w.parts.filter((id) => !w.unreached.includes(id));
	const all = countWord(reached.length);
	const them = reached.length === 2 ? 'both' : `all ${reached.length}`;
	let s: string;
	if (reached.length < 2) {
		s = w.side === 'feed' ? 'Fewer than two of the selected parts get a feed, so there is no shared feed to show.' : 'Fewer than two of the selected parts have an earth path, so there is no shared earth to show.';
	} else if (!w.nearest) {
		s =
			w.side === 'feed'
				? `${all} are fed straight from the battery by separate ways: no shared feed point explains them, so look for separate faults, or at the battery and its main cable.`
				: `${all} find earth by separate ways: no shared earth point explains them, so look for separate faults, or at the battery's earth strap.`;
	} else {
		const at = pointName(doc, w.nearest);
		const via = reached.filter((id) => w.via?.has(id)).map((id) => name(w.via!.get(id)!));
		const by = via.length ? ` (by way of ${via.join(' and ')})` : '';
		s =
			w.side === 'feed'
				? `${all} get their feed through ${at}; a fault there or above it explains ${them}.`
				: `${all} return to earth${by} through ${at}; a fault there or between it and the battery explains ${them}.`;
	}
	if (w.unreached.length) s += ` No ${w.side} path at all reaches ${w.unreached.map(name).join(', ')}.`;
	return s;
}
