/**
 * A read wire list applied to a document, and a document written back out as CSV.
 *
 * Import merges into the document it is given and returns a new one (the given one untouched):
 * parts are found by key number; a missing part is created with the kind from the part table or
 * a kind column, or as a generic load when nothing says; terminals are added to parts whose
 * terminals the user names (switch, connector, splice, load). A wire whose two ends match an
 * existing wire (either way round) updates that wire instead of drawing a second one, so
 * importing the same list twice changes nothing.
 */
import { FIXED_TERMINALS, type PartKind } from '../circuit/parts';
import { formatCode, parseCode, resolvePalette, type Palette } from '../circuit/colours';
import { PartSchema, parseDocument, type HarnessDocument, type Part, type Wire } from '../circuit/schema';
import { KIND_EXPECTED, type CsvIssue, type PartRow, type WireListTable, type WireRow } from './csv';
import { withArticle } from '../words';

export interface ImportSummary {
	/** Key numbers of the parts the import creates. */
	addedParts: string[];
	/** Key numbers of existing parts the part table relabels or moves to another location. */
	updatedParts: string[];
	addedWires: number;
	updatedWires: number;
	/** Terminals added to existing or new user-named parts, as "key terminal". */
	addedTerminals: string[];
}

export interface ImportPlan {
	/** The document with every good row applied (equal to the input when there are none). */
	document: HarnessDocument;
	/** Every problem: the file's and the document's (unknown colour, wrong terminal, kind clash). */
	issues: CsvIssue[];
	badRows: number[];
	goodRows: number;
	summary: ImportSummary;
}

const GRID_X = 260;
const GRID_Y = 130;

function slug(key: string): string {
	return key.replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 40);
}

function uniqueId(base: string, taken: Set<string>): string {
	let id = base;
	for (let n = 2; taken.has(id); n++) id = `${base}-${n}`;
	taken.add(id);
	return id;
}

/** Starter parameters a kind needs beyond the schema's defaults (a switch needs positions). */
function paramsFor(kind: PartKind, terminals: string[]): Record<string, unknown> {
	if (kind === 'switch') return { positions: [{ name: 'off' }, { name: 'on', closed: [[terminals[0], terminals[1]]] }] };
	return {};
}

/** Parts that need two terminals get a spare one named by the next free number. */
function padTerminals(kind: PartKind, terminals: string[]): string[] {
	const min = kind === 'switch' || kind === 'splice' || kind === 'load' ? 2 : 1;
	const out = [...terminals];
	for (let n = 1; out.length < min; n++) if (!out.includes(String(n))) out.push(String(n));
	return out;
}

type Draft = {
	key: string;
	existing?: Part;
	kind?: PartKind;
	/** Row that set the kind, for clash messages. */
	kindRow?: number;
	label?: string;
	location?: Part['location'];
	notes?: string;
	terminals: string[];
	/** Row of this part in the part table, if any. */
	partRow?: number;
};

/**
 * Plans an import: every issue, and the document that the good rows make.
 * @example planImport(doc, readWireList(text)).issues // [] when every row is good
 */
export function planImport(doc: HarnessDocument, table: WireListTable): ImportPlan {
	const palette: Palette = resolvePalette(doc.palette);
	const issues: CsvIssue[] = [...table.issues];
	const rowProblems = new Map<number, CsvIssue[]>();
	const flag = (issue: CsvIssue) => {
		issues.push(issue);
		rowProblems.set(issue.row, [...(rowProblems.get(issue.row) ?? []), issue]);
	};

	// Parts by key: the document's, then the part table's.
	const drafts = new Map<string, Draft>();
	for (const p of doc.parts) drafts.set(p.key, { key: p.key, existing: p, kind: p.kind, terminals: [...p.terminals] });
	const badPartRows = new Map<string, number>(table.badPartKeys.map((b) => [b.key, b.row]));

	const tableKeys = new Map<string, number>();
	for (const row of table.parts) {
		const seen = tableKeys.get(row.key);
		if (seen !== undefined) {
			flag({ row: row.row, column: 'key', message: `key number "${row.key}" is already in the part table at row ${seen}`, expected: 'each key number once in the part table' });
			continue;
		}
		tableKeys.set(row.key, row.row);
		if (!applyPartRow(drafts, row, flag)) badPartRows.set(row.key, row.row);
	}
	// A part row with a problem (unknown kind, …) is not applied; wires that name its key are not
	// either, rather than guessing the part's kind.

	// Wires: kinds from the kind columns, terminals, colour codes.
	type Good = { row: WireRow; code: string };
	const good: Good[] = [];
	// Rows with a problem in the file are checked too (never imported), so each row's every problem is named at once.
	const heldBack = new Set(table.badRows);
	for (const w of [...table.wires, ...(table.badWires ?? [])].sort((a, b) => a.row - b.row)) {
		const before = rowProblems.get(w.row)?.length ?? 0;
		for (const [key, col] of [[w.fromKey, 'from part'], [w.toKey, 'to part']] as const) {
			const bad = badPartRows.get(key);
			if (bad !== undefined) flag({ row: w.row, column: col, message: `part "${key}" has a problem in its part table row ${bad}`, expected: `part table row ${bad} fixed first` });
		}
		const code = parseCode(w.code, palette);
		if (!code.ok) flag({ row: w.row, column: 'colour', message: code.error, expected: `a code in the diagram’s palette "${palette.name}" (${palette.colours.map((c) => c.code).join(' ')})` });
		if (w.fromKey === w.toKey && w.fromTerminal === w.toTerminal) {
			flag({ row: w.row, column: 'to terminal', message: `the wire starts and ends on terminal ${w.toTerminal} of part ${w.toKey}`, expected: 'two different terminals' });
		}
		const ends = [
			{ key: w.fromKey, terminal: w.fromTerminal, kind: w.fromKind, side: 'from' as const },
			{ key: w.toKey, terminal: w.toTerminal, kind: w.toKind, side: 'to' as const }
		];
		for (const end of ends) {
			const d = drafts.get(end.key) ?? { key: end.key, terminals: [] };
			if (end.kind) {
				if (d.kind && d.kind !== end.kind) {
					flag({
						row: w.row,
						column: `${end.side} kind`,
						message: `part ${end.key} is ${withArticle(d.kind)} ${d.existing ? 'in the diagram' : `(row ${d.kindRow})`}; this row says ${end.kind}`,
						expected: `${d.kind}, or an empty cell`
					});
				} else if (!d.kind && !rowProblems.has(w.row) && !heldBack.has(w.row)) {
					d.kind = end.kind;
					d.kindRow = w.row;
				}
			}
			drafts.set(end.key, d);
		}
		for (const end of ends) {
			const d = drafts.get(end.key)!;
			const fixed = d.kind ? FIXED_TERMINALS[d.kind] : null;
			if (fixed && !fixed.includes(end.terminal)) {
				flag({
					row: w.row,
					column: `${end.side} terminal`,
					message: `part ${end.key} is ${withArticle(d.kind!)}, which has no terminal "${end.terminal}"`,
					expected: `one of ${fixed.join(', ')}`
				});
			}
		}
		if ((rowProblems.get(w.row)?.length ?? 0) === before && !heldBack.has(w.row)) {
			good.push({ row: w, code: code.ok ? formatCode(code.code) : w.code });
		}
	}

	// Build the document from the good rows.
	const ids = new Set<string>([...doc.parts.map((p) => p.id), ...doc.wires.map((w) => w.id)]);
	const summary: ImportSummary = { addedParts: [], updatedParts: [], addedWires: 0, updatedWires: 0, addedTerminals: [] };
	const needed = new Set<string>();
	for (const g of good) needed.add(g.row.fromKey).add(g.row.toKey);
	for (const row of table.parts) if (!rowProblems.has(row.row)) needed.add(row.key);

	// Terminals each part needs, in order of first use.
	for (const g of good) {
		for (const [key, terminal] of [[g.row.fromKey, g.row.fromTerminal], [g.row.toKey, g.row.toTerminal]] as const) {
			const d = drafts.get(key)!;
			if (!d.terminals.includes(terminal)) {
				d.terminals.push(terminal);
				if (d.existing) summary.addedTerminals.push(`${key} ${terminal}`);
			}
		}
	}

	const maxX = doc.parts.reduce((m, p) => Math.max(m, p.position.x), -GRID_X);
	let placed = 0;
	const parts: Part[] = [];
	const byKey = new Map<string, Part>();
	for (const p of doc.parts) {
		const d = drafts.get(p.key)!;
		const relabel = d.label !== undefined && d.label !== p.label;
		const relocate = d.location !== undefined && d.location !== p.location;
		const renote = d.notes !== undefined && d.notes !== (p.notes ?? '');
		let next = p;
		if (d.terminals.length !== p.terminals.length || relabel || relocate || renote) {
			next = { ...p, terminals: d.terminals, ...(relabel ? { label: d.label } : {}), ...(relocate ? { location: d.location } : {}), ...(renote ? { notes: d.notes } : {}) } as Part;
			if (relabel || relocate || renote) summary.updatedParts.push(p.key);
		}
		parts.push(next);
		byKey.set(p.key, next);
	}
	for (const [key, d] of drafts) {
		if (d.existing || !needed.has(key)) continue;
		const kind = d.kind ?? 'load';
		const fixed = FIXED_TERMINALS[kind];
		const terminals = fixed ? [...fixed] : padTerminals(kind, d.terminals);
		const column = Math.floor(placed / 8);
		const position = { x: maxX + GRID_X * (column + 1), y: 60 + GRID_Y * (placed % 8) };
		placed++;
		const part = PartSchema.parse({
			id: uniqueId(`p-${slug(key) || 'part'}`, ids),
			key,
			label: d.label ?? '',
			kind,
			params: paramsFor(kind, terminals),
			terminals,
			position,
			...(d.location ? { location: d.location } : {}),
			...(d.notes ? { notes: d.notes } : {})
		});
		parts.push(part);
		byKey.set(key, part);
		summary.addedParts.push(key);
	}

	const wires: Wire[] = [...doc.wires];
	const endKey = (a: string, b: string) => (a < b ? `${a}|${b}` : `${b}|${a}`);
	const byEnds = new Map<string, number>();
	wires.forEach((w, i) => byEnds.set(endKey(`${w.from.part}:${w.from.terminal}`, `${w.to.part}:${w.to.terminal}`), i));
	let nextWire = doc.wires.length + 1;
	for (const g of good) {
		const from = { part: byKey.get(g.row.fromKey)!.id, terminal: g.row.fromTerminal };
		const to = { part: byKey.get(g.row.toKey)!.id, terminal: g.row.toTerminal };
		const k = endKey(`${from.part}:${from.terminal}`, `${to.part}:${to.terminal}`);
		const at = byEnds.get(k);
		const fields = {
			code: g.code,
			...(g.row.size ? { size: g.row.size } : {}),
			...(g.row.lengthM !== undefined ? { lengthM: g.row.lengthM } : {}),
			...(g.row.notes ? { notes: g.row.notes } : {})
		};
		if (at !== undefined) {
			const old = wires[at];
			const next: Wire = { ...old, ...fields };
			// Not measured is the field's absence (schema.ts); an empty cell leaves the wire as it is.
			if (g.row.lengthMeasured === true) next.lengthMeasured = true;
			else if (g.row.lengthMeasured === false) delete next.lengthMeasured;
			if (JSON.stringify(next) !== JSON.stringify(old)) {
				wires[at] = next;
				summary.updatedWires++;
			}
			continue;
		}
		let id: string;
		do id = `w-${nextWire++}`;
		while (ids.has(id));
		ids.add(id);
		wires.push({ id, from, to, code: g.code, size: g.row.size ?? { mm2: 1 }, lengthM: g.row.lengthM ?? 1, ...(g.row.lengthMeasured ? { lengthMeasured: true } : {}), ...(g.row.notes ? { notes: g.row.notes } : {}) });
		byEnds.set(k, wires.length - 1);
		summary.addedWires++;
	}

	let document = doc;
	if (summary.addedParts.length || summary.addedWires || summary.updatedWires || summary.addedTerminals.length || summary.updatedParts.length) {
		// The core's parser is the last word on what a valid document is.
		const parsed = parseDocument({ ...doc, parts, wires });
		if (!parsed.ok) {
			for (const e of parsed.errors) issues.push({ row: 0, column: e.path, message: e.message, expected: 'a document the circuit core accepts' });
		} else document = parsed.document;
	}
	issues.sort((a, b) => a.row - b.row);
	const badRows = [...new Set(issues.map((i) => i.row))].sort((a, b) => a - b);
	return { document, issues, badRows, goodRows: Math.max(0, table.dataRows - badRows.filter((r) => r > 0).length), summary };
}

function applyPartRow(drafts: Map<string, Draft>, row: PartRow, flag: (i: CsvIssue) => void): boolean {
	const d = drafts.get(row.key) ?? { key: row.key, terminals: [] };
	d.partRow = row.row;
	if (row.kind) {
		if (d.existing && d.existing.kind !== row.kind) {
			flag({ row: row.row, column: 'kind', message: `part ${row.key} is ${withArticle(d.existing.kind)} in the diagram; the table says ${row.kind}`, expected: `${d.existing.kind} (change a part’s kind on the drawing board)` });
			return false;
		}
		d.kind = row.kind;
		d.kindRow = row.row;
	}
	if (row.terminals) {
		const kind = d.kind;
		const fixed = kind ? FIXED_TERMINALS[kind] : null;
		if (fixed && (row.terminals.length !== fixed.length || row.terminals.some((t) => !fixed.includes(t)))) {
			flag({ row: row.row, column: 'terminals', message: `${withArticle(kind!)} has the terminals ${fixed.join(' ')}; the table lists ${row.terminals.join(' ')}`, expected: `${fixed.join(' ')}, or an empty cell` });
			return false;
		}
		if (!fixed) for (const t of row.terminals) if (!d.terminals.includes(t)) d.terminals.push(t);
	}
	if (row.label !== undefined) d.label = row.label;
	if (row.location) d.location = row.location;
	if (row.notes !== undefined) d.notes = row.notes;
	drafts.set(row.key, d);
	return true;
}

export { KIND_EXPECTED };

// ---------------------------------------------------------------------------------------------
// Export.

/**
 * One CSV cell: quoted when it holds the separator, a quote, a line break or edge spaces
 * (RFC 4180 §2.6–2.7). A cell that a spreadsheet would run as a formula (=, +, -, @ followed by
 * more text) gets a leading apostrophe (OWASP, "CSV Injection"); the reader strips it again.
 */
export function csvCell(value: string, separator = ','): string {
	let v = value;
	if (/^[=+\-@]./s.test(v)) v = `'${v}`;
	if (v.includes(separator) || /["\r\n]/.test(v) || v !== v.trim()) v = `"${v.replace(/"/g, '""')}"`;
	return v;
}

function line(cells: string[], separator: string): string {
	return cells.map((c) => csvCell(c, separator)).join(separator);
}

export function formatSize(size: Wire['size']): string {
	return 'mm2' in size ? `${size.mm2} mm2` : size.awg < 1 ? `${1 - size.awg}/0 AWG` : `${size.awg} AWG`;
}

/** The component key as CSV: key, kind, label, location, terminals, notes (CRLF lines, RFC 4180). */
export function keyTableCsv(doc: HarnessDocument, separator = ','): string {
	const rows = [line(['key', 'kind', 'label', 'location', 'terminals', 'notes'], separator)];
	for (const p of doc.parts) rows.push(line([p.key, p.kind, p.label, p.location, p.terminals.join(' '), p.notes ?? ''], separator));
	return rows.join('\r\n') + '\r\n';
}

/** The wire list as CSV, parts named by key number; "length measured" says yes or no for every wire. */
export function wireListCsv(doc: HarnessDocument, separator = ','): string {
	const keys = new Map(doc.parts.map((p) => [p.id, p.key]));
	const rows = [line(['from part', 'from terminal', 'to part', 'to terminal', 'colour', 'size', 'length m', 'length measured', 'notes'], separator)];
	for (const w of doc.wires) {
		rows.push(
			line([keys.get(w.from.part) ?? w.from.part, w.from.terminal, keys.get(w.to.part) ?? w.to.part, w.to.terminal, w.code, formatSize(w.size), String(w.lengthM), w.lengthMeasured ? 'yes' : 'no', w.notes ?? ''], separator)
		);
	}
	return rows.join('\r\n') + '\r\n';
}

/** Both tables in one file, the part table first, a blank line between (what the import reads). */
export function harnessSheetCsv(doc: HarnessDocument, separator = ','): string {
	return keyTableCsv(doc, separator) + '\r\n' + wireListCsv(doc, separator);
}
