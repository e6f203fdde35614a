/**
 * What the drawing cannot know, for the restorer: the ranges a diagnosis plans with, each with
 * where its default comes from (TRADE.md, "Tolerances for the uncertainty model"), and the form
 * that changes them — a draft of text fields read back into an uncertainty (circuit/uncertainty.ts)
 * with every problem at the path the API would name.
 */
import { senderResistance, type PartKind } from '../circuit/parts';
import type { Scenario } from '../circuit/scenario';
import { formatPath, type HarnessDocument, type Part } from '../circuit/schema';
import { batteryRange, checkUncertainty, measuredWires, REST_EMF_PER_12, RUNNING_EMF_PER_12, UncertaintySchema, uncertaintyOf, type Uncertainty } from '../circuit/uncertainty';
import { counted, noun } from '../words';

/** Where each default comes from, in the restorer's words (TRADE.md). */
export const SOURCES = {
	batteryRest: 'BCI rest table (11.89 V discharged to 12.65 V full, at 80 °F), a little more with a surface charge after driving',
	batteryRunning: 'alternator charging, common practice (a dynamo holds less, and less still at low engine speed)',
	batterySet: 'set for this diagnosis',
	lamps: 'from memory',
	loads: 'from memory',
	wires: 'our default for lengths read off a manual',
	senderUnknown: 'unknown until you say',
	senderKnown: 'set for this diagnosis',
	stabilizer: 'enthusiast technical pages',
	changed: 'set for this diagnosis'
} as const;

export interface RangeRow {
	/** `battery`, `lamps`, `loads`, `wires`, `stabilizer` or `sender:<part id>`. */
	id: string;
	what: string;
	range: string;
	source: string;
	/** Differs from the default. */
	changed: boolean;
	note?: string;
}

type Sender = Extract<Part, { kind: 'sender' }>;
const LOAD_KINDS: readonly PartKind[] = ['gauge', 'relay', 'motor', 'load', 'resistor', 'ignition-coil'];

/** Volts as a restorer writes them: 12.8, 5.95. */
const volts = (x: number) => String(Math.round(x * 100) / 100);
const voltRange = (low: number, high: number) => `${volts(low)}–${volts(high)} V`;
const percent = (x: number) => `±${Math.round(x * 1000) / 10} %`;
/** A range for this vehicle, with the per-12 V figures when it is not a 12 V one (TRADE.md gives them per 12 V). */
const scaledRange = (low: number, high: number, system: number) => voltRange(low, high) + (system === 12 ? '' : ` (${voltRange((low * 12) / system, (high * 12) / system)} per 12 V)`);

export function sendersOf(doc: HarnessDocument): Sender[] {
	return doc.parts.filter((p): p is Sender => p.kind === 'sender');
}

/** Where a sender stands in the scenario (its own position when the scenario does not say). */
export function senderPosition(sender: Sender, scenario: Scenario): number {
	return scenario.senders[sender.id] ?? sender.params.position;
}

/** "position 0.60 (71 Ω)": the words trace mode uses for a sender. */
export function positionText(sender: Sender, position: number): string {
	return `position ${position.toFixed(2)} (${senderResistance(sender.params, position).toFixed(0)} Ω)`;
}

/**
 * The ranges in force for a diagnosis, each with its source; `battery` is the plan's battery
 * state, whose reading (once taken) replaces the assumed range.
 * @example rangesInForce({ doc, scenario, uncertainty: null })[0] // { id: 'battery', range: '11.9–12.8 V', source: SOURCES.batteryRest, … }
 */
export function rangesInForce({ doc, scenario, uncertainty, battery }: { doc: HarnessDocument; scenario: Scenario; uncertainty: Uncertainty | null; battery?: { measured?: number } | null }): RangeRow[] {
	const u = uncertainty ?? uncertaintyOf();
	const defaults = uncertaintyOf();
	const system = doc.vehicle.systemVoltage;
	const scale = system / 12;
	const rows: RangeRow[] = [];
	const b = batteryRange(doc, scenario, u);
	if (b) {
		const notes: string[] = [];
		// The model's own EMF stays inside the range (uncertainty.ts batteryRange): say so when that widened it.
		if (u.battery && (b.low !== u.battery.low || b.high !== u.battery.high)) notes.push(`Set to ${voltRange(u.battery.low, u.battery.high)}; the drawing’s battery, ${volts(b.nominal)} V, is kept inside.`);
		if (battery?.measured !== undefined) notes.push(`Read at its posts: ${volts(Math.abs(battery.measured))} V. Every expected reading is worked out from that.`);
		rows.push({
			id: 'battery',
			what: scenario.engineRunning ? 'Battery, engine running' : 'Battery at rest',
			range: u.battery ? voltRange(b.low, b.high) : scaledRange(b.low, b.high, system),
			source: u.battery ? SOURCES.batterySet : scenario.engineRunning ? SOURCES.batteryRunning : SOURCES.batteryRest,
			changed: !!u.battery,
			...(notes.length ? { note: notes.join(' ') } : {})
		});
	}
	if (doc.parts.some((p) => p.kind === 'lamp')) rows.push({ id: 'lamps', what: 'Lamp wattage', range: percent(u.lampWatts), source: u.lampWatts === defaults.lampWatts ? SOURCES.lamps : SOURCES.changed, changed: u.lampWatts !== defaults.lampWatts });
	if (doc.parts.some((p) => LOAD_KINDS.includes(p.kind)))
		rows.push({
			id: 'loads',
			what: 'Gauge heaters, coils, motors and other loads',
			range: percent(u.partResistance),
			source: u.partResistance === defaults.partResistance ? SOURCES.loads : SOURCES.changed,
			changed: u.partResistance !== defaults.partResistance
		});
	if (doc.wires.length) {
		const measured = measuredWires(doc, u).size;
		rows.push({
			id: 'wires',
			what: 'Wire lengths',
			range: `${percent(u.wireLength)} unless measured`,
			source: u.wireLength === defaults.wireLength ? SOURCES.wires : SOURCES.changed,
			changed: u.wireLength !== defaults.wireLength,
			note: measured
				? `${measured} of ${counted(doc.wires.length, 'wire')} measured: held at ${noun(measured, 'its', 'their')} length.`
				: `None of the ${doc.wires.length} wires is marked measured. Mark a length measured on the drawing board; diagnoses started after that use it.`
		});
	}
	if (doc.parts.some((p) => p.kind === 'stabilizer')) {
		const changed = u.stabilizer.low !== defaults.stabilizer.low || u.stabilizer.high !== defaults.stabilizer.high;
		rows.push({ id: 'stabilizer', what: 'Stabilizer output when healthy (average)', range: scaledRange(u.stabilizer.low * scale, u.stabilizer.high * scale, system), source: changed ? SOURCES.changed : SOURCES.stabilizer, changed });
	}
	const known = new Set(u.knownSenders);
	for (const s of sendersOf(doc)) {
		const isKnown = known.has(s.id);
		rows.push({
			id: `sender:${s.id}`,
			what: `${s.key} ${s.label}`.trim(),
			range: isKnown ? `known: ${positionText(s, senderPosition(s, scenario))}` : 'level unknown: anywhere on its travel',
			source: isKnown ? SOURCES.senderKnown : SOURCES.senderUnknown,
			changed: isKnown
		});
	}
	return rows;
}

// ---------------------------------------------------------------------------------------------
// The form.

export interface RangesDraft {
	/** Blank both for the default by engine state. Volts for this vehicle. */
	batteryLow: string;
	batteryHigh: string;
	/** Percent. */
	lampPct: string;
	loadPct: string;
	wirePct: string;
	/** Volts for this vehicle (stored per 12 V). */
	stabilizerLow: string;
	stabilizerHigh: string;
	senders: Record<string, { known: boolean; position: number }>;
}

const round = (x: number) => Math.round(x * 1e6) / 1e6;
const pct = (x: number) => String(round(x * 100));

/** The form's fields for an uncertainty (null: the defaults). */
export function draftOf(doc: HarnessDocument, scenario: Scenario, uncertainty: Uncertainty | null): RangesDraft {
	const u = uncertainty ?? uncertaintyOf();
	const scale = doc.vehicle.systemVoltage / 12;
	const known = new Set(u.knownSenders);
	return {
		batteryLow: u.battery ? String(u.battery.low) : '',
		batteryHigh: u.battery ? String(u.battery.high) : '',
		lampPct: pct(u.lampWatts),
		loadPct: pct(u.partResistance),
		wirePct: pct(u.wireLength),
		stabilizerLow: String(round(u.stabilizer.low * scale)),
		stabilizerHigh: String(round(u.stabilizer.high * scale)),
		senders: Object.fromEntries(sendersOf(doc).map((s) => [s.id, { known: known.has(s.id), position: senderPosition(s, scenario) }]))
	};
}

/** The default battery range for the scenario, in volts for this vehicle (what the blank fields stand for). */
export function defaultBattery(doc: HarnessDocument, scenario: Scenario): { low: number; high: number } {
	const r = scenario.engineRunning ? RUNNING_EMF_PER_12 : REST_EMF_PER_12;
	const scale = doc.vehicle.systemVoltage / 12;
	return { low: round(r.low * scale), high: round(r.high * scale) };
}

export type Issue = { path: string; message: string };
export type DraftRead = { ok: true; uncertainty: Uncertainty | null; scenario: Scenario | null } | { ok: false; issues: Issue[] };

function number(text: string): number | null {
	const t = text.trim().replace(',', '.');
	if (!/^\d+(\.\d*)?$|^\.\d+$/.test(t)) return null;
	return Number(t);
}

/**
 * The draft read back: the uncertainty to store (null when it is the defaults) and the scenario
 * with the known senders' positions (null when they did not move); or every problem at the path
 * the API names (`uncertainty.battery.low`, `scenario.senders.<id>`, …). Wires named measured for
 * this diagnosis (`current.measuredWires`) are kept: the form does not show them one by one.
 */
export function readDraft(doc: HarnessDocument, scenario: Scenario, current: Uncertainty | null, draft: RangesDraft): DraftRead {
	const issues: Issue[] = [];
	const scale = doc.vehicle.systemVoltage / 12;
	const field = (text: string, path: string, what: string): number | null => {
		const n = number(text);
		if (n === null) issues.push({ path, message: text.trim() ? `“${text.trim()}” is not a number` : `enter ${what}` });
		return n;
	};
	const share = (text: string, path: string): number => {
		const n = field(text, path, 'a percentage, 0 for none');
		if (n !== null && n > 90) issues.push({ path, message: 'from 0 to 90 %' });
		return n === null ? 0 : round(n / 100);
	};

	let battery: { low: number; high: number } | undefined;
	const lowText = draft.batteryLow.trim();
	const highText = draft.batteryHigh.trim();
	if (lowText || highText) {
		const low = lowText ? field(lowText, 'uncertainty.battery.low', 'the lowest volts') : (issues.push({ path: 'uncertainty.battery.low', message: 'enter both ends, or leave both empty for the default' }), null);
		const high = highText ? field(highText, 'uncertainty.battery.high', 'the highest volts') : (issues.push({ path: 'uncertainty.battery.high', message: 'enter both ends, or leave both empty for the default' }), null);
		if (low !== null && high !== null) {
			const d = defaultBattery(doc, scenario);
			// The default range typed in is the default: leave it to follow the engine state.
			if (!(low === d.low && high === d.high)) battery = { low, high };
		}
	}
	const stabLow = field(draft.stabilizerLow, 'uncertainty.stabilizer.low', 'the lowest volts');
	const stabHigh = field(draft.stabilizerHigh, 'uncertainty.stabilizer.high', 'the highest volts');
	const candidate = {
		...(battery ? { battery } : {}),
		lampWatts: share(draft.lampPct, 'uncertainty.lampWatts'),
		partResistance: share(draft.loadPct, 'uncertainty.partResistance'),
		wireLength: share(draft.wirePct, 'uncertainty.wireLength'),
		measuredWires: current?.measuredWires ?? [],
		knownSenders: sendersOf(doc)
			.filter((s) => draft.senders[s.id]?.known)
			.map((s) => s.id),
		stabilizer: { low: round((stabLow ?? 0) / scale), high: round((stabHigh ?? 0) / scale) }
	};
	const positions: Record<string, number> = {};
	for (const s of sendersOf(doc)) {
		const d = draft.senders[s.id];
		if (!d?.known) continue;
		if (!(d.position >= 0 && d.position <= 1)) issues.push({ path: `scenario.senders.${s.id}`, message: 'a position from 0 (empty or cold) to 1 (full or hot)' });
		else if (d.position !== senderPosition(s, scenario)) positions[s.id] = d.position;
	}
	if (issues.length) return { ok: false, issues };

	const parsed = UncertaintySchema.safeParse(candidate);
	if (!parsed.success) return { ok: false, issues: parsed.error.issues.map((i) => ({ path: `uncertainty.${formatPath(i.path)}`, message: i.message })) };
	const checked = checkUncertainty(doc, parsed.data);
	if (checked.length) return { ok: false, issues: checked.map((i) => ({ path: `uncertainty.${i.path}`, message: i.message })) };
	const isDefault = JSON.stringify(parsed.data) === JSON.stringify(uncertaintyOf());
	return {
		ok: true,
		uncertainty: isDefault ? null : parsed.data,
		scenario: Object.keys(positions).length ? { ...scenario, senders: { ...scenario.senders, ...positions } } : null
	};
}

/**
 * The form field an issue belongs to: `battery`, `lampWatts`, `partResistance`, `wireLength`,
 * `stabilizer`, `sender:<id>`, or `form` for anything else. `knownSenders` resolves an index.
 */
export function fieldOf(path: string, knownSenders: readonly string[] = []): string {
	const m = /^uncertainty\.(battery|lampWatts|partResistance|wireLength|stabilizer|measuredWires|knownSenders)(?:\[(\d+)\])?/.exec(path);
	if (m) {
		if (m[1] === 'knownSenders') return m[2] !== undefined && knownSenders[Number(m[2])] ? `sender:${knownSenders[Number(m[2])]}` : 'form';
		return m[1] === 'measuredWires' ? 'wireLength' : m[1];
	}
	const s = /^scenario\.senders\.(.+)$/.exec(path);
	return s ? `sender:${s[1]}` : 'form';
}
