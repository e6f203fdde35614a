import { describe, expect, it } from 'vitest';
import { emptyDocument, parseDocument, SCHEMA_VERSION } from './schema';

const base = () => ({
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'positive' },
	palette: 'trade-letters',
	parts: [
		{ id: 'bat', key: '1', kind: 'battery' },
		{ id: 'f1', key: '2', kind: 'fuse', params: { rating: 15 } },
		{ id: 'lamp', key: '3', kind: 'lamp', params: { watts: 21 } },
		{
			id: 'sw',
			key: '4',
			kind: 'switch',
			terminals: ['1', '2'],
			params: { positions: [{ name: 'off' }, { name: 'on', closed: [['1', '2']] }] }
		}
	],
	wires: [
		{ id: 'w1', from: { part: 'bat', terminal: '-' }, to: { part: 'f1', terminal: 'in' }, code: 'N' },
		{ id: 'w2', from: { part: 'f1', terminal: 'out' }, to: { part: 'sw', terminal: '1' }, code: 'G/B', size: { awg: 18 } }
	]
});

describe('parseDocument', () => {
	it('accepts a valid document and fills the defaults', () => {
		const r = parseDocument(base());
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		const doc = r.document;
		const fuse = doc.parts[1];
		expect(fuse.kind === 'fuse' && fuse.params).toEqual({ rating: 15, resistance: 0.005, blown: false });
		expect(doc.parts[0].terminals).toEqual(['+', '-']);
		expect(doc.parts[2].terminals).toEqual(['feed', 'earth']);
		expect(doc.parts[2].location).toBe('engine-bay');
		expect(doc.wires[0].size).toEqual({ mm2: 1 });
		expect(doc.wires[0].lengthM).toBe(1);
	});
	it('reads JSON text', () => {
		expect(parseDocument(JSON.stringify(base())).ok).toBe(true);
		const r = parseDocument('{ nope');
		expect(!r.ok && r.errors[0].message).toMatch(/not valid JSON/);
	});
	it('reports every shape error with its JSON path', () => {
		const d = base() as any;
		d.vehicle.systemVoltage = 13;
		d.parts[1].params.rating = -2;
		d.parts.push({ id: 'x', key: '9', kind: 'flux-capacitor' });
		const r = parseDocument(d);
		expect(r.ok).toBe(false);
		if (r.ok) return;
		const paths = r.errors.map((e) => e.path);
		expect(paths).toContain('vehicle.systemVoltage');
		expect(paths).toContain('parts[1].params.rating');
		expect(paths).toContain('parts[4].kind');
	});
	it('names both the wire end and the missing terminal', () => {
		const d = base() as any;
		d.wires[1].to = { part: 'sw', terminal: '3' };
		d.wires[0].from = { part: 'ghost', terminal: '+' };
		const r = parseDocument(d);
		expect(r.ok).toBe(false);
		if (r.ok) return;
		const term = r.errors.find((e) => e.path === 'wires[1].to.terminal');
		expect(term?.message).toContain('"3"');
		expect(term?.message).toContain('"4" (sw)');
		const part = r.errors.find((e) => e.path === 'wires[0].from.part');
		expect(part?.message).toContain('"ghost"');
	});
	it('catches duplicate ids and key numbers, bad codes, bad switch pairs', () => {
		const d = base() as any;
		d.parts[2].id = 'f1';
		d.parts[3].key = '1';
		d.wires[1].code = 'G/Q';
		d.wires.push({ ...d.wires[0] });
		d.parts[3].params.positions[1].closed = [['1', '7']];
		const r = parseDocument(d);
		expect(r.ok).toBe(false);
		if (r.ok) return;
		const byPath = Object.fromEntries(r.errors.map((e) => [e.path, e.message]));
		expect(byPath['parts[2].id']).toMatch(/used twice/);
		expect(byPath['parts[3].key']).toMatch(/already used by parts\[0\]/);
		expect(byPath['wires[1].code']).toMatch(/"Q" in the palette Single-letter trade code/);
		expect(byPath['wires[2].id']).toMatch(/used twice/);
		expect(byPath['parts[3].params.positions[1].closed[0][1]']).toMatch(/no terminal "7"/);
	});
	it('refuses renamed fixed terminals', () => {
		const d = base() as any;
		d.parts[0].terminals = ['pos', 'neg'];
		const r = parseDocument(d);
		expect(!r.ok && r.errors[0].path).toBe('parts[0].terminals');
	});
	it('refuses a newer schema version with a clear message (migration hook)', () => {
		const d = base() as any;
		d.schemaVersion = SCHEMA_VERSION + 1;
		const r = parseDocument(d);
		expect(r.ok).toBe(false);
		if (!r.ok) {
			expect(r.errors[0].path).toBe('schemaVersion');
			expect(r.errors[0].message).toMatch(/newer than this app reads/);
		}
	});
	it('accepts an inline user palette', () => {
		const d = base() as any;
		d.palette = {
			id: 'mine',
			name: 'Mine',
			colours: [
				{ code: 'N', name: 'brown', display: '#7b4a1e' },
				{ code: 'G', name: 'green', display: '#00aa00' },
				{ code: 'B', name: 'black', display: '#000000' }
			]
		};
		expect(parseDocument(d).ok).toBe(true);
		d.palette = 'no-such';
		const r = parseDocument(d);
		expect(!r.ok && r.errors[0].path).toBe('palette');
	});
	it('keeps a wire\'s "length measured" flag, reads documents without it as not measured, and refuses a non-boolean', () => {
		const d = base() as any;
		d.wires[1].lengthMeasured = true;
		const r = parseDocument(d);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.document.wires[1].lengthMeasured).toBe(true);
		// A document saved before the flag existed: same schema version, no field, nothing added.
		expect(r.document.schemaVersion).toBe(1);
		expect('lengthMeasured' in r.document.wires[0]).toBe(false);
		d.wires[0].lengthMeasured = 'yes';
		const bad = parseDocument(d);
		expect(!bad.ok && bad.errors.map((e) => e.path)).toEqual(['wires[0].lengthMeasured']);
	});
	it('emptyDocument is valid', () => {
		const e = emptyDocument({ systemVoltage: 6, earth: 'positive' });
		expect(e.parts).toEqual([]);
		expect(parseDocument(e).ok).toBe(true);
	});
});
