// Which terminals a switch's position joins, on the invented demo harness and a two-way switch.
import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { defaultScenario } from '$lib/circuit/scenario';
import type { Part } from '$lib/circuit/schema';
import { joinedTerminals } from './contacts';

const doc = demoHarness();
const switches = doc.parts.filter((p): p is Extract<Part, { kind: 'switch' }> => p.kind === 'switch');

describe('joinedTerminals', () => {
	it('follows the scenario: each position joins exactly the terminals of its closed pairs', () => {
		const scenario = defaultScenario(doc);
		for (const sw of switches) {
			for (const pos of sw.params.positions) {
				const joined = joinedTerminals(sw, { switches: { ...scenario.switches, [sw.id]: pos.name } });
				expect(joined.sort()).toEqual([...new Set(pos.closed.flat())].sort());
			}
		}
	});

	it('reads a panel switch closed when on and open when off', () => {
		const sw = { id: 'sw', key: '7', label: 'Panel switch', kind: 'switch', terminals: ['1', '2'], params: { role: 'other', positions: [{ name: 'off', closed: [] }, { name: 'on', closed: [['1', '2']] }], contactResistance: 0.01 } } as unknown as Extract<Part, { kind: 'switch' }>;
		expect(joinedTerminals(sw, { switches: { sw: 'on' } })).toEqual(['1', '2']);
		expect(joinedTerminals(sw, { switches: { sw: 'off' } })).toEqual([]);
	});
});
