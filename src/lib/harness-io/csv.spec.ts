import { describe, expect, it } from 'vitest';
import { decodeBytes, parseRecords, readLength, readSize, readWireList, sniffSeparator } from './csv';

describe('parseRecords (RFC 4180 §2)', () => {
	// The cases are the numbered rules of RFC 4180 §2 with its own example records.
	const cases: { rule: string; text: string; cells: string[][] }[] = [
		{ rule: '§2.1 CRLF ends a record', text: 'aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n', cells: [['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']] },
		{ rule: '§2.2 last record may lack a line break', text: 'aaa,bbb,ccc\r\nzzz,yyy,xxx', cells: [['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']] },
		{ rule: '§2.5 fields may be quoted', text: '"aaa","bbb","ccc"\r\nzzz,yyy,xxx', cells: [['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']] },
		{ rule: '§2.6 line breaks and commas inside quotes', text: '"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx', cells: [['aaa', 'b\r\nbb', 'ccc'], ['zzz', 'yyy', 'xxx']] },
		{ rule: '§2.7 a quote inside quotes is doubled', text: '"aaa","b""bb","ccc"', cells: [['aaa', 'b"bb', 'ccc']] },
		{ rule: 'empty fields (§2.4 allows any count, including none)', text: 'a,,c\r\n,,\r\n', cells: [['a', '', 'c'], ['', '', '']] }
	];
	for (const c of cases) {
		it(c.rule, () => {
			const r = parseRecords(c.text, ',');
			expect(r.issues).toEqual([]);
			expect(r.records.map((x) => x.cells)).toEqual(c.cells);
		});
	}

	it('counts lines inside quoted fields, so later rows keep their file line numbers', () => {
		// Worked by hand: the second record starts on line 1 and spans to line 2; the next starts on line 3.
		const r = parseRecords('"a\nb",c\nd,e\n', ',');
		expect(r.records.map((x) => x.row)).toEqual([1, 3]);
	});

	it('reports an unclosed quote on the row where it opened', () => {
		const r = parseRecords('a,b\n"c,d\ne,f\n', ',');
		expect(r.issues).toHaveLength(1);
		expect(r.issues[0]).toMatchObject({ row: 2, column: 'field 1' });
		expect(r.issues[0].expected).toMatch(/closing double quote/);
	});

	it('reports text after a closing quote', () => {
		const r = parseRecords('"ab"cd,e\n', ',');
		expect(r.issues[0]).toMatchObject({ row: 1, column: 'field 1' });
	});
});

describe('sniffSeparator', () => {
	const cases: [string, string, string][] = [
		['comma', 'from part,from terminal,to part\n1,+,5\n', ','],
		['semicolon with decimal commas (European spreadsheets, common practice)', 'from part;to part;size\n1;5;0,75\n2;6;1,5\n', ';'],
		['tab', 'from part\tto part\tcolour\n1\t5\tN\n', '\t'],
		['comma inside quotes does not fool it', '"a,b";c;d\n"e,f";g;h\n', ';']
	];
	for (const [name, text, sep] of cases) it(name, () => expect(sniffSeparator(text)).toBe(sep));
});

describe('decodeBytes', () => {
	it('strips a UTF-8 byte-order mark (EF BB BF, Unicode §23.8)', () => {
		const r = decodeBytes(new Uint8Array([0xef, 0xbb, 0xbf, 0x41, 0x2c, 0x42]));
		expect(r).toEqual({ text: 'A,B', encoding: 'utf-8' });
	});
	it('falls back to Windows-1252 for bytes that are not UTF-8', () => {
		// Windows-1252 table (WHATWG Encoding Standard, index-windows-1252): 0xB2 is "²", 0x80 is "€", 0xE9 is "é".
		const r = decodeBytes(new Uint8Array([0x31, 0x20, 0x6d, 0x6d, 0xb2, 0x20, 0x80, 0xe9]));
		expect(r).toEqual({ text: '1 mm² €é', encoding: 'windows-1252' });
	});
	it('reads UTF-16LE with its mark (FF FE)', () => {
		expect(decodeBytes(new Uint8Array([0xff, 0xfe, 0x41, 0x00, 0x3b, 0x00])).text).toBe('A;');
	});
});

describe('readSize and readLength', () => {
	const sizes: [string, boolean, 'mm2' | 'awg' | null, unknown][] = [
		['1', false, null, { mm2: 1 }],
		['0.75 mm2', false, null, { mm2: 0.75 }],
		['1,5 mm²', true, null, { mm2: 1.5 }],
		['18 AWG', false, null, { awg: 18 }],
		['AWG 10', false, null, { awg: 10 }],
		// ASTM B258: 4/0 (0000) is three sizes above 0; the schema writes 1/0 as 0, 4/0 as -3.
		['4/0 AWG', false, null, { awg: -3 }],
		['1/0 awg', false, null, { awg: 0 }],
		['16', false, 'awg', { awg: 16 }]
	];
	for (const [text, comma, unit, want] of sizes) it(`size ${text}`, () => expect(readSize(text, comma, unit)).toEqual(want));
	it('refuses a size that is not one', () => {
		expect(readSize('thick', false, null)).toMatch(/not a wire size/);
		expect(readSize('0', false, null)).toMatch(/outside/);
		expect(readSize('50 AWG', false, null)).toMatch(/not an AWG/);
	});
	const lengths: [string, boolean, number | RegExp][] = [
		['1.2', false, 1.2],
		['1.2 m', false, 1.2],
		['120 cm', false, 1.2],
		['0,35', true, 0.35],
		['350 mm', false, 0.35],
		['long', false, /not a length/],
		['250', false, /longer than 100 m/]
	];
	for (const [text, comma, want] of lengths) {
		it(`length ${text}`, () => {
			const r = readLength(text, comma);
			if (want instanceof RegExp) expect(r).toMatch(want);
			else expect(r).toBeCloseTo(want, 9);
		});
	}
});

describe('readWireList', () => {
	it('reads our own column names in any order, with aliases and spare columns', () => {
		const t = readWireList('Colour,From,From pin,To,To pin,Length (m),Size (mm²),Comment,Loom\r\nG/B,6,out,14,feed,1.5,0.75,behind dash,main\r\n');
		expect(t.issues).toEqual([]);
		expect(t.header).toBe(true);
		expect(t.wires).toEqual([
			{ row: 2, fromKey: '6', fromTerminal: 'out', toKey: '14', toTerminal: 'feed', code: 'G/B', size: { mm2: 0.75 }, lengthM: 1.5, notes: 'behind dash' }
		]);
	});

	it('reads a file without a header in the documented order', () => {
		const t = readWireList('1;+;5;1;N;2;0,4;\n');
		expect(t.header).toBe(false);
		expect(t.separator).toBe(';');
		expect(t.wires[0]).toMatchObject({ row: 1, fromKey: '1', fromTerminal: '+', toKey: '5', toTerminal: '1', code: 'N', size: { mm2: 2 }, lengthM: 0.4 });
	});

	it('reads a part table and a wire list separated by a blank line', () => {
		const text = 'key,kind,label,location,terminals\n1,battery,Battery,engine-bay,+ -\n5,joint,Feed joint,,1 2 3\n\nfrom part,from terminal,to part,to terminal,colour\n1,+,5,1,N\n';
		const t = readWireList(text);
		expect(t.issues).toEqual([]);
		expect(t.parts).toEqual([
			{ row: 2, key: '1', kind: 'battery', label: 'Battery', location: 'engine-bay', terminals: ['+', '-'] },
			{ row: 3, key: '5', kind: 'splice', label: 'Feed joint', terminals: ['1', '2', '3'] }
		]);
		expect(t.wires).toHaveLength(1);
		expect(t.wires[0].row).toBe(6);
	});

	it('reports every bad cell with its row, column and what was expected, and keeps bad rows out', () => {
		const text = [
			'from part,from terminal,to part,to terminal,colour,size,length,notes,from kind',
			'1,+,5,1,N,1,1,,battery', // row 2 good
			',+,5,2,N,1,1,,', // row 3: from part empty
			'6,out,14,feed,,thick,long,,', // row 4: colour empty, size, length
			'7,in,8,out,R,1,1,,lampp', // row 5: unknown kind
			'7,in,8,out,R,1,1,,,surplus' // row 6: more cells than the header
		].join('\n');
		const t = readWireList(text);
		expect(t.wires.map((w) => w.row)).toEqual([2]);
		expect(t.badRows).toEqual([3, 4, 5, 6]);
		expect(t.issues.map((i) => [i.row, i.column])).toEqual([
			[3, 'from part'],
			[4, 'colour'],
			[4, 'size'],
			[4, 'length'],
			[5, 'from kind'],
			[6, 'field 10']
		]);
		for (const i of t.issues) expect(i.expected.length).toBeGreaterThan(5);
	});

	it('skips comment lines and keeps file line numbers', () => {
		const t = readWireList('# planted errors: see notes\nfrom part,to part,from terminal,to terminal,colour\n1,5,+,1,N\n');
		expect(t.wires[0].row).toBe(3);
	});

	it('strips the formula guard written on export', () => {
		const t = readWireList("from part,from terminal,to part,to terminal,colour,notes\n1,-,5,1,N,'=not a formula\n");
		expect(t.wires[0]).toMatchObject({ fromTerminal: '-', notes: '=not a formula' });
	});

	it('decodes Windows-1252 bytes (an old spreadsheet’s "CSV")', () => {
		// "Lampe arrière" with è as 0xE8 in Windows-1252 (WHATWG index-windows-1252).
		const head = new TextEncoder().encode('key,kind,label\n31,lamp,Lampe arri');
		const bytes = new Uint8Array([...head, 0xe8, 0x72, 0x65, 0x0a]);
		const t = readWireList(bytes);
		expect(t.encoding).toBe('windows-1252');
		expect(t.parts[0].label).toBe('Lampe arrière');
	});
});
