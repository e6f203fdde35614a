/**
 * A scenario is the state the vehicle is in for a reading: switch positions, sender
 * positions, what has been unplugged, and whether the engine runs.
 */
import { z } from 'zod';
import type { HarnessDocument, Part, TerminalRef } from './schema';
import { formatPath, type SchemaError } from './schema';

export const DisconnectSchema = z.union([
	/** A part id (unplugged or removed) or a wire id (cut or unplugged at both ends). */
	z.string().min(1),
	/** One terminal: every wire end on it is off. */
	z.object({ part: z.string().min(1), terminal: z.string().min(1) })
]);

export const ScenarioSchema = z.object({
	switches: z.record(z.string(), z.string()).default({}),
	senders: z.record(z.string(), z.number().min(0).max(1)).default({}),
	disconnected: z.array(DisconnectSchema).default([]),
	engineRunning: z.boolean().optional()
});

export type Scenario = z.output<typeof ScenarioSchema>;
export type Disconnect = z.output<typeof DisconnectSchema>;

export function defaultPositionOf(part: Extract<Part, { kind: 'switch' }>): string {
	const p = part.params;
	if (p.defaultPosition) return p.defaultPosition;
	const names = p.positions.map((x) => x.name);
	const find = (re: RegExp) => names.find((n) => re.test(n));
	if (p.role === 'ignition') return find(/^(ign|ignition|on|run)$/i) ?? names[Math.min(1, names.length - 1)];
	if (p.role === 'lighting') return find(/^off$/i) ?? names[0];
	return names[0];
}

/** The sensible default per vehicle: ignition on, lights off, engine stopped, senders at their own positions. */
export function defaultScenario(doc: HarnessDocument): Scenario {
	const switches: Record<string, string> = {};
	const senders: Record<string, number> = {};
	for (const part of doc.parts) {
		if (part.kind === 'switch') switches[part.id] = defaultPositionOf(part);
		if (part.kind === 'sender') senders[part.id] = part.params.position;
	}
	return { switches, senders, disconnected: [], engineRunning: false };
}

/** Check a scenario against its document: every problem with its path. */
export function checkScenario(doc: HarnessDocument, scenario: unknown): { ok: true; scenario: Scenario } | { ok: false; errors: SchemaError[] } {
	const shaped = ScenarioSchema.safeParse(scenario);
	if (!shaped.success) {
		return { ok: false, errors: shaped.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message })) };
	}
	const s = shaped.data;
	const errors: SchemaError[] = [];
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const wires = new Set(doc.wires.map((w) => w.id));
	for (const [id, pos] of Object.entries(s.switches)) {
		const p = parts.get(id);
		if (!p || p.kind !== 'switch') errors.push({ path: `switches.${id}`, message: `"${id}" is not a switch of this diagram` });
		else if (!p.params.positions.some((x) => x.name === pos)) {
			errors.push({ path: `switches.${id}`, message: `switch "${p.key}" has no position "${pos}"; it has ${p.params.positions.map((x) => x.name).join(', ')}` });
		}
	}
	for (const id of Object.keys(s.senders)) {
		const p = parts.get(id);
		if (!p || p.kind !== 'sender') errors.push({ path: `senders.${id}`, message: `"${id}" is not a sender of this diagram` });
	}
	s.disconnected.forEach((d, i) => {
		if (typeof d === 'string') {
			if (!parts.has(d) && !wires.has(d)) errors.push({ path: `disconnected[${i}]`, message: `no part or wire "${d}"` });
		} else {
			const p = parts.get(d.part);
			if (!p) errors.push({ path: `disconnected[${i}].part`, message: `no part "${d.part}"` });
			else if (!p.terminals.includes(d.terminal)) {
				errors.push({ path: `disconnected[${i}].terminal`, message: `part "${p.key}" has no terminal "${d.terminal}"` });
			}
		}
	});
	return errors.length ? { ok: false, errors } : { ok: true, scenario: s };
}

/** Fast look-ups of what a scenario says. */
export interface ScenarioView {
	position(part: Extract<Part, { kind: 'switch' }>): { name: string; closed: [string, string][] };
	senderPosition(part: Extract<Part, { kind: 'sender' }>): number;
	partOff(partId: string): boolean;
	wireOff(wireId: string): boolean;
	terminalOff(ref: TerminalRef): boolean;
	engineRunning: boolean;
}

export function viewScenario(doc: HarnessDocument, scenario: Scenario): ScenarioView {
	const off = new Set<string>();
	const terminals = new Set<string>();
	for (const d of scenario.disconnected ?? []) {
		if (typeof d === 'string') off.add(d);
		else terminals.add(`${d.part}:${d.terminal}`);
	}
	return {
		position(part) {
			const name = scenario.switches?.[part.id] ?? defaultPositionOf(part);
			const pos = part.params.positions.find((x) => x.name === name);
			if (!pos) throw new Error(`scenario: switch "${part.key}" (${part.id}) has no position "${name}"`);
			return pos as { name: string; closed: [string, string][] };
		},
		senderPosition(part) {
			const x = scenario.senders?.[part.id] ?? part.params.position;
			if (!(x >= 0 && x <= 1)) throw new Error(`scenario: sender "${part.key}" position ${x} is outside 0..1`);
			return x;
		},
		partOff: (id) => off.has(id),
		wireOff: (id) => off.has(id),
		terminalOff: (ref) => off.has(ref.part) || (terminals.size > 0 && terminals.has(`${ref.part}:${ref.terminal}`)),
		engineRunning: scenario.engineRunning ?? false
	};
}
