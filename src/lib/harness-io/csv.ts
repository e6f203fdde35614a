/**
 * Reading a wire list from CSV text or bytes: decoding, separator sniffing, RFC 4180 fields,
 * header detection with our own column names (and forgiving aliases), and checking each cell.
 * Pure: no document knowledge here (colour codes and part terminals are checked in wire-list.ts).
 *
 * A file holds one or two tables, each starting with its header row and ended by a blank line:
 *  - the wire list: from part, from terminal, to part, to terminal, colour, size, length, notes
 *    (optional: from kind, to kind, length measured);
 *  - optionally a part table: key, kind, label, location, terminals, notes.
 * A file whose first row is not a header is read as a wire list in the documented column order.
 * Lines starting with `#` before a row are comments.
 *
 * Fields follow RFC 4180 §2 (https://www.rfc-editor.org/rfc/rfc4180#section-2): a field may be
 * enclosed in double quotes; inside quotes, separators and line breaks are data and a quote is
 * written twice. As spreadsheets do, LF or CR alone also ends a record.
 */
import { LOCATIONS, PART_KINDS, type Location, type PartKind } from '../circuit/parts';

export type Separator = ',' | ';' | '\t';
export type Encoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

/** One problem with the file: which row (line number in the file), which column, what, and what would do. */
export interface CsvIssue {
	row: number;
	/** The column as its header names it (or the documented name); empty for the whole row. */
	column: string;
	message: string;
	expected: string;
}

export type WireSize = { mm2: number } | { awg: number };

export interface WireRow {
	row: number;
	fromKey: string;
	fromTerminal: string;
	toKey: string;
	toTerminal: string;
	code: string;
	/** Missing when the cell was empty (the document's default, 1 mm², applies). */
	size?: WireSize;
	/** Metres; missing when the cell was empty (default 1 m). */
	lengthM?: number;
	/** Whether the length was measured on the vehicle; missing when the cell was empty (left as it is). */
	lengthMeasured?: boolean;
	notes?: string;
	fromKind?: PartKind;
	toKind?: PartKind;
}

export interface PartRow {
	row: number;
	key: string;
	kind?: PartKind;
	label?: string;
	location?: Location;
	terminals?: string[];
	notes?: string;
}

export interface WireListTable {
	encoding: Encoding;
	separator: Separator;
	/** Whether the wire list had a header row (otherwise the documented order was assumed). */
	header: boolean;
	wires: WireRow[];
	/** Wire rows with a problem in the file (a size that is not a size, …), as far as they could be read: the import checks them for the diagram's problems too, so every problem of a row is named at once. */
	badWires: WireRow[];
	parts: PartRow[];
	issues: CsvIssue[];
	/** Row numbers of data rows with at least one problem. */
	badRows: number[];
	/** Part table rows with a problem, by key number (wires naming these keys are held back too). */
	badPartKeys: { key: string; row: number }[];
	/** Data rows read (good and bad), both tables. */
	dataRows: number;
}

// ---------------------------------------------------------------------------------------------
// Columns: our names first, then aliases people use in their own spreadsheets.

/** How the part table's terminals cell may be separated, in words for the messages and the import dialog. */
export const TERMINALS_SEPARATED = 'separated by spaces, semicolons, commas or |';

/**
 * A part table's terminals cell as names: "feed earth", "feed;earth", "feed, earth" and "feed|earth"
 * all read as feed and earth (people type the separator they are used to; terminal names
 * themselves never hold one, DIN 72552 numbers included).
 * @example splitTerminals('30; 15, 50') // ['30', '15', '50']
 */
export function splitTerminals(cell: string): string[] {
	return cell.split(/[\s|;,]+/).filter(Boolean);
}

/** A short wire list with a part table, as the import dialog shows it: the accepted format by example (invented parts). */
export const WIRE_LIST_EXAMPLE = [
	'key,kind,label,location,terminals',
	'1,battery,Battery,engine-bay,',
	'5,switch,Ignition switch,dash,30;15;50',
	'6,fuse,Fuse (ignition),engine-bay,',
	'',
	'from part,from terminal,to part,to terminal,colour,size,length,notes',
	'1,+,5,30,N,2,0.8,',
	'5,15,6,in,W,1,0.6,behind the dash'
].join('\n');

export const WIRE_COLUMNS = ['from part', 'from terminal', 'to part', 'to terminal', 'colour', 'size', 'length', 'notes'] as const;
export const PART_COLUMNS = ['key', 'kind', 'label', 'location', 'terminals', 'notes'] as const;

type WireField = (typeof WIRE_COLUMNS)[number] | 'from kind' | 'to kind' | 'length measured';
type PartField = (typeof PART_COLUMNS)[number];

const WIRE_ALIASES: Record<WireField, string[]> = {
	'from part': ['from part', 'from', 'from key', 'from part key', 'from key number', 'from no', 'part a', 'a part', 'source', 'start part', 'end a'],
	'from terminal': ['from terminal', 'from term', 'from pin', 'from terminal name', 'terminal a', 'a terminal', 'source terminal', 'start terminal', 'pin a'],
	'to part': ['to part', 'to', 'to key', 'to part key', 'to key number', 'to no', 'part b', 'b part', 'destination', 'end part', 'end b'],
	'to terminal': ['to terminal', 'to term', 'to pin', 'to terminal name', 'terminal b', 'b terminal', 'destination terminal', 'end terminal', 'pin b'],
	colour: ['colour', 'color', 'colour code', 'color code', 'code', 'wire colour', 'wire color', 'cable colour', 'cable color'],
	size: ['size', 'wire size', 'cross section', 'csa', 'mm2', 'size mm2', 'awg', 'size awg', 'gauge'],
	length: ['length', 'length m', 'len', 'metres', 'meters', 'wire length'],
	notes: ['notes', 'note', 'comment', 'comments', 'remarks'],
	'length measured': ['length measured', 'measured', 'length is measured', 'length checked'],
	'from kind': ['from kind', 'from type', 'from part kind'],
	'to kind': ['to kind', 'to type', 'to part kind']
};

const PART_ALIASES: Record<PartField, string[]> = {
	key: ['key', 'key number', 'key no', 'part key', 'number', 'no', 'item'],
	kind: ['kind', 'type', 'part kind', 'part type'],
	label: ['label', 'name', 'description', 'part name'],
	location: ['location', 'where', 'zone', 'place'],
	terminals: ['terminals', 'terminal names', 'pins'],
	notes: ['notes', 'note', 'comment', 'comments', 'remarks']
};

/** Lower case, ² as 2, everything that is not a letter or digit as one space. */
export function normaliseHeader(cell: string): string {
	return cell
		.toLowerCase()
		.replace(/²/g, '2')
		.replace(/[^a-z0-9]+/g, ' ')
		.trim();
}

function matchColumns<F extends string>(cells: string[], aliases: Record<F, string[]>): Map<number, F> {
	const found = new Map<number, F>();
	const used = new Set<F>();
	cells.forEach((cell, i) => {
		const n = normaliseHeader(cell);
		if (!n) return;
		for (const field of Object.keys(aliases) as F[]) {
			if (!used.has(field) && aliases[field].includes(n)) {
				found.set(i, field);
				used.add(field);
				return;
			}
		}
	});
	return found;
}

/** Part kinds by our ids and the words people write. */
const KIND_WORDS: Record<string, PartKind> = {
	...Object.fromEntries(PART_KINDS.map((k) => [k, k])),
	...Object.fromEntries(PART_KINDS.map((k) => [k.replace(/-/g, ' '), k])),
	earth: 'earth-point',
	ground: 'earth-point',
	'earth stud': 'earth-point',
	stabiliser: 'stabilizer',
	'voltage stabilizer': 'stabilizer',
	'voltage stabiliser': 'stabilizer',
	coil: 'ignition-coil',
	bulb: 'lamp',
	joint: 'splice',
	plug: 'connector',
	dynamo: 'generator',
	alternator: 'generator',
	generic: 'load',
	'other load': 'load',
	other: 'load',
	'fuel sender': 'sender',
	'gauge sender': 'sender'
};

export function readKind(text: string): PartKind | undefined {
	return KIND_WORDS[normaliseHeader(text)];
}

export const KIND_EXPECTED = `one of ${PART_KINDS.join(', ')}`;

// ---------------------------------------------------------------------------------------------
// Bytes to text.

/**
 * Decodes file bytes: a byte-order mark decides (UTF-8, UTF-16); otherwise strict UTF-8, and
 * Windows-1252 (what older spreadsheets save as "CSV") when the bytes are not valid UTF-8.
 */
export function decodeBytes(bytes: Uint8Array): { text: string; encoding: Encoding } {
	if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) {
		return { text: new TextDecoder('utf-8').decode(bytes.subarray(3)), encoding: 'utf-8' };
	}
	if (bytes[0] === 0xff && bytes[1] === 0xfe) return { text: new TextDecoder('utf-16le').decode(bytes.subarray(2)), encoding: 'utf-16le' };
	if (bytes[0] === 0xfe && bytes[1] === 0xff) return { text: new TextDecoder('utf-16be').decode(bytes.subarray(2)), encoding: 'utf-16be' };
	try {
		return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes), encoding: 'utf-8' };
	} catch {
		return { text: decodeWindows1252(bytes), encoding: 'windows-1252' };
	}
}

/**
 * Windows-1252 by hand: TextDecoder('windows-1252') is ISO-8859-1 in Node builds without full
 * ICU, which gets 0x80–0x9F wrong. 0x80–0x9F from the WHATWG Encoding Standard's
 * index-windows-1252 (five unassigned bytes keep their C1 code point, as the index does);
 * every other byte is its own code point.
 */
const CP1252_HIGH = [
	0x20ac, 0x81, 0x201a, 0x192, 0x201e, 0x2026, 0x2020, 0x2021, 0x2c6, 0x2030, 0x160, 0x2039, 0x152, 0x8d, 0x17d, 0x8f,
	0x90, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x2dc, 0x2122, 0x161, 0x203a, 0x153, 0x9d, 0x17e, 0x178
];
export function decodeWindows1252(bytes: Uint8Array): string {
	let out = '';
	for (let i = 0; i < bytes.length; i += 4096) {
		const chunk = Array.from(bytes.subarray(i, i + 4096), (b) => (b >= 0x80 && b < 0xa0 ? CP1252_HIGH[b - 0x80] : b));
		out += String.fromCharCode(...chunk);
	}
	return out;
}

// ---------------------------------------------------------------------------------------------
// Records (RFC 4180).

export interface CsvRecord {
	/** Line number (1-based) where the record starts. */
	row: number;
	cells: string[];
	/** A comment line (`#` first). */
	comment?: boolean;
	/** A quoted field ran to the end of the file: the cells mean nothing. */
	broken?: boolean;
}

/** Splits text into records of cells. Problems with quoting are issues on the record's row. */
export function parseRecords(text: string, separator: Separator): { records: CsvRecord[]; issues: CsvIssue[] } {
	const records: CsvRecord[] = [];
	const issues: CsvIssue[] = [];
	let line = 1;
	let i = 0;
	const n = text.length;
	if (text.charCodeAt(0) === 0xfeff) i = 1;
	while (i < n) {
		const row = line;
		if (text[i] === '#') {
			let end = i;
			while (end < n && text[end] !== '\n' && text[end] !== '\r') end++;
			records.push({ row, cells: [text.slice(i, end)], comment: true });
			i = end;
			if (text[i] === '\r' && text[i + 1] === '\n') i++;
			i++;
			line++;
			continue;
		}
		const cells: string[] = [];
		let cell = '';
		let done = false;
		let broken = false;
		while (!done) {
			if (i >= n) {
				cells.push(cell);
				break;
			}
			const c = text[i];
			if (c === '"' && cell === '') {
				// A quoted field (RFC 4180 §2.5–2.7).
				const started = line;
				i++;
				let closed = false;
				while (i < n) {
					if (text[i] === '"') {
						if (text[i + 1] === '"') {
							cell += '"';
							i += 2;
							continue;
						}
						closed = true;
						i++;
						break;
					}
					if (text[i] === '\n' || (text[i] === '\r' && text[i + 1] !== '\n')) line++;
					cell += text[i];
					i++;
				}
				if (!closed) {
					broken = true;
					issues.push({ row: started, column: `field ${cells.length + 1}`, message: 'a quoted field is never closed, so the rest of the file was read into it', expected: 'a closing double quote (write a quote inside a field as "")' });
				} else if (i < n && text[i] !== separator && text[i] !== '\n' && text[i] !== '\r') {
					let stray = '';
					while (i < n && text[i] !== separator && text[i] !== '\n' && text[i] !== '\r') stray += text[i++];
					issues.push({ row, column: `field ${cells.length + 1}`, message: `text ${JSON.stringify(stray)} after the closing quote`, expected: 'the separator or the end of the line right after a closing quote' });
					cell += stray;
				}
				continue;
			}
			if (c === separator) {
				cells.push(cell);
				cell = '';
				i++;
				continue;
			}
			if (c === '\r' || c === '\n') {
				cells.push(cell);
				if (c === '\r' && text[i + 1] === '\n') i++;
				i++;
				line++;
				done = true;
				continue;
			}
			cell += c;
			i++;
		}
		records.push(broken ? { row, cells, broken } : { row, cells });
	}
	return { records, issues };
}

/**
 * Picks the separator that splits the first rows most consistently into more than one cell.
 * Ties go to tab, then semicolon (spreadsheets in decimal-comma locales), then comma.
 */
export function sniffSeparator(text: string): Separator {
	const sample = text.slice(0, 20_000);
	let best: Separator = ',';
	let bestScore = -1;
	for (const sep of ['\t', ';', ','] as Separator[]) {
		const rows = parseRecords(sample, sep)
			.records.filter((r) => !r.comment && r.cells.some((c) => c.trim()))
			.slice(0, 20);
		if (!rows.length) continue;
		const counts = new Map<number, number>();
		for (const r of rows) counts.set(r.cells.length, (counts.get(r.cells.length) ?? 0) + 1);
		let mode = 1;
		let modeRows = 0;
		for (const [cols, k] of counts) if (k > modeRows || (k === modeRows && cols > mode)) [mode, modeRows] = [cols, k];
		if (mode < 2) continue;
		const score = modeRows * 1000 + mode;
		if (score > bestScore) [best, bestScore] = [sep, score];
	}
	return best;
}

// ---------------------------------------------------------------------------------------------
// Cells.

/** Undoes the spreadsheet-formula guard written on export (see wire-list.ts `csvCell`). */
function unguard(cell: string): string {
	return /^'[=+\-@]/.test(cell) ? cell.slice(1) : cell;
}

function readNumber(text: string, decimalComma: boolean): number | null {
	const t = decimalComma ? text.replace(',', '.') : text;
	if (!/^\d+(\.\d+)?$|^\.\d+$/.test(t)) return null;
	return Number(t);
}

/** AWG sizes above 0 written as n/0 ("2/0" is -1 in the schema's integer AWG). */
function readAwg(text: string): number | null {
	const ought = /^([1-4])\/0$/.exec(text);
	if (ought) return 1 - Number(ought[1]);
	if (/^0{2,4}$/.test(text)) return 1 - text.length;
	return /^\d{1,2}$/.test(text) ? Number(text) : null;
}

export const SIZE_EXPECTED = 'a cross-section in mm² up to 200 (like 0.75, 1 mm2, 1,5 mm²) or an AWG size from 4/0 to 40 (like 18 AWG)';
export const LENGTH_EXPECTED = 'a length in metres from 0 to 100 (like 1.2, 1.2 m, 120 cm)';

/** A size cell; `unit` is the header's hint when it says mm² or AWG. */
export function readSize(raw: string, decimalComma: boolean, unit: 'mm2' | 'awg' | null): WireSize | string {
	const t = raw.trim().toLowerCase().replace(/\s+/g, ' ');
	const awg = /^(?:awg ?(\S+)|(\S+?) ?(?:awg|ga|gauge))$/.exec(t);
	if (awg || unit === 'awg') {
		const a = readAwg(awg ? (awg[1] ?? awg[2]) : t);
		if (a === null || a < -3 || a > 40) return `"${raw}" is not an AWG size`;
		return { awg: a };
	}
	const mm = /^(.+?) ?(?:mm2|mm²|mm\^2|sq ?mm|mm)?$/.exec(t.replace('²', '2'));
	const v = mm ? readNumber(mm[1], decimalComma) : null;
	if (v === null) return `"${raw}" is not a wire size`;
	if (v <= 0 || v > 200) return `${v} mm² is outside 0–200 mm²`;
	return { mm2: v };
}

export function readLength(raw: string, decimalComma: boolean): number | string {
	const t = raw.trim().toLowerCase();
	const m = /^(.+?) ?(m|cm|mm|metres?|meters?)?$/.exec(t);
	const v = m ? readNumber(m[1], decimalComma) : null;
	if (v === null) return `"${raw}" is not a length`;
	const metres = m![2] === 'cm' ? v / 100 : m![2] === 'mm' ? v / 1000 : v;
	if (metres > 100) return `${metres} m is longer than 100 m`;
	return Math.round(metres * 1e6) / 1e6;
}

export const MEASURED_EXPECTED = 'yes or no (yes: the length was measured on the vehicle), or an empty cell';
const YES = new Set(['yes', 'y', 'true', '1', 'x', 'measured']);
const NO = new Set(['no', 'n', 'false', '0', 'not measured']);

/** A "length measured" cell: yes or no in the words a spreadsheet uses. */
export function readMeasured(raw: string): boolean | string {
	const t = normaliseHeader(raw);
	if (YES.has(t) || raw.trim() === '✓') return true;
	if (NO.has(t)) return false;
	return `"${raw}" is not yes or no`;
}

/** Limits from the document schema (src/lib/circuit/schema.ts). */
const KEY_MAX = 16;
const TERMINAL_MAX = 32;
const LABEL_MAX = 120;
const NOTES_MAX = 2000;

// ---------------------------------------------------------------------------------------------
// The whole file.

type Section =
	| { type: 'wires'; columns: Map<number, WireField>; names: Map<WireField, string>; width: number; sizeUnit: 'mm2' | 'awg' | null }
	| { type: 'parts'; columns: Map<number, PartField>; names: Map<PartField, string>; width: number };

function wireHeader(cells: string[]): Section | null {
	const columns = matchColumns(cells, WIRE_ALIASES);
	const fields = new Set(columns.values());
	if (!fields.has('from part') || !fields.has('to part')) return null;
	const names = new Map<WireField, string>();
	let sizeUnit: 'mm2' | 'awg' | null = null;
	for (const [i, f] of columns) {
		names.set(f, cells[i].trim());
		if (f === 'size') {
			const n = normaliseHeader(cells[i]);
			sizeUnit = /awg|gauge/.test(n) ? 'awg' : /mm2/.test(n) ? 'mm2' : null;
		}
	}
	return { type: 'wires', columns, names, width: cells.length, sizeUnit };
}

function partHeader(cells: string[]): Section | null {
	const columns = matchColumns(cells, PART_ALIASES);
	const fields = new Set(columns.values());
	if (!fields.has('key') || fields.size < 2) return null;
	const names = new Map<PartField, string>();
	for (const [i, f] of columns) names.set(f, cells[i].trim());
	return { type: 'parts', columns, names, width: cells.length };
}

function defaultWireSection(): Section {
	const columns = new Map<number, WireField>(WIRE_COLUMNS.map((f, i) => [i, f]));
	return { type: 'wires', columns, names: new Map(WIRE_COLUMNS.map((f) => [f, f])), width: WIRE_COLUMNS.length, sizeUnit: null };
}

export interface ReadOptions {
	separator?: Separator;
}

/**
 * Reads a wire list (and an optional part table) from CSV text or bytes.
 * @example readWireList('from part,from terminal,to part,to terminal,colour\n1,+,6,in,N\n').wires[0]
 *   // { row: 2, fromKey: '1', fromTerminal: '+', toKey: '6', toTerminal: 'in', code: 'N' }
 */
export function readWireList(input: string | Uint8Array, options: ReadOptions = {}): WireListTable {
	const { text, encoding } = typeof input === 'string' ? { text: input, encoding: 'utf-8' as Encoding } : decodeBytes(input);
	const separator = options.separator ?? sniffSeparator(text);
	const decimalComma = separator !== ',';
	const { records, issues } = parseRecords(text, separator);
	const wires: WireRow[] = [];
	const parts: PartRow[] = [];
	let section: Section | null = null;
	let sawWireHeader = false;
	let sawAnySection = false;
	let dataRows = 0;

	for (const rec of records) {
		if (rec.comment) continue;
		const cells = rec.cells.map((c) => unguard(c));
		if (cells.every((c) => !c.trim())) {
			section = null; // a blank line ends a table
			continue;
		}
		const header = wireHeader(cells) ?? partHeader(cells);
		if (header) {
			section = header;
			sawAnySection = true;
			if (header.type === 'wires') sawWireHeader = true;
			continue;
		}
		if (!section) {
			if (sawAnySection) {
				issues.push({ row: rec.row, column: '', message: 'a row after a blank line that does not start with a header row', expected: `a header row first: ${WIRE_COLUMNS.join(', ')} (or key, kind, label, … for the part table)` });
				continue;
			}
			// No header at all: the documented column order.
			section = defaultWireSection();
			sawAnySection = true;
		}
		dataRows++;
		if (rec.broken) continue; // already reported; its cells are the rest of the file
		const problems: CsvIssue[] = [];
		const extra = cells.slice(section.width).findIndex((c) => c.trim() !== '');
		if (extra !== -1) {
			problems.push({ row: rec.row, column: `field ${section.width + extra + 1}`, message: `this row has ${cells.length} cells; the header has ${section.width}`, expected: `at most ${section.width} cells (check for an unquoted separator inside a cell)` });
		}
		if (section.type === 'wires') {
			const row = readWireRow(rec.row, cells, section, decimalComma, problems);
			if (row) wires.push(row);
		} else {
			const row = readPartRow(rec.row, cells, section, problems);
			if (row) parts.push(row);
		}
		issues.push(...problems);
	}
	const badRows = [...new Set(issues.map((i) => i.row))].sort((a, b) => a - b);
	// Rows with any problem are not returned as good rows.
	const bad = new Set(badRows);
	return {
		encoding,
		separator,
		header: sawWireHeader,
		wires: wires.filter((w) => !bad.has(w.row)),
		badWires: wires.filter((w) => bad.has(w.row)),
		parts: parts.filter((p) => !bad.has(p.row)),
		badPartKeys: parts.filter((p) => bad.has(p.row) && p.key).map((p) => ({ key: p.key, row: p.row })),
		issues: issues.sort((a, b) => a.row - b.row),
		badRows,
		dataRows
	};
}

function cellOf<F extends string>(cells: string[], columns: Map<number, F>, field: F): string {
	for (const [i, f] of columns) if (f === field) return (cells[i] ?? '').trim();
	return '';
}

function readWireRow(row: number, cells: string[], section: Extract<Section, { type: 'wires' }>, decimalComma: boolean, problems: CsvIssue[]): WireRow | null {
	const get = (f: WireField) => cellOf(cells, section.columns, f);
	const col = (f: WireField) => section.names.get(f) ?? f;
	const need = (f: WireField, max: number, what: string) => {
		const v = get(f);
		if (!v) problems.push({ row, column: col(f), message: `${what} is empty`, expected: `${what}, as in the manual` });
		else if (v.length > max) problems.push({ row, column: col(f), message: `${what} "${v}" is ${v.length} characters long`, expected: `at most ${max} characters` });
		return v;
	};
	const fromKey = need('from part', KEY_MAX, 'the key number of the part the wire starts at');
	const fromTerminal = need('from terminal', TERMINAL_MAX, 'the terminal the wire starts at');
	const toKey = need('to part', KEY_MAX, 'the key number of the part the wire ends at');
	const toTerminal = need('to terminal', TERMINAL_MAX, 'the terminal the wire ends at');
	const code = get('colour');
	if (!code) problems.push({ row, column: col('colour'), message: 'the colour code is empty', expected: 'a colour code like G/B (base, then tracer)' });
	const out: WireRow = { row, fromKey, fromTerminal, toKey, toTerminal, code };
	const size = get('size');
	if (size) {
		const s = readSize(size, decimalComma, section.sizeUnit);
		if (typeof s === 'string') problems.push({ row, column: col('size'), message: s, expected: SIZE_EXPECTED });
		else out.size = s;
	}
	const length = get('length');
	if (length) {
		const l = readLength(length, decimalComma);
		if (typeof l === 'string') problems.push({ row, column: col('length'), message: l, expected: LENGTH_EXPECTED });
		else out.lengthM = l;
	}
	const measured = get('length measured');
	if (measured) {
		const m = readMeasured(measured);
		if (typeof m === 'string') problems.push({ row, column: col('length measured'), message: m, expected: MEASURED_EXPECTED });
		else out.lengthMeasured = m;
	}
	const notes = get('notes');
	if (notes.length > NOTES_MAX) problems.push({ row, column: col('notes'), message: `notes are ${notes.length} characters long`, expected: `at most ${NOTES_MAX} characters` });
	else if (notes) out.notes = notes;
	for (const [f, key] of [['from kind', 'fromKind'], ['to kind', 'toKind']] as const) {
		const k = get(f);
		if (!k) continue;
		const kind = readKind(k);
		if (!kind) problems.push({ row, column: col(f), message: `unknown part kind "${k}"`, expected: KIND_EXPECTED });
		else out[key] = kind;
	}
	return out;
}

function readPartRow(row: number, cells: string[], section: Extract<Section, { type: 'parts' }>, problems: CsvIssue[]): PartRow | null {
	const get = (f: PartField) => cellOf(cells, section.columns, f);
	const col = (f: PartField) => section.names.get(f) ?? f;
	const key = get('key');
	if (!key) problems.push({ row, column: col('key'), message: 'the key number is empty', expected: 'the part’s number in the manual’s component key' });
	else if (key.length > KEY_MAX) problems.push({ row, column: col('key'), message: `key number "${key}" is ${key.length} characters long`, expected: `at most ${KEY_MAX} characters` });
	const out: PartRow = { row, key };
	const kind = get('kind');
	if (kind) {
		const k = readKind(kind);
		if (!k) problems.push({ row, column: col('kind'), message: `unknown part kind "${kind}"`, expected: KIND_EXPECTED });
		else out.kind = k;
	}
	const label = get('label');
	if (label.length > LABEL_MAX) problems.push({ row, column: col('label'), message: `the label is ${label.length} characters long`, expected: `at most ${LABEL_MAX} characters` });
	else if (label) out.label = label;
	const location = get('location');
	if (location) {
		const l = normaliseHeader(location).replace(/ /g, '-');
		if (!(LOCATIONS as readonly string[]).includes(l)) problems.push({ row, column: col('location'), message: `unknown location "${location}"`, expected: `one of ${LOCATIONS.join(', ')}` });
		else out.location = l as Location;
	}
	const terminals = get('terminals');
	if (terminals) {
		const names = splitTerminals(terminals);
		const seen = new Set<string>();
		for (const t of names) {
			if (t.length > TERMINAL_MAX) problems.push({ row, column: col('terminals'), message: `terminal name "${t}" is too long`, expected: `at most ${TERMINAL_MAX} characters per name` });
			if (seen.has(t)) problems.push({ row, column: col('terminals'), message: `terminal "${t}" is named twice`, expected: `each terminal name once, ${TERMINALS_SEPARATED}` });
			seen.add(t);
		}
		out.terminals = names;
	}
	const notes = get('notes');
	if (notes.length > NOTES_MAX) problems.push({ row, column: col('notes'), message: `notes are ${notes.length} characters long`, expected: `at most ${NOTES_MAX} characters` });
	else if (notes) out.notes = notes;
	return out;
}
