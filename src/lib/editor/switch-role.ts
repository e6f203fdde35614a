/**
 * A switch's role suggested from what the restorer already typed: its label and its terminal
 * numbers. DIN 72552 numbers the terminals of an ignition switch 30 (battery feed), 15
 * (switched feed, ignition on) and 50 (starter); a lighting switch feeds 56 (headlamps) and 58
 * (side and tail lamps). A suggestion is only offered, never applied: the person is asked.
 */
import type { Part } from '$lib/circuit/schema';
import { noun } from '$lib/words';

export type SwitchRole = 'ignition' | 'lighting' | 'other';

export interface RoleSuggestion {
	role: Exclude<SwitchRole, 'other'>;
	/** Why, in words: "its label says “Ignition switch”; terminals 30, 15 and 50 (DIN 72552: battery feed, ignition, starter)". */
	because: string;
}

const IGNITION_WORDS = /\b(ignition|ign|key switch|starter switch)\b/i;
const LIGHTING_WORDS = /\b(light|lights|lighting|lamp|lamps|headlamp|headlight|dip|dipper|side ?lamps?)\b/i;
const IGNITION_TERMINALS: Record<string, string> = { '30': 'battery feed', '15': 'ignition', '50': 'starter' };
const LIGHTING_TERMINALS: Record<string, string> = { '56': 'headlamps', '58': 'side and tail lamps' };

function terminalsSaying(terminals: readonly string[], meaning: Record<string, string>): string | null {
	const found = terminals.filter((t) => t in meaning);
	if (!found.length) return null;
	const list = found.length === 1 ? found[0] : `${found.slice(0, -1).join(', ')} and ${found[found.length - 1]}`;
	return `${noun(found.length, 'terminal')} ${list} (DIN 72552: ${found.map((t) => meaning[t]).join(', ')})`;
}

/**
 * The role the label and terminals point to, when it is not the role the switch has already.
 * 30 with 15 or 50 is an ignition switch's set; 56 or 58 a lighting switch's.
 * @example suggestSwitchRole({ label: 'Ignition switch', terminals: ['30', '15', '50'], params: { role: 'other' } })?.role // "ignition"
 */
export function suggestSwitchRole(part: Pick<Part, 'label' | 'terminals'> & { params: { role?: SwitchRole } }): RoleSuggestion | null {
	const label = part.label ?? '';
	const reasons = (role: RoleSuggestion['role']) => {
		const words = role === 'ignition' ? IGNITION_WORDS : LIGHTING_WORDS;
		const meaning = role === 'ignition' ? IGNITION_TERMINALS : LIGHTING_TERMINALS;
		const byLabel = words.test(label) ? `its label says \u201c${label}\u201d` : null;
		const byTerminals =
			role === 'ignition'
				? part.terminals.includes('30') && (part.terminals.includes('15') || part.terminals.includes('50'))
					? terminalsSaying(part.terminals, meaning)
					: null
				: terminalsSaying(part.terminals, meaning);
		return [byLabel, byTerminals].filter((x): x is string => !!x);
	};
	for (const role of ['ignition', 'lighting'] as const) {
		const why = reasons(role);
		if (!why.length) continue;
		if (part.params.role === role) return null;
		return { role, because: why.join('; ') };
	}
	return null;
}
