// What a comment can be about, named as the restorer reads the harness (an invented loom).
import { describe, expect, it } from 'vitest';
import { targetsOf } from './comments';

const loom = {
	parts: [
		{ id: 'sw-ign', key: '5', label: 'Ignition switch' },
		{ id: 'fuse-ign', key: '6', label: 'Fuse, ignition accessories' }
	],
	wires: [{ id: 'w-ign-fuse', code: 'W', from: { part: 'sw-ign', terminal: '15' }, to: { part: 'fuse-ign', terminal: 'in' } }]
};

describe('targetsOf', () => {
	it('names a part by key and name, and a wire by its code and the terminals it joins, never by the drawing\u2019s ids', () => {
		const t = targetsOf(loom);
		expect(t.parts).toEqual([
			{ id: 'sw-ign', label: '5 Ignition switch' },
			{ id: 'fuse-ign', label: '6 Fuse, ignition accessories' }
		]);
		expect(t.wires).toEqual([{ id: 'w-ign-fuse', label: 'W from 5 Ignition switch, terminal 15 to 6 Fuse, ignition accessories, terminal in' }]);
		expect(JSON.stringify(t.wires.map((w) => w.label))).not.toContain('w-ign-fuse');
	});
});
