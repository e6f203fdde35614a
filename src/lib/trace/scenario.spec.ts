import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { checkScenario } from '$lib/circuit/scenario';
import { effectiveScenario, ignitionOf, sendersOf, switchesOf } from './scenario';

const doc = demoHarness();

describe('effectiveScenario', () => {
	it('starts from the default: ignition on, lights off, engine stopped', () => {
		const s = effectiveScenario(doc, { switches: {}, senders: {} });
		expect(s.switches.ignition).toBe('ign');
		expect(s.switches['light-switch']).toBe('off');
		expect(s.engineRunning).toBe(false);
	});

	it('keeps settings that fit and drops those the document does not have', () => {
		const s = effectiveScenario(doc, {
			switches: { ignition: 'off', 'light-switch': 'no such position', gone: 'on' },
			senders: { 'fuel-sender': 0.1, 'temp-sender': 3 },
			engineRunning: true
		});
		expect(s.switches.ignition).toBe('off');
		expect(s.switches['light-switch']).toBe('off');
		expect(s.switches).not.toHaveProperty('gone');
		expect(s.senders['fuel-sender']).toBe(0.1);
		expect(s.senders['temp-sender']).toBe(0.4);
		expect(s.engineRunning).toBe(true);
		// What comes out is a scenario the core accepts.
		expect(checkScenario(doc, s).ok).toBe(true);
	});

	it('finds the ignition switch, every switch and every sender', () => {
		expect(ignitionOf(doc)?.key).toBe('10');
		expect(switchesOf(doc).length).toBe(8);
		expect(sendersOf(doc).map((p) => p.id)).toEqual(['fuel-sender', 'temp-sender']);
	});
});
