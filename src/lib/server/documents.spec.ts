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

describe('validateDocument through the circuit core', () => {
	it('names the path of a bad part and a bad vehicle fact', () => {
		const r = validateDocument({
			schemaVersion: 1,
			vehicle: { systemVoltage: 9, earth: 'positive' },
			parts: [{ id: 'p1', key: '1', kind: 'flux-capacitor' }],
			wires: []
		});
		expect(r.ok).toBe(false);
		if (!r.ok) {
			const paths = r.errors.map((e) => e.path);
			expect(paths).toContain('vehicle.systemVoltage');
			expect(paths.some((p) => p.startsWith('parts[0]'))).toBe(true);
		}
	});

	it('accepts a one-lamp document and fills the defaults', () => {
		const r = validateDocument({
			schemaVersion: 1,
			vehicle: { systemVoltage: 12, earth: 'negative' },
			parts: [{ id: 'lamp1', key: '14', kind: 'lamp' }],
			wires: []
		});
		expect(r.ok).toBe(true);
		if (r.ok) expect(summarise(r.doc)).toMatchObject({ parts: 1, wires: 0, kinds: [['lamp', 1]] });
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
