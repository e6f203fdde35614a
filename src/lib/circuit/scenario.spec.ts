import { describe, expect, it } from 'vitest';
import { assertDocument } from './schema';
import { checkScenario, defaultScenario, viewScenario } from './scenario';

const doc = assertDocument({
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'positive' },
	parts: [
		{
			id: 'ign',
			key: '1',
			kind: 'switch',
			terminals: ['30', '15', '75', '50'],
			params: {
				role: 'ignition',
				positions: [
					{ name: 'off' },
					{ name: 'aux', closed: [['30', '75']] },
					{ name: 'ign', closed: [['30', '15'], ['30', '75']] },
					{ name: 'start', closed: [['30', '15'], ['30', '50']] }
				]
			}
		},
		{
			id: 'lights',
			key: '2',
			kind: 'switch',
			terminals: ['in', 'side', 'head'],
			params: { role: 'lighting', positions: [{ name: 'side', closed: [['in', 'side']] }, { name: 'off' }, { name: 'head', closed: [['in', 'side'], ['in', 'head']] }] }
		},
		{ id: 'fuel', key: '3', kind: 'sender', params: { position: 0.25 } }
	]
});

describe('scenario', () => {
	it('defaults to ignition on and lights off', () => {
		const s = defaultScenario(doc);
		expect(s.switches).toEqual({ ign: 'ign', lights: 'off' });
		expect(s.senders).toEqual({ fuel: 0.25 });
		expect(s.engineRunning).toBe(false);
		const v = viewScenario(doc, s);
		expect(v.position(doc.parts[0] as never).closed).toEqual([['30', '15'], ['30', '75']]);
	});
	it('reports unknown switches, positions and out-of-range senders with paths', () => {
		const bad = checkScenario(doc, { switches: { ign: 'crank', nope: 'on' }, senders: { fuel: 2 } });
		expect(bad.ok).toBe(false);
		const r = checkScenario(doc, { switches: { ign: 'crank', nope: 'on' }, disconnected: ['ghost', { part: 'ign', terminal: '99' }] });
		expect(r.ok).toBe(false);
		if (!r.ok) {
			const m = Object.fromEntries(r.errors.map((e) => [e.path, e.message]));
			expect(m['switches.ign']).toMatch(/no position "crank"; it has off, aux, ign, start/);
			expect(m['switches.nope']).toMatch(/not a switch/);
			expect(m['disconnected[0]']).toMatch(/"ghost"/);
			expect(m['disconnected[1].terminal']).toMatch(/"99"/);
		}
		expect(checkScenario(doc, defaultScenario(doc)).ok).toBe(true);
	});
});
