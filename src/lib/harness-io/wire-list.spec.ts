import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { emptyDocument, parseDocument, type HarnessDocument } from '../circuit/schema';
import { readWireList, splitTerminals, WIRE_LIST_EXAMPLE } from './csv';
import { csvCell, harnessSheetCsv, keyTableCsv, planImport, wireListCsv } from './wire-list';

/** What a CSV can carry of a document: parts by key, wires by their ends' keys. */
function comparable(doc: HarnessDocument) {
	const key = new Map(doc.parts.map((p) => [p.id, p.key]));
	return {
		parts: doc.parts.map((p) => ({ key: p.key, kind: p.kind, label: p.label, location: p.location, terminals: p.terminals, notes: p.notes })).sort((a, b) => a.key.localeCompare(b.key)),
		wires: doc.wires
			.map((w) => ({ from: `${key.get(w.from.part)} ${w.from.terminal}`, to: `${key.get(w.to.part)} ${w.to.terminal}`, code: w.code, size: w.size, lengthM: w.lengthM, lengthMeasured: w.lengthMeasured === true, notes: w.notes }))
			.sort((a, b) => `${a.from}>${a.to}`.localeCompare(`${b.from}>${b.to}`))
	};
}

const empty = () => emptyDocument({ systemVoltage: 12, earth: 'positive' });

describe('every problem of every row', () => {
	it('names both problems of a row with an unknown colour and a size that is not a size', () => {
		const text = 'from part,from terminal,to part,to terminal,colour,size,length,notes\n1,+,2,in,ZZ,abc,1,\n1,+,2,in,R,1,1,\n';
		const plan = planImport(empty(), readWireList(text));
		expect(plan.issues.filter((i) => i.row === 2).map((i) => i.column)).toEqual(['size', 'colour']);
		expect(plan.badRows).toEqual([2]);
		expect(plan.goodRows).toBe(1);
		// The held-back row creates nothing: only the good row's parts and wire.
		expect(plan.summary.addedWires).toBe(1);
	});
});

describe('the accepted format', () => {
	it('reads its own example without a problem, part table included', () => {
		const table = readWireList(WIRE_LIST_EXAMPLE);
		expect(table.issues).toEqual([]);
		expect(table.parts.find((p) => p.key === '5')!.terminals).toEqual(['30', '15', '50']);
		const plan = planImport(empty(), table);
		expect(plan.issues).toEqual([]);
		expect(plan.summary.addedParts).toEqual(['1', '5', '6']);
		expect(plan.summary.addedWires).toBe(2);
	});

	it.each([
		['feed earth', ['feed', 'earth']],
		['feed;earth', ['feed', 'earth']],
		['feed, earth', ['feed', 'earth']],
		['feed|earth', ['feed', 'earth']],
		// DIN 72552 terminal numbers as a switch's terminals.
		['30 ; 15 ; 50', ['30', '15', '50']]
	])('splits the terminals cell %j', (cell, names) => expect(splitTerminals(cell)).toEqual(names));

	it('takes terminals typed with semicolons in a quoted cell of a comma-separated part table', () => {
		const text = 'key,kind,terminals\n7,connector,"feed;earth"\n\nfrom part,from terminal,to part,to terminal,colour\n7,feed,7,earth,B\n';
		const plan = planImport(empty(), readWireList(text));
		expect(plan.issues).toEqual([]);
		expect(plan.document.parts.find((p) => p.key === '7')!.terminals).toEqual(['feed', 'earth']);
	});
});

describe('planImport', () => {
	it('rebuilds the demo harness’s parts and wires from its own CSV export', () => {
		// Two wires marked measured, so the "length measured" column carries both yes and no.
		const drawn = demoHarness();
		const demo = { ...drawn, wires: drawn.wires.map((w, i) => (i < 2 ? { ...w, lengthMeasured: true } : w)) };
		const plan = planImport(empty(), readWireList(harnessSheetCsv(demo)));
		expect(plan.issues).toEqual([]);
		expect(parseDocument(plan.document).ok).toBe(true);
		expect(comparable(plan.document)).toEqual(comparable(demo));
		expect(plan.summary.addedParts).toHaveLength(demo.parts.length);
		expect(plan.summary.addedWires).toBe(demo.wires.length);
	});

	it('importing the same list again changes nothing (wires matched by their ends)', () => {
		const demo = demoHarness();
		const once = planImport(empty(), readWireList(harnessSheetCsv(demo))).document;
		const twice = planImport(once, readWireList(harnessSheetCsv(demo)));
		expect(twice.document).toBe(once);
		expect(twice.summary).toEqual({ addedParts: [], updatedParts: [], addedWires: 0, updatedWires: 0, addedTerminals: [] });
	});

	it('merges into an existing document: creates missing parts by key, adds terminals, leaves the input alone', () => {
		// Worked by hand: part 1 (battery) exists; 20 is new with its kind from the kind column;
		// 21 is new with no kind (a generic load, terminals as used plus a spare); splice 5 gains 4.
		const doc = parseDocument({
			schemaVersion: 1,
			vehicle: { systemVoltage: 12, earth: 'negative' },
			parts: [
				{ id: 'bat', key: '1', kind: 'battery' },
				{ id: 'sp', key: '5', kind: 'splice', terminals: ['1', '2', '3'] }
			],
			wires: [{ id: 'w1', from: { part: 'bat', terminal: '+' }, to: { part: 'sp', terminal: '1' }, code: 'N' }]
		});
		if (!doc.ok) throw new Error('fixture');
		const before = JSON.stringify(doc.document);
		const text = 'from part,from terminal,to part,to terminal,colour,size,length,notes,to kind\n5,4,20,in,g/b,18 awg,2,,fuse\n20,out,21,a,W,,,spare feed,\n';
		const plan = planImport(doc.document, readWireList(text));
		expect(plan.issues).toEqual([]);
		expect(JSON.stringify(doc.document)).toBe(before);
		const d = plan.document;
		expect(d.parts.find((p) => p.key === '5')!.terminals).toEqual(['1', '2', '3', '4']);
		expect(d.parts.find((p) => p.key === '20')).toMatchObject({ kind: 'fuse', terminals: ['in', 'out'] });
		expect(d.parts.find((p) => p.key === '21')).toMatchObject({ kind: 'load', terminals: ['a', '1'] });
		expect(d.wires).toHaveLength(3);
		expect(d.wires[1]).toMatchObject({ code: 'G/B', size: { awg: 18 }, lengthM: 2 });
		expect(d.wires[2]).toMatchObject({ code: 'W', size: { mm2: 1 }, lengthM: 1, notes: 'spare feed' });
		expect(plan.summary).toMatchObject({ addedParts: ['20', '21'], addedWires: 2, addedTerminals: ['5 4'] });
	});

	it('reports document problems per row: unknown colour, wrong terminal, kind clash, held-back part rows', () => {
		const text = [
			'key,kind,label,terminals',
			'30,lamp,Tail lamp,', // row 2 good
			'31,fuse,Fuse,a b', // row 3: a fuse has in, out
			'',
			'from part,from terminal,to part,to terminal,colour,to kind',
			'30,feed,32,1,Q,', // row 6: Q is not a trade-letters code
			'30,middle,32,2,R,', // row 7: a lamp has feed, earth
			'32,3,30,earth,B,fuse', // row 8: 30 is a lamp (row 2), not a fuse
			'31,in,32,4,R,', // row 9: part 31's row has a problem
			'30,earth,32,5,B,' // row 10 good
		].join('\n');
		const plan = planImport(empty(), readWireList(text));
		expect(plan.issues.map((i) => [i.row, i.column])).toEqual([
			[3, 'terminals'],
			[6, 'colour'],
			[7, 'from terminal'],
			[8, 'to kind'],
			[9, 'from part']
		]);
		expect(plan.badRows).toEqual([3, 6, 7, 8, 9]);
		expect(plan.goodRows).toBe(2);
		expect(plan.document.parts.map((p) => p.key).sort()).toEqual(['30', '32']);
		expect(plan.document.wires).toHaveLength(1);
	});

	it('marks and unmarks measured lengths from the "length measured" column; an empty cell leaves the wire as it is', () => {
		const doc = parseDocument({
			schemaVersion: 1,
			vehicle: { systemVoltage: 12, earth: 'negative' },
			parts: [
				{ id: 'bat', key: '1', kind: 'battery' },
				{ id: 'sp', key: '5', kind: 'splice', terminals: ['1', '2', '3'] }
			],
			wires: [
				{ id: 'w1', from: { part: 'bat', terminal: '+' }, to: { part: 'sp', terminal: '1' }, code: 'N', lengthMeasured: true },
				{ id: 'w2', from: { part: 'bat', terminal: '-' }, to: { part: 'sp', terminal: '2' }, code: 'B', lengthMeasured: true }
			]
		});
		if (!doc.ok) throw new Error('fixture');
		const text = 'from part,from terminal,to part,to terminal,colour,length,measured\n1,+,5,1,N,0.4,no\n1,-,5,2,B,0.3,\n5,3,1,+,N,0.2,Yes\n';
		const plan = planImport(doc.document, readWireList(text));
		expect(plan.issues).toEqual([]);
		const [w1, w2, w3] = plan.document.wires;
		expect('lengthMeasured' in w1).toBe(false);
		expect(w2).toMatchObject({ lengthM: 0.3, lengthMeasured: true });
		expect(w3).toMatchObject({ lengthM: 0.2, lengthMeasured: true });
	});

	it('names the row and column of a "length measured" cell that is not yes or no', () => {
		const text = 'from part,from terminal,to part,to terminal,colour,length measured\n1,+,5,1,N,yes\n1,-,5,2,B,maybe\n';
		const table = readWireList(text);
		expect(table.issues).toEqual([{ row: 3, column: 'length measured', message: '"maybe" is not yes or no', expected: expect.stringMatching(/^yes or no/) }]);
		expect(table.badRows).toEqual([3]);
		expect(table.wires.map((w) => [w.row, w.lengthMeasured])).toEqual([[2, true]]);
	});

	it('refuses to change the kind of an existing part', () => {
		const doc = parseDocument({ schemaVersion: 1, vehicle: { systemVoltage: 12, earth: 'negative' }, parts: [{ id: 'l', key: '9', kind: 'lamp' }] });
		if (!doc.ok) throw new Error('fixture');
		const plan = planImport(doc.document, readWireList('key,kind\n9,gauge\n'));
		expect(plan.issues).toHaveLength(1);
		expect(plan.issues[0]).toMatchObject({ row: 2, column: 'kind' });
		expect(plan.document).toBe(doc.document);
	});
});

describe('CSV export', () => {
	it('quotes per RFC 4180 §2.6–2.7 and guards formula-like cells (OWASP CSV Injection)', () => {
		expect(csvCell('a,b')).toBe('"a,b"');
		expect(csvCell('say "hi"')).toBe('"say ""hi"""');
		expect(csvCell('two\nlines')).toBe('"two\nlines"');
		expect(csvCell('=1+2')).toBe("'=1+2");
		expect(csvCell('-')).toBe('-'); // a battery terminal is not a formula
		expect(csvCell('a;b', ';')).toBe('"a;b"');
	});

	it('writes the key table and wire list with keys, not ids', () => {
		const demo = demoHarness();
		const keys = keyTableCsv(demo).split('\r\n');
		expect(keys[0]).toBe('key,kind,label,location,terminals,notes');
		expect(keys).toHaveLength(demo.parts.length + 2);
		const wires = wireListCsv(demo).split('\r\n');
		expect(wires[0]).toBe('from part,from terminal,to part,to terminal,colour,size,length m,length measured,notes');
		const first = demo.wires[0];
		const key = (id: string) => demo.parts.find((p) => p.id === id)!.key;
		expect(wires[1].startsWith(`${key(first.from.part)},${csvCell(first.from.terminal)},${key(first.to.part)},`)).toBe(true);
	});
});
