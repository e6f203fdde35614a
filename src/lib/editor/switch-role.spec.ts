// A switch's role suggested from its label and its DIN 72552 terminal numbers (30 battery feed,
// 15 ignition, 50 starter; 56 headlamps, 58 side and tail lamps). Labels are invented.
import { describe, expect, it } from 'vitest';
import { suggestSwitchRole, type SwitchRole } from './switch-role';

const sw = (label: string, terminals: string[], role: SwitchRole = 'other') => ({ label, terminals, params: { role } });

describe('suggestSwitchRole', () => {
	it.each([
		[sw('Ignition switch', ['30', '15', '50']), 'ignition', 'its label says \u201cIgnition switch\u201d; terminals 30, 15 and 50 (DIN 72552: battery feed, ignition, starter)'],
		[sw('Key', ['30', '15']), 'ignition', 'terminals 30 and 15 (DIN 72552: battery feed, ignition)'],
		[sw('Ign. switch', ['1', '2']), 'ignition', 'its label says \u201cIgn. switch\u201d'],
		[sw('Main light switch', ['30', '56', '58']), 'lighting', 'its label says \u201cMain light switch\u201d; terminals 56 and 58 (DIN 72552: headlamps, side and tail lamps)'],
		[sw('Panel', ['58', '1']), 'lighting', 'terminal 58 (DIN 72552: side and tail lamps)']
	])('suggests a role for %j', (part, role, because) => expect(suggestSwitchRole(part)).toEqual({ role, because }));

	it.each([
		// Already in that role: nothing to ask.
		[sw('Ignition switch', ['30', '15'], 'ignition')],
		// Nothing points anywhere: a wiper switch with numbered terminals.
		[sw('Wiper switch', ['1', '2'])],
		// 30 alone is any permanent feed, not an ignition switch.
		[sw('Horn push', ['30', '1'])]
	])('suggests nothing for %j', (part) => expect(suggestSwitchRole(part)).toBeNull());
});
