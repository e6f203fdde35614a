// Edit operations on the harness document. Each takes a document and returns a new one (the
// old one untouched, unchanged parts shared), so the undo history can keep snapshots cheaply
// and the canvas can tell changed parts by identity. Bad edits throw an EditError naming the
// field, which the panel and the tables show beside it.
import { DEFAULT_TERMINALS, PARAM_SCHEMAS, FIXED_TERMINALS, type PartKind } from '$lib/circuit/parts';
import { PartSchema, type HarnessDocument, type Part, type Position, type TerminalRef, type Wire } from '$lib/circuit/schema';
import { formatCode, parseCode, resolvePalette, type Palette } from '$lib/circuit/colours';
import { crossSectionMm2, type WireSize } from '$lib/circuit/wires';
import { capitalised, counted, withArticle } from '$lib/words';
import { KIND_NAMES } from './kinds';

/** "An earth point", "A fuse": the kind as the restorer reads it, with its article. */
const kindWithArticle = (kind: PartKind) => capitalised(withArticle(KIND_NAMES[kind].toLowerCase()));

export class EditError extends Error {
	constructor(
		message: string,
		/** The field at fault, e.g. "key", "params.watts", "code". */
		readonly field?: string
	) {
		super(message);
	}
}

let counter = 0;
/** A short id unique in the document ("p-k3x9a2", "w-..."), matching the schema's id rule. */
export function newId(prefix: 'p' | 'w', taken: (id: string) => boolean): string {
	for (;;) {
		counter = (counter + 1) % 1_000_000;
		const random = Math.floor(Math.random() * 36 ** 6).toString(36).padStart(6, '0');
		const id = `${prefix}-${random}${counter.toString(36)}`;
		if (!taken(id)) return id;
	}
}

const idsOf = (doc: HarnessDocument) => {
	const ids = new Set<string>();
	for (const p of doc.parts) ids.add(p.id);
	for (const w of doc.wires) ids.add(w.id);
	return ids;
};

/** The next free key number: one above the highest numeric key (manual keys count up). */
export function nextKey(doc: HarnessDocument, taken: ReadonlySet<string> = new Set(doc.parts.map((p) => p.key))): string {
	let max = 0;
	for (const k of taken) {
		const n = /^\d+$/.test(k) ? Number(k) : NaN;
		if (n > max) max = n;
	}
	let next = max + 1;
	while (taken.has(String(next))) next++;
	return String(next);
}

/** What a new part of each kind starts with, beyond the schema's defaults. */
function starterParams(kind: PartKind): Record<string, unknown> {
	switch (kind) {
		case 'switch':
			// Two positions of a plain on/off switch between its first two terminals.
			return { positions: [{ name: 'off', closed: [] }, { name: 'on', closed: [['1', '2']] }] };
		case 'connector':
			return { pins: [['A1', 'B1']] };
		default:
			return {};
	}
}

/** A new part of a kind at a position, with defaults filled by the schema. */
export function createPart(doc: HarnessDocument, kind: PartKind, position: Position, init: { key?: string; label?: string; id?: string } = {}): Part {
	const ids = idsOf(doc);
	return PartSchema.parse({
		id: init.id ?? newId('p', (id) => ids.has(id)),
		key: init.key ?? nextKey(doc),
		label: init.label ?? '',
		kind,
		params: starterParams(kind),
		position: { x: Math.round(position.x), y: Math.round(position.y) }
	});
}

export function addParts(doc: HarnessDocument, parts: Part[]): HarnessDocument {
	if (!parts.length) return doc;
	const keys = new Set(doc.parts.map((p) => p.key));
	for (const p of parts) {
		if (keys.has(p.key)) throw new EditError(`Key number ${p.key} is already used.`, 'key');
		keys.add(p.key);
	}
	return { ...doc, parts: [...doc.parts, ...parts] };
}

/** Moves parts to new positions (rounded to whole pixels). Returns the same document if nothing moved. */
export function moveParts(doc: HarnessDocument, moves: ReadonlyMap<string, Position>): HarnessDocument {
	let changed = false;
	const parts = doc.parts.map((p) => {
		const to = moves.get(p.id);
		if (!to) return p;
		const x = Math.round(to.x);
		const y = Math.round(to.y);
		if (x === p.position.x && y === p.position.y) return p;
		changed = true;
		return { ...p, position: { x, y } };
	});
	if (!changed) return doc;
	// A bent wire whose two ends moved together (a group dragged) keeps its shape: its bends move
	// with it. A wire with one end moved keeps its bends where the user put them.
	const delta = new Map<string, Position>();
	parts.forEach((p, i) => {
		const was = doc.parts[i].position;
		if (p !== doc.parts[i]) delta.set(p.id, { x: p.position.x - was.x, y: p.position.y - was.y });
	});
	const wires = doc.wires.map((w) => {
		const a = delta.get(w.from.part);
		const b = delta.get(w.to.part);
		if (!w.waypoints?.length || !a || !b || a.x !== b.x || a.y !== b.y) return w;
		return { ...w, waypoints: w.waypoints.map((q) => ({ x: q.x + a.x, y: q.y + a.y })) };
	});
	return { ...doc, parts, wires };
}

export type PartPatch = Partial<Pick<Part, 'key' | 'label' | 'location' | 'notes'>> & { params?: Record<string, unknown> };

/** Checks a key number for a part; returns the problem or null. */
export function keyProblem(doc: HarnessDocument, partId: string, key: string): string | null {
	const k = key.trim();
	if (!k) return 'A key number is needed (the number in the manual’s component key).';
	if (k.length > 16) return 'A key number is at most 16 characters.';
	const other = doc.parts.find((p) => p.key === k && p.id !== partId);
	if (other) return `Key number ${k} is already used by ${other.label || 'another part'}.`;
	return null;
}

function replacePart(doc: HarnessDocument, id: string, make: (p: Part) => Part): HarnessDocument {
	let found = false;
	const parts = doc.parts.map((p) => {
		if (p.id !== id) return p;
		found = true;
		return make(p);
	});
	if (!found) throw new EditError(`No part with id ${id}.`);
	return { ...doc, parts };
}

/** Changes a part's key number, label, location, notes or parameters, validating each. */
export function updatePart(doc: HarnessDocument, id: string, patch: PartPatch): HarnessDocument {
	return replacePart(doc, id, (p) => {
		const next = { ...p } as Record<string, unknown>;
		if (patch.key !== undefined) {
			const problem = keyProblem(doc, id, patch.key);
			if (problem) throw new EditError(problem, 'key');
			next.key = patch.key.trim();
		}
		if (patch.label !== undefined) {
			if (patch.label.length > 120) throw new EditError('A label is at most 120 characters.', 'label');
			next.label = patch.label;
		}
		if (patch.location !== undefined) next.location = patch.location;
		if (patch.notes !== undefined) next.notes = patch.notes;
		if (patch.params !== undefined) {
			const merged = { ...(p.params as Record<string, unknown>), ...patch.params };
			for (const [k, v] of Object.entries(merged)) if (v === undefined) delete merged[k];
			const parsed = PARAM_SCHEMAS[p.kind].safeParse(merged);
			if (!parsed.success) {
				const issue = parsed.error.issues[0];
				throw new EditError(issue.message, `params.${issue.path.join('.')}`);
			}
			next.params = parsed.data;
		}
		const checked = PartSchema.safeParse(next);
		if (!checked.success) {
			const issue = checked.error.issues[0];
			throw new EditError(issue.message, issue.path.join('.'));
		}
		return checked.data;
	});
}

/**
 * A part turned into another kind (a "load" that turns out to be a horn relay): the key number,
 * label, place and notes stay; terminals are matched by name, so a wire on a terminal the new
 * kind also has stays on it; values the new kind shares by name (a resistance) are kept when
 * they fit. Returns the new document and the wires that had to go (on terminals the new kind
 * lacks), so the board can ask before dropping them.
 */
export function changeKind(doc: HarnessDocument, partId: string, kind: PartKind): { doc: HarnessDocument; dropped: Wire[] } {
	const part = doc.parts.find((p) => p.id === partId);
	if (!part) throw new EditError(`No part with id ${partId}.`);
	if (part.kind === kind) return { doc, dropped: [] };
	const fixed = FIXED_TERMINALS[kind];
	let terminals: string[];
	if (fixed) terminals = [...fixed];
	else {
		// A kind whose terminals the user names keeps the old names, topped up from its defaults
		// to two (a splice joins at least two; a switch or connector needs two to join).
		terminals = [...part.terminals];
		for (const t of DEFAULT_TERMINALS[kind]) if (terminals.length < 2 && !terminals.includes(t)) terminals.push(t);
	}
	const [a, b] = terminals;
	const starter: Record<string, unknown> =
		kind === 'switch'
			? { positions: [{ name: 'off', closed: [] }, { name: 'on', closed: [[a, b]] }] }
			: kind === 'connector'
				? { pins: [[a, b]] }
				: {};
	const shape = PARAM_SCHEMAS[kind].shape as Record<string, unknown>;
	const shared = Object.fromEntries(Object.entries(part.params as Record<string, unknown>).filter(([k]) => k in shape && !(k in starter) && k !== 'between'));
	const withShared = PARAM_SCHEMAS[kind].safeParse({ ...starter, ...shared });
	const params = withShared.success ? withShared.data : PARAM_SCHEMAS[kind].parse(starter);
	const checked = PartSchema.safeParse({ id: part.id, key: part.key, label: part.label, kind, params, terminals, position: part.position, location: part.location, ...(part.notes !== undefined ? { notes: part.notes } : {}) });
	if (!checked.success) throw new EditError(checked.error.issues[0].message, 'kind');
	const keep = new Set(terminals);
	const lost = (ref: TerminalRef) => ref.part === partId && !keep.has(ref.terminal);
	const dropped = doc.wires.filter((w) => lost(w.from) || lost(w.to));
	return {
		doc: { ...doc, parts: doc.parts.map((p) => (p.id === partId ? checked.data : p)), wires: dropped.length ? doc.wires.filter((w) => !dropped.includes(w)) : doc.wires },
		dropped
	};
}

/** Ids of the wires that end on any of the parts. */
export function wiresOf(doc: HarnessDocument, partIds: ReadonlySet<string>): string[] {
	return doc.wires.filter((w) => partIds.has(w.from.part) || partIds.has(w.to.part)).map((w) => w.id);
}

/** Removes parts (with every wire ending on them) and wires. */
export function deleteItems(doc: HarnessDocument, partIds: ReadonlySet<string>, wireIds: ReadonlySet<string>): HarnessDocument {
	if (!partIds.size && !wireIds.size) return doc;
	return {
		...doc,
		parts: doc.parts.filter((p) => !partIds.has(p.id)),
		wires: doc.wires.filter((w) => !wireIds.has(w.id) && !partIds.has(w.from.part) && !partIds.has(w.to.part))
	};
}

const userNamed = (kind: PartKind) => FIXED_TERMINALS[kind] === null;

function checkTerminalName(part: Part, name: string, except?: string) {
	const n = name.trim();
	if (!n) throw new EditError('A terminal needs a name.', 'terminals');
	if (n.length > 32) throw new EditError('A terminal name is at most 32 characters.', 'terminals');
	if (part.terminals.some((t) => t === n && t !== except)) throw new EditError(`Terminal ${n} is already on this part.`, 'terminals');
	return n;
}

/** Adds a named terminal to a switch, connector, splice or generic load. */
export function addTerminal(doc: HarnessDocument, partId: string, name: string): HarnessDocument {
	return replacePart(doc, partId, (p) => {
		if (!userNamed(p.kind)) throw new EditError(`${kindWithArticle(p.kind)} has fixed terminals.`, 'terminals');
		const n = checkTerminalName(p, name);
		return { ...p, terminals: [...p.terminals, n] } as Part;
	});
}

const swap = (t: string, from: string, to: string) => (t === from ? to : t);

/** Renames a terminal; wires, switch contacts and pin pairs that name it follow. */
export function renameTerminal(doc: HarnessDocument, partId: string, from: string, to: string): HarnessDocument {
	const part = doc.parts.find((p) => p.id === partId);
	if (!part) throw new EditError(`No part with id ${partId}.`);
	if (!userNamed(part.kind)) throw new EditError(`${kindWithArticle(part.kind)} has fixed terminals.`, 'terminals');
	if (!part.terminals.includes(from)) throw new EditError(`No terminal ${from} on this part.`, 'terminals');
	const n = checkTerminalName(part, to, from);
	if (n === from) return doc;
	const renamed = updateTerminalRefs(part, (t) => swap(t, from, n));
	const end = (ref: TerminalRef) => (ref.part === partId && ref.terminal === from ? { part: partId, terminal: n } : ref);
	return {
		...doc,
		parts: doc.parts.map((p) => (p.id === partId ? renamed : p)),
		wires: doc.wires.map((w) => (w.from.part === partId || w.to.part === partId ? { ...w, from: end(w.from), to: end(w.to) } : w))
	};
}

function updateTerminalRefs(part: Part, map: (t: string) => string): Part {
	const terminals = part.terminals.map(map);
	if (part.kind === 'switch') {
		const positions = part.params.positions.map((pos) => ({ ...pos, closed: pos.closed.map(([a, b]) => [map(a), map(b)] as [string, string]) }));
		return { ...part, terminals, params: { ...part.params, positions } };
	}
	if (part.kind === 'connector') {
		return { ...part, terminals, params: { ...part.params, pins: part.params.pins.map(([a, b]) => [map(a), map(b)] as [string, string]) } };
	}
	if (part.kind === 'load' && part.params.between) {
		return { ...part, terminals, params: { ...part.params, between: [map(part.params.between[0]), map(part.params.between[1])] } };
	}
	return { ...part, terminals } as Part;
}

/** Removes a terminal with the wires on it and any contacts or pin pairs that name it. */
export function removeTerminal(doc: HarnessDocument, partId: string, name: string): HarnessDocument {
	const part = doc.parts.find((p) => p.id === partId);
	if (!part) throw new EditError(`No part with id ${partId}.`);
	if (!userNamed(part.kind)) throw new EditError(`${kindWithArticle(part.kind)} has fixed terminals.`, 'terminals');
	const min = part.kind === 'splice' ? 2 : 1;
	if (part.terminals.length <= min) throw new EditError(`${kindWithArticle(part.kind)} needs at least ${counted(min, 'terminal')}.`, 'terminals');
	let next: Part = { ...part, terminals: part.terminals.filter((t) => t !== name) } as Part;
	if (next.kind === 'switch') {
		next = { ...next, params: { ...next.params, positions: next.params.positions.map((pos) => ({ ...pos, closed: pos.closed.filter(([a, b]) => a !== name && b !== name) })) } };
	} else if (next.kind === 'connector') {
		next = { ...next, params: { ...next.params, pins: next.params.pins.filter(([a, b]) => a !== name && b !== name) } };
	} else if (next.kind === 'load' && next.params.between?.includes(name)) {
		next = { ...next, params: { ...next.params, between: undefined } };
	}
	const on = (ref: TerminalRef) => ref.part === partId && ref.terminal === name;
	return {
		...doc,
		parts: doc.parts.map((p) => (p.id === partId ? next : p)),
		wires: doc.wires.filter((w) => !on(w.from) && !on(w.to))
	};
}

/** The palette a document uses, as data. */
export function paletteOf(doc: HarnessDocument): Palette {
	return resolvePalette(doc.palette);
}

/** Parses and normalises a colour code in the document's palette ("g/b" → "G/B"), or throws. */
export function normaliseCode(doc: HarnessDocument, text: string): string {
	const parsed = parseCode(text, paletteOf(doc));
	if (!parsed.ok) throw new EditError(parsed.error, 'code');
	return formatCode(parsed.code);
}

function checkEnd(doc: HarnessDocument, ref: TerminalRef, field: string) {
	const part = doc.parts.find((p) => p.id === ref.part);
	if (!part) throw new EditError(`No part with id ${ref.part}.`, field);
	if (!part.terminals.includes(ref.terminal)) {
		throw new EditError(`Part ${part.key} has no terminal ${ref.terminal}; it has ${part.terminals.join(', ')}.`, field);
	}
}

/** Adds a wire between two terminals. The code defaults to the palette's first colour. */
export function addWire(doc: HarnessDocument, from: TerminalRef, to: TerminalRef, init: Partial<Pick<Wire, 'code' | 'size' | 'lengthM' | 'notes' | 'id'>> = {}): { doc: HarnessDocument; id: string } {
	checkEnd(doc, from, 'from');
	checkEnd(doc, to, 'to');
	if (from.part === to.part && from.terminal === to.terminal) throw new EditError('A wire needs two different terminals.', 'to');
	const ids = idsOf(doc);
	const id = init.id ?? newId('w', (x) => ids.has(x));
	const wire: Wire = {
		id,
		from: { part: from.part, terminal: from.terminal },
		to: { part: to.part, terminal: to.terminal },
		code: normaliseCode(doc, init.code ?? paletteOf(doc).colours[0].code),
		size: init.size ?? { mm2: 1 },
		lengthM: init.lengthM ?? 1,
		...(init.notes ? { notes: init.notes } : {})
	};
	return { doc: { ...doc, wires: [...doc.wires, wire] }, id };
}

export type WirePatch = Partial<Pick<Wire, 'code' | 'size' | 'lengthM' | 'lengthMeasured' | 'notes' | 'from' | 'to' | 'waypoints'>>;

/** Changes a wire, validating the code against the palette and the size and length ranges. */
export function updateWire(doc: HarnessDocument, id: string, patch: WirePatch): HarnessDocument {
	let found = false;
	const wires = doc.wires.map((w) => {
		if (w.id !== id) return w;
		found = true;
		const next: Wire = { ...w };
		if (patch.code !== undefined) next.code = normaliseCode(doc, patch.code);
		if (patch.size !== undefined) next.size = checkSize(patch.size);
		if (patch.lengthM !== undefined) {
			if (!Number.isFinite(patch.lengthM) || patch.lengthM < 0 || patch.lengthM > 100) {
				throw new EditError('Length is in metres, from 0 to 100.', 'lengthM');
			}
			next.lengthM = patch.lengthM;
		}
		// Not measured is the field's absence, as in a document saved before it existed.
		if (patch.lengthMeasured !== undefined) {
			if (patch.lengthMeasured) next.lengthMeasured = true;
			else delete next.lengthMeasured;
		}
		if (patch.notes !== undefined) next.notes = patch.notes || undefined;
		if (patch.from) {
			checkEnd(doc, patch.from, 'from');
			next.from = patch.from;
		}
		if (patch.to) {
			checkEnd(doc, patch.to, 'to');
			next.to = patch.to;
		}
		if (patch.waypoints !== undefined) next.waypoints = patch.waypoints.length ? patch.waypoints : undefined;
		if (next.from.part === next.to.part && next.from.terminal === next.to.terminal) throw new EditError('A wire needs two different terminals.', 'to');
		return next;
	});
	if (!found) throw new EditError(`No wire with id ${id}.`);
	return { ...doc, wires };
}

function checkSize(size: WireSize): WireSize {
	try {
		crossSectionMm2(size);
	} catch (e) {
		throw new EditError((e as Error).message.replace(/^\w+: /, ''), 'size');
	}
	if ('mm2' in size && size.mm2 > 200) throw new EditError('Cross-section is at most 200 mm².', 'size');
	if ('awg' in size && !Number.isInteger(size.awg)) throw new EditError('An AWG gauge is a whole number (0000 is −3).', 'size');
	return 'mm2' in size ? { mm2: size.mm2 } : { awg: size.awg };
}

export type Clipboard = { parts: Part[]; wires: Wire[] };

/** The selected parts and the wires that run between two of them. */
export function copyItems(doc: HarnessDocument, partIds: ReadonlySet<string>): Clipboard {
	return {
		parts: doc.parts.filter((p) => partIds.has(p.id)),
		wires: doc.wires.filter((w) => partIds.has(w.from.part) && partIds.has(w.to.part))
	};
}

/**
 * Pastes a clipboard as new parts and wires: fresh ids, positions shifted by `offset`, and a
 * key number kept only where it is still free (otherwise the next free one). Wire codes are
 * rewritten from the palette they were copied under (`from`, default this document's) by colour;
 * a colour this palette lacks becomes its first colour with a note on the wire, and is counted
 * in `recoded` so the board can say so.
 */
export function pasteItems(
	doc: HarnessDocument,
	clip: Clipboard,
	offset: Position,
	from: Palette = paletteOf(doc)
): { doc: HarnessDocument; partIds: string[]; wireIds: string[]; recoded: string[] } {
	const ids = idsOf(doc);
	const keys = new Set(doc.parts.map((p) => p.key));
	const newIds = new Map<string, string>();
	// Free key numbers counted up once from the highest (nextKey per part would rescan every key).
	let next = Number(nextKey(doc, keys));
	const freeKey = () => {
		while (keys.has(String(next))) next++;
		return String(next);
	};
	const parts = clip.parts.map((p) => {
		const id = newId('p', (x) => ids.has(x));
		ids.add(id);
		newIds.set(p.id, id);
		const key = keys.has(p.key) ? freeKey() : p.key;
		keys.add(key);
		return { ...p, id, key, position: { x: p.position.x + offset.x, y: p.position.y + offset.y } } as Part;
	});
	const palette = paletteOf(doc);
	const recode = codeMapper(from, palette);
	const recoded: string[] = [];
	const wires = clip.wires
		.filter((w) => newIds.has(w.from.part) && newIds.has(w.to.part))
		.map((w) => {
			const id = newId('w', (x) => ids.has(x));
			ids.add(id);
			const mapped = recode(w.code);
			if (mapped === null) recoded.push(w.code);
			const note = mapped === null ? `Pasted with code ${w.code}, which this diagram’s palette has no colour for.` : undefined;
			return {
				...w,
				id,
				code: mapped ?? palette.colours[0].code,
				from: { part: newIds.get(w.from.part)!, terminal: w.from.terminal },
				to: { part: newIds.get(w.to.part)!, terminal: w.to.terminal },
				waypoints: w.waypoints?.map((p) => ({ x: p.x + offset.x, y: p.y + offset.y })),
				...(note ? { notes: (w.notes ? `${note} ${w.notes}` : note).slice(0, 2000) } : {})
			};
		});
	return {
		doc: { ...doc, parts: [...doc.parts, ...parts], wires: [...doc.wires, ...wires] },
		partIds: parts.map((p) => p.id),
		wireIds: wires.map((w) => w.id),
		recoded
	};
}

/** A wire code the new palette cannot write, with the wires that carry it. */
export type Unmapped = { code: string; wires: Wire[] };

/**
 * Each wire's code rewritten for another palette: by colour name first (trade G green → IEC GN
 * green), then, where the new palette has no colour of that name, the same code if it reads it
 * (a palette of one's own that renamed "green" to "grass green" still writes G). Lists the codes
 * it cannot write, with their wires, so the person hears of them before anything changes.
 */
export function recodeFor(doc: HarnessDocument, palette: string | Palette): { wires: Wire[]; unmapped: Unmapped[] } {
	const recode = codeMapper(paletteOf(doc), resolvePalette(palette));
	const unmapped = new Map<string, Wire[]>();
	const wires = doc.wires.map((w) => {
		const code = recode(w.code);
		if (code === null) {
			unmapped.set(w.code, [...(unmapped.get(w.code) ?? []), w]);
			return w;
		}
		return code === w.code ? w : { ...w, code };
	});
	return { wires, unmapped: [...unmapped].map(([code, wires]) => ({ code, wires })) };
}

/** Rewrites a code from one palette into another (as recodeFor says), or null when it cannot. */
export function codeMapper(from: Palette, to: Palette): (code: string) => string | null {
	const byName = new Map(to.colours.map((c) => [c.name.toLowerCase(), c.code]));
	const fromName = new Map(from.colours.map((c) => [c.code.toUpperCase(), c.name.toLowerCase()]));
	const colour = (code: string): string | undefined => {
		const named = byName.get(fromName.get(code.toUpperCase()) ?? '');
		if (named) return named;
		const same = parseCode(code, to);
		return same.ok && !same.code.tracer ? same.code.base : undefined;
	};
	return (text) => {
		const parsed = parseCode(text, from);
		if (!parsed.ok) return null;
		const base = colour(parsed.code.base);
		const tracer = parsed.code.tracer ? colour(parsed.code.tracer) : null;
		if (!base || tracer === undefined) return null;
		return formatCode({ base, tracer });
	};
}

/**
 * Switches the document to another palette (a built-in id, or a palette copied in whole),
 * rewriting each wire's code as recodeFor does. Throws listing the codes it cannot write.
 */
export function changePalette(doc: HarnessDocument, palette: string | Palette): HarnessDocument {
	const to = resolvePalette(palette);
	const { wires, unmapped } = recodeFor(doc, palette);
	if (unmapped.length) {
		const list = unmapped.map((u) => `${u.code} (${counted(u.wires.length, 'wire')})`).join(', ');
		throw new EditError(`The palette “${to.name}” has no colour for ${list}. Add those colours to it, or recode those wires first.`, 'palette');
	}
	return { ...doc, palette: typeof palette === 'string' ? palette : structuredClone(palette), wires };
}
