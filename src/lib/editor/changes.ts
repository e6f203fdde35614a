/**
 * What changed between two revisions of a harness document, in words a restorer checks a
 * colleague's edit by: parts and wires added or removed (by key number and colour code), a
 * wire's code, ends, size or length changed, a part's key, label, kind, terminals, values or
 * place changed, the vehicle facts and the palette. Moves on the drawing (positions, bends) are
 * counted, not listed: they change nothing electrical.
 */
import { counted } from '$lib/words';
import type { HarnessDocument, Part, Wire } from '$lib/circuit/schema';
import { wireNames } from '$lib/circuit/wire-names';
import { formatSize } from './sizes';

export type Change = { kind: 'added' | 'removed' | 'changed'; what: 'part' | 'wire' | 'vehicle' | 'palette'; id: string; text: string };

export type Changes = {
	/** Electrical and descriptive changes, parts before wires, in document order. */
	changes: Change[];
	/** Parts moved on the drawing and wires whose bends changed, with nothing else changed. */
	moved: { parts: number; wires: number };
};

type Doc = Pick<HarnessDocument, 'vehicle' | 'parts' | 'wires' | 'palette'>;

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
const partName = (p: Part) => (p.label ? `${p.key} ${p.label}` : p.key);
const paletteName = (p: Doc['palette']) => (typeof p === 'string' ? p : p.name);

export function documentChanges(before: Doc, after: Doc): Changes {
	const changes: Change[] = [];
	const moved = { parts: 0, wires: 0 };

	if (before.vehicle.systemVoltage !== after.vehicle.systemVoltage) {
		changes.push({ kind: 'changed', what: 'vehicle', id: 'systemVoltage', text: `System voltage ${before.vehicle.systemVoltage} V → ${after.vehicle.systemVoltage} V` });
	}
	if (before.vehicle.earth !== after.vehicle.earth) {
		changes.push({ kind: 'changed', what: 'vehicle', id: 'earth', text: `Earth ${before.vehicle.earth} → ${after.vehicle.earth}` });
	}
	if (!same(before.palette, after.palette)) {
		const a = paletteName(before.palette);
		const b = paletteName(after.palette);
		changes.push({ kind: 'changed', what: 'palette', id: 'palette', text: a === b ? `Colour codes of ${b} edited` : `Colour codes ${a} → ${b}` });
	}

	const oldParts = new Map(before.parts.map((p) => [p.id, p]));
	const newParts = new Map(after.parts.map((p) => [p.id, p]));
	for (const p of after.parts) {
		const o = oldParts.get(p.id);
		if (!o) {
			changes.push({ kind: 'added', what: 'part', id: p.id, text: `Part ${partName(p)} (${p.kind}) added` });
			continue;
		}
		const said: string[] = [];
		if (o.key !== p.key) said.push(`key ${o.key} → ${p.key}`);
		if (o.label !== p.label) said.push(`label “${o.label}” → “${p.label}”`);
		if (o.kind !== p.kind) said.push(`kind ${o.kind} → ${p.kind}`);
		if (!same(o.terminals, p.terminals)) said.push(`terminals ${o.terminals.join(', ')} → ${p.terminals.join(', ')}`);
		if (o.kind === p.kind && !same(o.params, p.params)) {
			const keys = [...new Set([...Object.keys(o.params), ...Object.keys(p.params)])];
			for (const k of keys) {
				const a = (o.params as Record<string, unknown>)[k];
				const b = (p.params as Record<string, unknown>)[k];
				if (!same(a, b)) said.push(`${k} ${JSON.stringify(a ?? null)} → ${JSON.stringify(b ?? null)}`);
			}
		}
		if (o.location !== p.location) said.push(`place ${o.location} → ${p.location}`);
		if ((o.notes ?? '') !== (p.notes ?? '')) said.push('notes edited');
		if (said.length) changes.push({ kind: 'changed', what: 'part', id: p.id, text: `Part ${partName(p)}: ${said.join('; ')}` });
		else if (!same(o.position, p.position)) moved.parts++;
	}
	for (const o of before.parts) {
		if (!newParts.has(o.id)) changes.push({ kind: 'removed', what: 'part', id: o.id, text: `Part ${partName(o)} (${o.kind}) removed` });
	}

	const oldNames = wireNames(before);
	const newNames = wireNames(after);
	const oldWires = new Map(before.wires.map((w) => [w.id, w]));
	const newWires = new Map(after.wires.map((w) => [w.id, w]));
	for (const w of after.wires) {
		const o = oldWires.get(w.id);
		if (!o) {
			changes.push({ kind: 'added', what: 'wire', id: w.id, text: `${cap(newNames.wire(w))} added` });
			continue;
		}
		const said: string[] = [];
		if (o.code !== w.code) said.push(`code ${o.code} → ${w.code}`);
		for (const e of ['from', 'to'] as const) {
			if (!same(o[e], w[e])) said.push(`${e === 'from' ? 'one end' : 'other end'} ${oldNames.terminal(o, e)} → ${newNames.terminal(w, e)}`);
		}
		if (!same(o.size, w.size)) said.push(`size ${formatSize(o.size)} → ${formatSize(w.size)}`);
		if (o.lengthM !== w.lengthM) said.push(`length ${o.lengthM} m → ${w.lengthM} m`);
		if (!!o.lengthMeasured !== !!w.lengthMeasured) said.push(w.lengthMeasured ? 'length marked measured' : 'length no longer marked measured');
		if ((o.notes ?? '') !== (w.notes ?? '')) said.push('notes edited');
		if (said.length) changes.push({ kind: 'changed', what: 'wire', id: w.id, text: `${cap(newNames.wire(w))}: ${said.join('; ')}` });
		else if (!same(o.waypoints ?? [], w.waypoints ?? [])) moved.wires++;
	}
	for (const o of before.wires) {
		if (!newWires.has(o.id)) changes.push({ kind: 'removed', what: 'wire', id: o.id, text: `${cap(oldNames.wire(o))} removed` });
	}
	return { changes, moved };
}

const cap = (s: string) => s[0].toUpperCase() + s.slice(1);

/**
 * What a revision changed, in one line for the history list: the change itself when there is
 * one, else the first with a count of the rest; moves on the drawing counted when nothing else
 * changed. `first` says what the first revision was instead.
 * @example changeSummary({ changes: [], moved: { parts: 2, wires: 0 } }) // "Moved 2 parts on the drawing"
 */
export function changeSummary(c: Changes | null, first = 'First revision'): string {
	if (!c) return first;
	const [one, ...rest] = c.changes;
	if (one) return rest.length ? `${one.text}, and ${counted(rest.length, 'more change')}` : one.text;
	const moves = [c.moved.parts ? counted(c.moved.parts, 'part') : '', c.moved.wires ? `the bends of ${counted(c.moved.wires, 'wire')}` : ''].filter(Boolean);
	return moves.length ? `Moved ${moves.join(' and ')} on the drawing` : 'Saved again, unchanged';
}
