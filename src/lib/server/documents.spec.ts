import { describe, expect, it } from 'vitest';
import { newDocument, summarise, validateDocument } from './documents';

describe('newDocument', () => {
	it('carries the vehicle’s voltage and earth and validates', () => {
		const doc = newDocument({ systemVoltage: 6, earthPolarity: 'positive' });
		expect(doc).toMatchObject({ schemaVersion: 1, vehicle: { systemVoltage: 6, earth: 'positive' } });
		expect(validateDocument(doc).ok).toBe(true);
		expect(summarise(doc)).toEqual({ schemaVersion: 1, systemVoltage: 6, earth: 'positive', parts: 0, wires: 0, kinds: [] });
	});
});

describe('validateDocument', () => {
	it.each([
		['a list', [], ''],
		['a string', 'parts', ''],
		['null', null, '']
	])('refuses %s as a whole', (_, value, path) => {
		const r = validateDocument(value);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors[0].path).toBe(path);
	});
});

describe('summarise', () => {
	it('counts parts by kind and wires, by hand: 3 lamps, 1 fuse, 2 wires', () => {
		const doc = {
			schemaVersion: 1,
			vehicle: { systemVoltage: 12, earth: 'negative' },
			parts: [{ kind: 'lamp' }, { kind: 'fuse' }, { kind: 'lamp' }, { kind: 'lamp' }],
			wires: [{}, {}]
		};
		expect(summarise(doc)).toEqual({
			schemaVersion: 1,
			systemVoltage: 12,
			earth: 'negative',
			parts: 4,
			wires: 2,
			kinds: [
				['lamp', 3],
				['fuse', 1]
			]
		});
	});

	it('reads nothing into a document that is not one', () => {
		expect(summarise('junk')).toEqual({ schemaVersion: null, systemVoltage: null, earth: null, parts: 0, wires: 0, kinds: [] });
	});
});
