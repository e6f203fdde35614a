import { describe, expect, it } from 'vitest';
import { PARAM_SCHEMAS, PART_KINDS } from '$lib/circuit/parts';
import { KIND_NAMES, PARAM_INFO, paramFields, TRAY_ORDER } from './kinds';

// The panel must offer every parameter the circuit core's schemas define, with a readable
// label; units are the SI symbols (V, A, W, Ω; BIPM SI Brochure, 9th edition, table 4).
describe('kinds', () => {
	it('names every kind and lists each once in the tray', () => {
		for (const k of PART_KINDS) expect(KIND_NAMES[k]).toBeTruthy();
		expect([...TRAY_ORDER].sort()).toEqual([...PART_KINDS].sort());
	});

	it.each(PART_KINDS.map((kind) => ({ kind })))('labels every $kind parameter', ({ kind }) => {
		for (const name of Object.keys(PARAM_SCHEMAS[kind].shape)) expect(PARAM_INFO[name]?.label, name).toBeTruthy();
	});

	it('reads field types from the schemas', () => {
		const fuse = paramFields('fuse');
		expect(fuse.map((f) => [f.name, f.type, f.info.unit])).toEqual([
			['rating', 'number', 'A'],
			['resistance', 'number', 'Ω'],
			['blown', 'boolean', undefined]
		]);
		const sender = paramFields('sender').find((f) => f.name === 'taper')!;
		expect(sender.type).toBe('choice');
		expect(sender.options).toEqual(['linear', 'logarithmic']);
		const lamp = paramFields('lamp').find((f) => f.name === 'volts')!;
		expect(lamp.optional).toBe(true);
		expect(paramFields('switch').map((f) => f.name)).toEqual(['role', 'contactResistance']);
	});
});
