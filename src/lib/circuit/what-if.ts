/**
 * What a probe of the plan would read if a given fault were there (or none): the readings a
 * person would see, for trying a plan out, for practice hunts and for checking the demo's
 * walk-through. The same probes, setups and fuse rule as diagnose.ts, over the whole harness.
 */
import { buildCircuit, type Circuit } from './circuit';
import { DiagnoseError, probeReadings, settleFuses } from './diagnose';
import { atSize, generateHypotheses, sizeRange, type Change, type Region } from './faults';
import { ENTRY_DMM, type MeterProfile } from './meter';
import { nodeOfTerminal } from './nets';
import { Base } from './predict';
import { candidateProbes } from './probes';
import type { Scenario } from './scenario';
import type { HarnessDocument } from './schema';

export interface WhatIfInput {
	doc: HarnessDocument;
	scenario: Scenario;
	/** Probe ids as the plan names them, e.g. `volts:fuse-ign:out`, `joint:w-stab-in:to`. */
	probes: readonly string[];
	/** A fault id as the plan's suspects name them (`joint:w-stab-in:to`), or with a size (`joint:w-stab-in:to:20`); none = healthy. */
	fault?: string;
	/** The fault's size (Ω, or a stabilizer's set-point factor) for a mode that has a range (faults.ts FAULT_SIZE_RANGES). */
	size?: number;
	meter?: MeterProfile;
}

export interface WhatIfReading {
	id: string;
	label: string;
	unit: string;
	reading: number;
}

export const noFault = (id: string) => `no fault "${id}" on this diagram (ids as the probe plan's suspects name them)`;

function wholeHarness(doc: HarnessDocument): Region {
	const nodes = new Set<string>();
	for (const p of doc.parts) for (const t of p.terminals) nodes.add(nodeOfTerminal(p, t));
	return { parts: new Set(doc.parts.map((p) => p.id)), wires: new Set(doc.wires.map((w) => w.id)), nodes };
}

/**
 * The circuit changes of a fault named as the plan's suspects name it, with any fuse it overloads
 * blown (as diagnose.ts does); null when the diagram has no such fault.
 */
export function faultChanges(c: Circuit, base: Base, faultId: string, size?: number): Change[] | null {
	const all = generateHypotheses(c);
	// A site id (a suspect stands for every size) takes its middle sweep value unless a size is given.
	const h = all.find((x) => x.id === faultId) ?? all.filter((x) => x.site === faultId)[1] ?? all.find((x) => x.site === faultId);
	if (!h) return null;
	const changes = size !== undefined && sizeRange(h) ? atSize(h, size) : h.changes;
	return settleFuses(base, c, { changes, label: h.label }).changes;
}

export function readingsIf(input: WhatIfInput): WhatIfReading[] {
	const { doc, scenario } = input;
	const profile = input.meter ?? ENTRY_DMM;
	const c = buildCircuit(doc, scenario);
	const base = new Base(c);
	// Probes with a part taken out name the part: `volts-out:<part>:<terminal>`.
	const partOut = [...new Set(input.probes.filter((id) => /^(volts|lamp)-out:/.test(id)).map((id) => id.split(':')[1]))].filter((id) => doc.parts.some((p) => p.id === id));
	const all = candidateProbes(doc, scenario, c, base.solution, wholeHarness(doc), { profile, partOut });
	const byId = new Map(all.map((s) => [s.id, s]));
	const issues: { path: string; message: string }[] = [];
	input.probes.forEach((id, i) => {
		if (!byId.has(id)) issues.push({ path: `probes[${i}]`, message: `no probe "${id}" on this diagram (ids as the probe plan names them, e.g. "${all[0]?.id ?? 'volts:<part>:<terminal>'}")` });
	});
	const changes = input.fault ? faultChanges(c, base, input.fault, input.size) : [];
	if (!changes) issues.push({ path: 'fault', message: noFault(input.fault!) });
	if (issues.length) throw new DiagnoseError(issues);
	const specs = input.probes.map((id) => byId.get(id)!);
	const { readings } = probeReadings(doc, scenario, c, base, [{ changes: changes! }], specs, profile);
	return specs.map((s, i) => ({ id: s.id, label: s.label, unit: s.unit, reading: Math.round(readings[i][0] * 1e6) / 1e6 }));
}
