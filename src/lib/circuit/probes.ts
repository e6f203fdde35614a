/**
 * Candidate probes: the measurements a person can make on the region of a diagnosis, each with
 * where it goes (part key, terminal, wire colour), the meter setting, the conditions (ignition,
 * what to disconnect), the cautions, a reach cost and a tolerance from the meter profile.
 *
 * Kinds: DC volts from a terminal to earth (the circuit working as in the scenario), volt drop
 * along a wire or across one wire-end joint under load, ohms across a part with the battery
 * disconnected, a test lamp from a terminal to earth, and — for a marked lamp or motor — volts
 * and test lamp at its feed with the part taken out (a voltmeter draws almost nothing, so a
 * high-resistance feed reads full voltage on it; the lamp loads it and glows dim: TRADE.md).
 */
import type { Circuit } from './circuit';
import type { Region } from './faults';
import { probeNode, PULSING_SHOWN, pulsingNodes, type ProbePoint } from './meters';
import { meterFor, PROBE_KINDS, type MeterProfile, type ProbeKind, type SetupId } from './meter';
import { nodeOfTerminal } from './nets';
import type { Location } from './parts';
import type { Meter } from './predict';
import type { Scenario } from './scenario';
import type { HarnessDocument, Part } from './schema';
import type { Solution } from './solve';
import type { Tolerance } from './outcomes';
import { prepareTrace, type TracePoint } from './trace';
import { wireNames } from './wire-names';

/** Reach cost per location (invented defaults, ordered by how awkward the place is to get at). */
export const DEFAULT_REACH: Record<Location, number> = {
	'engine-bay': 1,
	front: 1.5,
	boot: 1.5,
	rear: 1.5,
	cabin: 2,
	dash: 3,
	chassis: 3,
	'fuel-tank': 4
};

/** Extra effort (same unit): battery off for ohms, a part taken out, two leads apart for a drop. Invented. */
export const SETUP_COST = { powerOff: 1, partOut: 0.5, drop: 0.5 } as const;

export interface ProbePlace {
	/** The red lead. */
	part: string;
	key: string;
	terminal: string;
	/** Colour codes of the wires on that terminal. */
	wires: string[];
	/** Behind the joint of this wire end (a drop across a joint). */
	wire?: string;
	end?: 'from' | 'to';
	/** The black lead: "earth" (the battery's earthed post) or another terminal. */
	to: 'earth' | 'chassis' | { part: string; key: string; terminal: string; wire?: string; end?: 'from' | 'to' };
}

export interface ProbeSpec {
	id: string;
	kind: ProbeKind;
	setup: SetupId;
	meter: Meter;
	place: ProbePlace;
	label: string;
	setting: string;
	conditions: string[];
	/** Cautions by id (CAUTIONS holds their short words; the checklist prints the full ones). */
	cautions: CautionId[];
	cost: number;
	unit: string;
	tolerance: Tolerance;
	/** Order along the feed from the battery, for the point-by-point walk (lower = nearer the battery). */
	order: number;
}

export interface ProbeOptions {
	profile: MeterProfile;
	reach?: Partial<Record<Location, number>>;
	/** Kinds the person can take (default all). */
	tools?: readonly ProbeKind[];
	/** Marked lamps and motors to probe with the part out. */
	partOut?: readonly string[];
}

export const CAUTIONS = {
	battery:
		'Battery: no rings or watches, insulated tools, eye protection, no sparks or flames; disconnect the earth lead first and refit it last.',
	fuel: 'Fuel tank: vapour is heavier than air and flammable; no sparks or flames, ventilate, and do not let a probe short the sender terminal to the tank.',
	coil: 'Breaker-point ignition: with the ignition on and the points closed the coil and points overheat; disconnect the coil feed (terminal 15) if the ignition must stay on for long.',
	gauge: 'Thermal gauge: earth its sender wire only briefly, or the gauge is damaged at full scale.',
	ohms: 'Ohms only with the circuit unpowered: the battery disconnected.',
	general: 'Loomwright assists diagnosis; follow the vehicle manual and get a qualified technician where unsure.'
} as const;
export type CautionId = keyof typeof CAUTIONS;

/** A short statement of the scenario a powered probe is taken in. */
export function describeScenario(doc: HarnessDocument, scenario: Scenario): string[] {
	const out: string[] = [];
	for (const p of doc.parts) {
		if (p.kind !== 'switch') continue;
		const pos = scenario.switches?.[p.id];
		if (pos && (p.params.role !== 'other' || p.params.positions.length > 2 || pos !== p.params.positions[0].name)) {
			out.push(`Switch ${p.key}${p.label ? ` (${p.label})` : ''} at "${pos}"`);
		}
	}
	for (const d of scenario.disconnected ?? []) {
		const id = typeof d === 'string' ? d : d.part;
		const p = doc.parts.find((x) => x.id === id);
		out.push(typeof d === 'string' ? `Disconnected: ${p ? p.key : id}` : `Disconnected: ${p?.key ?? d.part}.${d.terminal}`);
	}
	out.push(scenario.engineRunning ? 'Engine running' : 'Engine stopped');
	return out;
}

/** Build the candidate probes of a region. `solution` is the healthy solve of the scenario (for pulsing outputs). */
export function candidateProbes(doc: HarnessDocument, scenario: Scenario, c: Circuit, solution: Solution, region: Region, options: ProbeOptions): ProbeSpec[] {
	const profile = options.profile;
	const reach = { ...DEFAULT_REACH, ...(options.reach ?? {}) };
	const tools = new Set(options.tools ?? PROBE_KINDS);
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const pulsing = pulsingNodes(solution);
	const positive = doc.vehicle.earth === 'positive';
	const blackLead = positive
		? 'Black lead on the battery\u2019s earthed + post (positive earth: feeds read negative)'
		: 'Black lead on the battery\u2019s earthed \u2212 post';
	const scenarioText = describeScenario(doc, scenario);
	const hasCoil = doc.parts.some((p) => p.kind === 'ignition-coil');
	const wiresAt = new Map<string, string[]>();
	for (const w of doc.wires) {
		for (const end of [w.from, w.to]) {
			const k = `${end.part}:${end.terminal}`;
			(wiresAt.get(k) ?? wiresAt.set(k, []).get(k)!).push(w.code);
		}
	}
	// Order along the feed: healthy voltage magnitude, highest first (nearest the battery's live post).
	const depth = (node: number) => -Math.abs(solution.at(node));
	const out: ProbeSpec[] = [];
	const cost = (p: Part) => reach[p.location] ?? 2;
	const cautionsAt = (p: Part, powered: boolean): CautionId[] => {
		const list: CautionId[] = [];
		if (p.kind === 'battery') list.push('battery');
		if (p.location === 'fuel-tank') list.push('fuel');
		if (powered && hasCoil) list.push('coil');
		return list;
	};
	const place = (p: Part, terminal: string, to: ProbePlace['to'], extra: Partial<ProbePlace> = {}): ProbePlace => ({
		part: p.id,
		key: p.key,
		terminal,
		wires: wiresAt.get(`${p.id}:${terminal}`) ?? [],
		to,
		...extra
	});
	// A reading fed from a pulsing stabilizer swings with it, in proportion to its share of the
	// output (meters.ts pulsingNodes): volts to earth by that share, a drop by the difference.
	const voltsTol = (nodes: number[]): Tolerance => {
		const [a, b] = nodes.map((n) => pulsing.get(n) ?? 0);
		const share = Math.abs(a - (b ?? 0));
		return { ...profile.volts, ...(share > PULSING_SHOWN ? { band: Math.round(profile.pulsingBand * share * 1000) / 1000 } : {}) };
	};
	const volts = doc.vehicle.systemVoltage;
	const lampTol: Tolerance = { abs: profile.lamp.abs, rel: profile.lamp.rel };
	const name = (p: Part) => (p.label ? `${p.key} (${p.label})` : p.key);
	const names = wireNames(doc);

	// Terminals of the region, one per node (the most reachable terminal of the node).
	const byNode = new Map<string, { part: Part; terminal: string }>();
	for (const id of region.parts) {
		const p = parts.get(id);
		if (!p) continue;
		for (const t of p.terminals) {
			const n = nodeOfTerminal(p, t);
			if (!region.nodes.has(n)) continue;
			const node = c.nodeIndex.get(n)!;
			if (node < 0 || n === 'chassis') continue;
			const prev = byNode.get(n);
			if (!prev || cost(p) < cost(prev.part)) byNode.set(n, { part: p, terminal: t });
		}
	}
	for (const [n, { part: p, terminal: t }] of byNode) {
		const node = c.nodeIndex.get(n)!;
		const point: ProbePoint = { part: p.id, terminal: t };
		const at = `${name(p)} terminal ${t}`;
		if (tools.has('volts')) {
			out.push({
				id: `volts:${p.id}:${t}`,
				kind: 'volts',
				setup: 'as-given',
				meter: meterFor('volts', point, 'earth', profile, volts),
				place: place(p, t, 'earth'),
				label: `Volts at ${at} to earth`,
				setting: 'DC volts, 20 V range',
				conditions: [...scenarioText, blackLead],
				cautions: cautionsAt(p, true),
				cost: cost(p),
				unit: 'V',
				tolerance: voltsTol([node]),
				order: depth(node)
			});
		}
		if (tools.has('lamp')) {
			const extra: CautionId[] = p.kind === 'gauge' || p.kind === 'sender' ? ['gauge'] : [];
			out.push({
				id: `lamp:${p.id}:${t}`,
				kind: 'lamp',
				setup: 'as-given',
				meter: meterFor('lamp', point, 'earth', profile, volts),
				place: place(p, t, 'earth'),
				label: `Test lamp (${profile.lamp.watts} W) from ${at} to earth`,
				setting: `Test lamp ${profile.lamp.watts} W: judge its brightness (100 % = full)`,
				conditions: [...scenarioText, 'Lamp clip on the battery\u2019s earthed post or a clean body earth'],
				cautions: [...cautionsAt(p, true), ...extra],
				cost: cost(p),
				unit: '%',
				tolerance: lampTol,
				order: depth(node) + 0.5
			});
		}
	}

	// Drops along wires and across their end joints, under load.
	if (tools.has('drop')) {
		for (const w of doc.wires) {
			if (!region.wires.has(w.id)) continue;
			const a = parts.get(w.from.part)!;
			const b = parts.get(w.to.part)!;
			const na = c.terminalNode(w.from);
			const nb = c.terminalNode(w.to);
			out.push({
				id: `drop:${w.id}`,
				kind: 'drop',
				setup: 'as-given',
				meter: meterFor('drop', w.from, w.to, profile, volts),
				place: place(a, w.from.terminal, { part: b.id, key: b.key, terminal: w.to.terminal }),
				label: `Volt drop along ${names.wire(w)}`,
				setting: 'DC volts, 20 V range (a long lead between the ends)',
				conditions: [...scenarioText, 'Circuit working (under load)'],
				cautions: [...cautionsAt(a, true), ...cautionsAt(b, false)],
				cost: Math.max(cost(a), cost(b)) + SETUP_COST.drop,
				unit: 'V',
				tolerance: voltsTol([na, nb]),
				order: Math.max(depth(na), depth(nb)) + 0.25
			});
			for (const end of ['from', 'to'] as const) {
				const ref = w[end];
				const p = parts.get(ref.part)!;
				const n = c.terminalNode(ref);
				out.push({
					id: `joint:${w.id}:${end}`,
					kind: 'drop',
					setup: 'as-given',
					meter: meterFor('drop', ref, { wire: w.id, end }, profile, volts),
					place: place(p, ref.terminal, { part: p.id, key: p.key, terminal: ref.terminal, wire: w.id, end }),
					label: `Volt drop across the joint of ${names.end(w, end)} (terminal to wire just behind it)`,
					setting: 'DC volts, 20 V range; back-probe the wire behind the crimp',
					conditions: [...scenarioText, 'Circuit working (under load)'],
					cautions: cautionsAt(p, true),
					cost: cost(p) + SETUP_COST.drop,
					unit: 'V',
					tolerance: voltsTol([n]),
					order: depth(n) + 0.3
				});
			}
		}
	}

	// Ohms across parts, battery disconnected.
	if (tools.has('ohms')) {
		const seen = new Set<string>();
		c.elements.forEach((e) => {
			if (e.ref.kind !== 'part' || !region.parts.has(e.ref.part)) return;
			const p = parts.get(e.ref.part)!;
			if (p.kind === 'battery' || p.kind === 'generator' || p.kind === 'stabilizer') return;
			const [ta, tb] = e.ref.terminals;
			const key = `${p.id}:${ta}:${tb ?? 'chassis'}`;
			if (seen.has(key)) return;
			seen.add(key);
			const a: ProbePoint = { part: p.id, terminal: ta };
			const b: ProbePoint = tb ? { part: p.id, terminal: tb } : 'chassis';
			out.push({
				id: `ohms:${p.id}:${ta}:${tb ?? 'chassis'}`,
				kind: 'ohms',
				setup: 'power-off',
				meter: meterFor('ohms', a, b, profile, volts),
				place: place(p, ta, tb ? { part: p.id, key: p.key, terminal: tb } : 'chassis'),
				label: tb ? `Ohms across ${name(p)} from ${ta} to ${tb}` : `Ohms from ${name(p)} ${ta} to a clean body point`,
				setting: 'Ohms, 200 Ω range (a higher range if it shows over-range)',
				conditions: ['Battery disconnected (earth lead off)', 'Ignition off', 'Leads touched together first: subtract their resistance'],
				cautions: ['ohms', 'battery', ...(p.location === 'fuel-tank' ? (['fuel'] as const) : [])],
				cost: cost(p) + SETUP_COST.powerOff,
				unit: 'Ω',
				tolerance: { abs: profile.ohms.abs, rel: profile.ohms.rel },
				order: depth(e.a) + 0.75
			});
		});
	}

	// With a marked lamp or motor taken out: volts and test lamp at its feed contact.
	for (const id of options.partOut ?? []) {
		const p = parts.get(id);
		if (!p || !['lamp', 'motor', 'load'].includes(p.kind)) continue;
		const t = p.kind === 'load' ? p.terminals[0] : 'feed';
		const point: ProbePoint = { part: p.id, terminal: t };
		const node = c.terminalNode(point);
		const setup: SetupId = `part-out:${p.id}`;
		const what = p.kind === 'lamp' ? 'bulb' : 'part';
		const conditions = [...scenarioText, `${p.kind === 'lamp' ? 'Bulb' : 'Part'} ${name(p)} taken out; probe its ${t} contact`];
		if (tools.has('volts'))
			out.push({
				id: `volts-out:${p.id}:${t}`,
				kind: 'volts',
				setup,
				meter: meterFor('volts', point, 'earth', profile, volts),
				place: place(p, t, 'earth'),
				label: `Volts at the ${t} contact of ${name(p)} with the ${what} out`,
				setting: 'DC volts, 20 V range',
				conditions: [...conditions, blackLead],
				cautions: cautionsAt(p, true),
				cost: cost(p) + SETUP_COST.partOut,
				unit: 'V',
				tolerance: voltsTol([node]),
				order: depth(node) + 0.1
			});
		if (tools.has('lamp'))
			out.push({
				id: `lamp-out:${p.id}:${t}`,
				kind: 'lamp',
				setup,
				meter: meterFor('lamp', point, 'earth', profile, volts),
				place: place(p, t, 'earth'),
				label: `Test lamp (${profile.lamp.watts} W) at the ${t} contact of ${name(p)} with the ${what} out`,
				setting: `Test lamp ${profile.lamp.watts} W: judge its brightness (100 % = full)`,
				conditions,
				cautions: cautionsAt(p, true),
				cost: cost(p) + SETUP_COST.partOut,
				unit: '%',
				tolerance: lampTol,
				order: depth(node) + 0.6
			});
	}
	return out;
}

/**
 * The order of the point-by-point walk, the way a person checks without a plan: for each marked
 * part in turn, volts to earth at every point of its feed from the battery (its first traced
 * feed path, battery end first, as `trace.ts` lists it), then at every point of its earth path
 * from the part back to the earth. Only voltmeter probes to earth, each point once; points with
 * no such probe among `specs` are passed over. Unlike every candidate probe in feed order, this
 * leaves out drops, test lamps and ohms, which a person without a plan rarely takes in turn.
 */
export function feedWalkOrder(doc: HarnessDocument, scenario: Scenario, c: Circuit, specs: readonly ProbeSpec[], parts: readonly string[]): string[] {
	const byNode = new Map<number, string>();
	for (const s of specs) {
		if (s.kind !== 'volts' || s.meter.kind !== 'volts' || s.meter.b !== 'earth') continue;
		const n = probeNode(c, s.meter.a);
		if (!byNode.has(n)) byNode.set(n, s.id);
	}
	const tracer = prepareTrace(doc, scenario);
	const out: string[] = [];
	const seen = new Set<string>();
	const visit = (points: readonly TracePoint[]) => {
		for (const pt of points) {
			if (pt.type !== 'node') continue;
			const id = byNode.get(c.nodeIndex.get(pt.node) ?? -2);
			if (id && !seen.has(id)) {
				seen.add(id);
				out.push(id);
			}
		}
	};
	for (const part of parts) {
		visit(tracer.feed(part).paths[0] ?? []);
		visit([...(tracer.earth(part).paths[0] ?? [])].reverse());
	}
	return out;
}
