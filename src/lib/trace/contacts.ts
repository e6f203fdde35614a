// A switch's contacts as the scenario sets them, for trace mode to draw the contact in its
// position (closed when "on" joins its terminals) rather than at rest as on the drawing board.
import { defaultPositionOf, type Scenario } from '$lib/circuit/scenario';
import type { Part } from '$lib/circuit/schema';

/**
 * The terminals the switch's current position joins (empty: every contact open).
 * @example joinedTerminals(ignitionSwitch, { ...scenario, switches: { ign: 'on' } }) // ["30", "15"]
 */
export function joinedTerminals(part: Extract<Part, { kind: 'switch' }>, scenario: Pick<Scenario, 'switches'>): string[] {
	const name = scenario.switches?.[part.id] ?? defaultPositionOf(part);
	const position = part.params.positions.find((p) => p.name === name);
	return [...new Set((position?.closed ?? []).flat())];
}
