/**
 * Where the meter's leads go, in the words a restorer reads off the harness: the part by its key
 * number and name, the terminal, and for a drop across a joint the wire behind the crimp. One
 * place for these words, so the diagnosis page and the printed checklist say the same.
 *
 * Pure: no database, no Svelte, no network.
 */
import type { ProbePlace } from '../circuit/probes';
import type { HarnessDocument, Part } from '../circuit/schema';
import { wireNames } from '../circuit/wire-names';

export interface LeadWords {
	/** "6 Fuse, ignition accessories, terminal in". */
	red: string;
	/** "Black lead on wire W, just behind its crimp at terminal in". */
	black: string;
	/** The probe's own condition that already says where the black lead goes (left out of its conditions list), or null. */
	blackFromConditions: string | null;
}

/** "6 Fuse, ignition accessories", or the key alone when the part has no name. */
export const partName = (p: Pick<Part, 'key' | 'label'> | undefined, fallback: string) => (p ? `${p.key}${p.label ? ` ${p.label}` : ''}` : fallback);

/**
 * Both leads of a probe in words; the planner's own sentence for the black lead when it gave one.
 * @example leadWords({ place, conditions }, doc).black // "Black lead on wire W, just behind its crimp at terminal in"
 */
export function leadWords(probe: { place: ProbePlace; conditions: readonly string[] }, doc: Pick<HarnessDocument, 'parts' | 'wires'>): LeadWords {
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const { place } = probe;
	const red = `${partName(parts.get(place.part), place.key)}, terminal ${place.terminal}`;
	const said = probe.conditions.find((c) => /^(Black lead|Lamp clip)\b/.test(c)) ?? null;
	if (said) return { red, black: said, blackFromConditions: said };
	const to = place.to;
	const black = (text: string): LeadWords => ({ red, black: text, blackFromConditions: null });
	if (to === 'earth') return black('Black lead on the battery\u2019s earthed post');
	if (to === 'chassis') return black('Black lead on a clean, bare body point near the part');
	if (to.wire) {
		const w = doc.wires.find((x) => x.id === to.wire);
		const which = w && to.end ? wireNames(doc).whichOne(w, to.end) : '';
		return black(`Black lead on wire ${w?.code ?? to.wire}${which}, just behind its crimp at terminal ${to.terminal}`);
	}
	if (to.part === place.part) return black(`Black lead on terminal ${to.terminal} of the same part`);
	return black(`Black lead on ${partName(parts.get(to.part), to.key)}, terminal ${to.terminal}`);
}
