import { describe, expect, it } from 'vitest';
import { assertDocument } from './schema';
import { listNodes, netOf, nets, nodeOfTerminal, terminalGraph } from './nets';

// Worked by hand: battery + → splice (3 ways) → two lamps; a connector carries one feed on.
const doc = assertDocument({
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'negative' },
	parts: [
		{ id: 'bat', key: '1', kind: 'battery' },
		{ id: 'sp', key: '2', kind: 'splice', terminals: ['a', 'b', 'c'] },
		{ id: 'l1', key: '3', kind: 'lamp' },
		{ id: 'cn', key: '4', kind: 'connector', terminals: ['A1', 'B1'], params: { pins: [['A1', 'B1']] } },
		{ id: 'l2', key: '5', kind: 'lamp' },
		{ id: 'lone', key: '6', kind: 'lamp' }
	],
	wires: [
		{ id: 'w1', from: { part: 'bat', terminal: '+' }, to: { part: 'sp', terminal: 'a' }, code: 'N' },
		{ id: 'w2', from: { part: 'sp', terminal: 'b' }, to: { part: 'l1', terminal: 'feed' }, code: 'R' },
		{ id: 'w3', from: { part: 'sp', terminal: 'c' }, to: { part: 'cn', terminal: 'A1' }, code: 'R' },
		{ id: 'w4', from: { part: 'cn', terminal: 'B1' }, to: { part: 'l2', terminal: 'feed' }, code: 'R/G' }
	]
});

describe('nodes and nets', () => {
	it('a splice is one node; other terminals are their own', () => {
		expect(nodeOfTerminal({ id: 'sp', kind: 'splice' }, 'b')).toBe('sp');
		const nodes = listNodes(doc);
		const sp = nodes.find((n) => n.id === 'sp');
		expect(sp?.terminals.map((t) => t.terminal)).toEqual(['a', 'b', 'c']);
		expect(nodes.some((n) => n.id === 'chassis')).toBe(true);
		// 2 battery + 1 splice + 2×2 lamps + 2 connector + 2 lone lamp + chassis
		expect(nodes).toHaveLength(2 + 1 + 4 + 2 + 2 + 1);
	});
	it('a net runs through splices and connector pins', () => {
		const all = nets(doc);
		expect(all).toHaveLength(1);
		expect(new Set(all[0].wires)).toEqual(new Set(['w1', 'w2', 'w3', 'w4']));
		expect(all[0].terminals).toContainEqual({ part: 'l2', terminal: 'feed' });
		expect(netOf(doc, { part: 'lone', terminal: 'feed' })).toBeNull();
		expect(netOf(doc, { part: 'l1', terminal: 'feed' })?.wires).toHaveLength(4);
		expect(terminalGraph(doc).size).toBe(4 + 2 + 1);
	});
});
