import { describe, expect, it } from 'vitest';
import { emptyDocument, parseDocument, type HarnessDocument } from '$lib/circuit/schema';
import {
	addParts,
	addTerminal,
	addWire,
	changeKind,
	changePalette,
	copyItems,
	createPart,
	deleteItems,
	EditError,
	moveParts,
	nextKey,
	pasteItems,
	recodeFor,
	removeTerminal,
	renameTerminal,
	updatePart,
	updateWire,
	wiresOf
} from './ops';

// Every edit must leave a document the circuit core's own parser accepts (parseDocument is the
// independent check here); expected values are worked by hand from the invented example below.

function valid(doc: HarnessDocument) {
	const r = parseDocument(JSON.parse(JSON.stringify(doc)));
	if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
	return r.document;
}

/** An invented sidelamp circuit: battery 1, fuse 2, lamp 3, earth point 4. */
function sample() {
	let doc = emptyDocument({ systemVoltage: 12, earth: 'negative' });
	const battery = createPart(doc, 'battery', { x: 0, y: 0 }, { id: 'bat', key: '1', label: 'Battery' });
	const fuse = createPart(doc, 'fuse', { x: 200, y: 0 }, { id: 'fuse', key: '2', label: 'Sidelamp fuse' });
	const lamp = createPart(doc, 'lamp', { x: 400, y: 0 }, { id: 'lamp', key: '3', label: 'Sidelamp' });
	const earth = createPart(doc, 'earth-point', { x: 400, y: 200 }, { id: 'earth', key: '4', label: 'Wing earth' });
	doc = addParts(doc, [battery, fuse, lamp, earth]);
	doc = addWire(doc, { part: 'bat', terminal: '+' }, { part: 'fuse', terminal: 'in' }, { id: 'w1', code: 'N' }).doc;
	doc = addWire(doc, { part: 'fuse', terminal: 'out' }, { part: 'lamp', terminal: 'feed' }, { id: 'w2', code: 'r/w' }).doc;
	doc = addWire(doc, { part: 'lamp', terminal: 'earth' }, { part: 'earth', terminal: 'stud' }, { id: 'w3', code: 'B' }).doc;
	return doc;
}

describe('parts', () => {
	it('creates parts with schema defaults and the next key number', () => {
		const doc = sample();
		const relay = createPart(doc, 'relay', { x: 10.4, y: 19.6 });
		expect(relay.key).toBe('5');
		expect(relay.terminals).toEqual(['85', '86', '30', '87', '87a']);
		expect(relay.position).toEqual({ x: 10, y: 20 });
		// 80 Ω coil: the default in parts.ts.
		expect(relay.kind === 'relay' && relay.params.coilResistance).toBe(80);
		valid(addParts(doc, [relay]));
	});

	it.each([
		{ keys: [], next: '1' },
		{ keys: ['1', '2', '10'], next: '11' },
		{ keys: ['A', 'B'], next: '1' },
		{ keys: ['3a', '4'], next: '5' }
	])('next key after $keys is $next', ({ keys, next }) => {
		expect(nextKey(emptyDocument({ systemVoltage: 12, earth: 'negative' }), new Set(keys))).toBe(next);
	});

	it('refuses a key number already used, naming the field', () => {
		const doc = sample();
		expect(() => updatePart(doc, 'lamp', { key: '2' })).toThrow(EditError);
		try {
			updatePart(doc, 'lamp', { key: ' ' });
		} catch (e) {
			expect((e as EditError).field).toBe('key');
		}
	});

	it('validates parameters by kind and names the parameter', () => {
		const doc = sample();
		const lamp = valid(updatePart(doc, 'lamp', { params: { watts: 21 } })).parts.find((p) => p.id === 'lamp')!;
		expect(lamp.kind === 'lamp' && lamp.params.watts).toBe(21);
		expect(() => updatePart(doc, 'lamp', { params: { watts: -5 } })).toThrow(/./);
		try {
			updatePart(doc, 'lamp', { params: { watts: -5 } });
		} catch (e) {
			expect((e as EditError).field).toBe('params.watts');
		}
	});

	it('moves only what moved and keeps untouched parts identical', () => {
		const doc = sample();
		expect(moveParts(doc, new Map([['fuse', { x: 200, y: 0 }]]))).toBe(doc);
		const moved = moveParts(doc, new Map([['fuse', { x: 240.2, y: 40 }]]));
		expect(moved.parts.find((p) => p.id === 'fuse')!.position).toEqual({ x: 240, y: 40 });
		expect(moved.parts.find((p) => p.id === 'lamp')).toBe(doc.parts.find((p) => p.id === 'lamp'));
	});

	it('moves a bent wire’s bends with a group dragged together, and leaves them when one end moves', () => {
		const bent = valid(updateWire(sample(), 'w2', { waypoints: [{ x: 300, y: -60 }] }));
		// Fuse and lamp dragged 50 right and 20 down together: the bend moves with them.
		const group = moveParts(bent, new Map([['fuse', { x: 250, y: 20 }], ['lamp', { x: 450, y: 20 }]]));
		expect(group.wires.find((w) => w.id === 'w2')!.waypoints).toEqual([{ x: 350, y: -40 }]);
		// Only the lamp: the bend stays where it was put; wires without bends are the same objects.
		const one = moveParts(bent, new Map([['lamp', { x: 450, y: 20 }]]));
		expect(one.wires.find((w) => w.id === 'w2')!.waypoints).toEqual([{ x: 300, y: -60 }]);
		expect(one.wires.find((w) => w.id === 'w3')).toBe(bent.wires.find((w) => w.id === 'w3'));
	});

	it('deletes parts with the wires on them', () => {
		const doc = sample();
		expect(wiresOf(doc, new Set(['lamp'])).sort()).toEqual(['w2', 'w3']);
		const after = valid(deleteItems(doc, new Set(['lamp']), new Set(['w1'])));
		expect(after.parts.map((p) => p.id)).toEqual(['bat', 'fuse', 'earth']);
		expect(after.wires).toEqual([]);
	});
});

describe('terminals of user-named kinds', () => {
	it('renames a switch terminal and the wires and contacts follow', () => {
		let doc = sample();
		const sw = createPart(doc, 'switch', { x: 0, y: 100 }, { id: 'sw', key: '9' });
		doc = addParts(doc, [sw]);
		doc = addWire(doc, { part: 'sw', terminal: '2' }, { part: 'lamp', terminal: 'feed' }, { id: 'w9' }).doc;
		doc = renameTerminal(doc, 'sw', '2', '58');
		const s = valid(doc).parts.find((p) => p.id === 'sw')!;
		expect(s.terminals).toEqual(['1', '58']);
		expect(s.kind === 'switch' && s.params.positions[1].closed).toEqual([['1', '58']]);
		expect(doc.wires.find((w) => w.id === 'w9')!.from).toEqual({ part: 'sw', terminal: '58' });
	});

	it('adds and removes terminals, refusing fixed kinds and duplicates', () => {
		let doc = sample();
		const sp = createPart(doc, 'splice', { x: 0, y: 300 }, { id: 'sp', key: '8' });
		doc = addParts(doc, [sp]);
		doc = addTerminal(doc, 'sp', '4');
		expect(() => addTerminal(doc, 'sp', '4')).toThrow(/already/);
		expect(() => addTerminal(doc, 'lamp', 'x')).toThrow(/fixed/);
		doc = addWire(doc, { part: 'sp', terminal: '4' }, { part: 'lamp', terminal: 'feed' }, { id: 'w8' }).doc;
		doc = removeTerminal(doc, 'sp', '4');
		expect(valid(doc).wires.some((w) => w.id === 'w8')).toBe(false);
	});
});

describe('wires', () => {
	it('normalises codes to the palette and rejects unknown ones', () => {
		const doc = sample();
		expect(doc.wires.find((w) => w.id === 'w2')!.code).toBe('R/W');
		expect(valid(updateWire(doc, 'w2', { code: 'gb' })).wires.find((w) => w.id === 'w2')!.code).toBe('G/B');
		expect(() => updateWire(doc, 'w2', { code: 'QX' })).toThrow(/unknown colour code/);
	});

	it('checks ends, size and length', () => {
		const doc = sample();
		expect(() => addWire(doc, { part: 'lamp', terminal: 'feed' }, { part: 'lamp', terminal: 'feed' })).toThrow(/two different/);
		expect(() => addWire(doc, { part: 'lamp', terminal: 'x' }, { part: 'bat', terminal: '+' })).toThrow(/no terminal x/);
		expect(() => updateWire(doc, 'w1', { lengthM: -1 })).toThrow(/metres/);
		expect(() => updateWire(doc, 'w1', { size: { mm2: 0 } })).toThrow(/above 0/);
		const w = valid(updateWire(doc, 'w1', { size: { awg: 14 }, lengthM: 0.75, notes: 'behind dash' })).wires[0];
		expect(w).toMatchObject({ size: { awg: 14 }, lengthM: 0.75, notes: 'behind dash' });
	});

	it('marks a length measured, and unmarking leaves the wire as a document without the field', () => {
		const doc = sample();
		const marked = valid(updateWire(doc, 'w1', { lengthMeasured: true }));
		expect(marked.wires[0].lengthMeasured).toBe(true);
		const unmarked = valid(updateWire(marked, 'w1', { lengthMeasured: false })).wires[0];
		expect('lengthMeasured' in unmarked).toBe(false);
		expect(unmarked).toEqual(doc.wires[0]);
	});

	it('changes palette by colour name (trade letters → IEC 60757)', () => {
		// Trade N = brown → IEC BN; R/W = red/white → RD/WH; B = black → BK (IEC 60757 table).
		const doc = valid(changePalette(sample(), 'iec-60757'));
		expect(doc.wires.map((w) => w.code)).toEqual(['BN', 'RD/WH', 'BK']);
		// Slate has no IEC colour of that name: refused, naming the code.
		const slate = updateWire(sample(), 'w1', { code: 'S' });
		expect(() => changePalette(slate, 'iec-60757')).toThrow(/S/);
	});
});

describe('copy and paste', () => {
	it('pastes new ids and free key numbers, with the wires between copied parts only', () => {
		const doc = sample();
		const clip = copyItems(doc, new Set(['fuse', 'lamp']));
		expect(clip.wires.map((w) => w.id)).toEqual(['w2']);
		const r = pasteItems(doc, clip, { x: 40, y: 40 });
		const after = valid(r.doc);
		expect(after.parts).toHaveLength(6);
		const pasted = after.parts.filter((p) => r.partIds.includes(p.id));
		expect(pasted.map((p) => p.key)).toEqual(['5', '6']);
		expect(pasted[0].position).toEqual({ x: 240, y: 40 });
		const wire = after.wires.find((w) => w.id === r.wireIds[0])!;
		expect(wire.from.part).toBe(pasted[0].id);
		expect(wire.to.part).toBe(pasted[1].id);
		expect(wire.code).toBe('R/W');
	});
});

describe('changing a part\'s kind', () => {
	it('keeps key number, label and wires on terminals of the same name (lamp → motor: feed, earth)', () => {
		const doc = sample();
		const r = changeKind(doc, 'lamp', 'motor');
		const after = valid(r.doc);
		const motor = after.parts.find((p) => p.id === 'lamp')!;
		expect(motor).toMatchObject({ kind: 'motor', key: '3', label: 'Sidelamp', terminals: ['feed', 'earth'], position: { x: 400, y: 0 } });
		// 4 Ω: the motor's own default (parts.ts); a lamp has no resistance value to carry over.
		expect(motor.kind === 'motor' && motor.params.resistance).toBe(4);
		expect(r.dropped).toEqual([]);
		expect(after.wires.map((w) => w.id)).toEqual(['w1', 'w2', 'w3']);
	});

	it('reports the wires on terminals the new kind lacks, and drops only those (lamp → fuse: in, out)', () => {
		const r = changeKind(sample(), 'lamp', 'fuse');
		// The lamp had w2 on feed and w3 on earth; a fuse has neither name.
		expect(r.dropped.map((w) => w.id)).toEqual(['w2', 'w3']);
		expect(valid(r.doc).wires.map((w) => w.id)).toEqual(['w1']);
	});

	it('keeps a shared value that fits, and names its own terminals from the old ones (fuse → switch)', () => {
		const doc = updatePart(sample(), 'fuse', { params: { resistance: 0.02 } });
		const r = changeKind(doc, 'fuse', 'switch');
		const sw = valid(r.doc).parts.find((p) => p.id === 'fuse')!;
		expect(sw.terminals).toEqual(['in', 'out']);
		// Two positions: off joins nothing, on joins in–out, so the circuit still conducts as with the fuse.
		expect(sw.kind === 'switch' && sw.params.positions).toEqual([
			{ name: 'off', closed: [] },
			{ name: 'on', closed: [['in', 'out']] }
		]);
		expect(r.dropped).toEqual([]);
		// gauge → resistor: both have a resistance (58 Ω gauge heater, parts.ts), kept.
		const g = addParts(emptyDocument({ systemVoltage: 12, earth: 'negative' }), [createPart(emptyDocument({ systemVoltage: 12, earth: 'negative' }), 'gauge', { x: 0, y: 0 }, { id: 'g', key: '1' })]);
		const res = valid(changeKind(g, 'g', 'resistor').doc).parts[0];
		expect(res.kind === 'resistor' && res.params.resistance).toBe(58);
	});

	it('tops a one-terminal part up to two when it becomes a splice', () => {
		const r = changeKind(sample(), 'earth', 'splice');
		expect(valid(r.doc).parts.find((p) => p.id === 'earth')!.terminals).toEqual(['stud', '1']);
		expect(r.dropped).toEqual([]);
	});
});

describe('recoding wires for another palette', () => {
	const own = {
		id: 'account-x',
		name: 'Workshop codes',
		// Green renamed, so G is found by its code; brown and red by name; no white.
		colours: [
			{ code: 'G', name: 'grass green', display: '#2e7d32' },
			{ code: 'BR', name: 'brown', display: '#7b4a1e' },
			{ code: 'R', name: 'red', display: '#d32f2f' },
			{ code: 'B', name: 'black', display: '#1a1a1a' }
		]
	};

	it('lists the codes the new palette cannot write, with their wires, before anything changes', () => {
		// sample(): N (brown), R/W (red with white tracer), B (black). White is missing from "own".
		const r = recodeFor(sample(), own);
		expect(r.unmapped.map((u) => [u.code, u.wires.map((w) => w.id)])).toEqual([['R/W', ['w2']]]);
		expect(() => changePalette(sample(), own)).toThrow('The palette “Workshop codes” has no colour for R/W (1 wire).');
	});

	it('rewrites by colour name, then by the same code, and copies the palette in', () => {
		const doc = updateWire(addWire(sample(), { part: 'fuse', terminal: 'in' }, { part: 'earth', terminal: 'stud' }, { id: 'w4', code: 'G' }).doc, 'w2', { code: 'R' });
		const after = valid(changePalette(doc, own));
		// N brown → BR by name; R red → R; B black → B; G green has no "green" in own: same code G.
		expect(after.wires.map((w) => w.code)).toEqual(['BR', 'R', 'B', 'G']);
		expect(after.palette).toEqual(own);
		expect(after.palette).not.toBe(own);
	});
});
