// The ranges a diagnosis plans with, as the page lists them, and the form that changes them.
// Figures: TRADE.md, "Tolerances for the uncertainty model" (battery at rest 11.9–12.8 V per 12 V
// from the BCI rest table; lamps and loads ±10 % from memory; wire lengths ±50 % unless measured,
// our default; a healthy stabilizer 9.5–10.5 V per 12 V from enthusiast technical pages).
import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { defaultScenario } from '../circuit/scenario';
import type { HarnessDocument } from '../circuit/schema';
import { uncertaintyOf } from '../circuit/uncertainty';
import { draftOf, fieldOf, rangesInForce, readDraft, SOURCES } from './ranges';

const doc = demoHarness();
const scenario = defaultScenario(doc);
const byId = (rows: ReturnType<typeof rangesInForce>) => Object.fromEntries(rows.map((r) => [r.id, r]));

describe('rangesInForce', () => {
	it('lists the defaults with their sources for the demo harness', () => {
		const rows = byId(rangesInForce({ doc, scenario, uncertainty: null }));
		expect(rows.battery).toMatchObject({ what: 'Battery at rest', range: '11.9–12.8 V', source: SOURCES.batteryRest, changed: false });
		expect(rows.lamps).toMatchObject({ range: '±10 %', source: 'from memory' });
		expect(rows.loads).toMatchObject({ range: '±10 %', source: 'from memory' });
		expect(rows.wires).toMatchObject({ range: '±50 % unless measured', source: SOURCES.wires });
		expect(rows.wires.note).toMatch(/^None of the \d+ wires is marked measured/);
		expect(rows.stabilizer).toMatchObject({ range: '9.5–10.5 V', source: 'enthusiast technical pages' });
		// The demo's two senders (invented): fuel 22 and coolant temperature 23.
		expect(rows['sender:fuel-sender']).toMatchObject({ what: '22 Fuel tank sender', range: 'level unknown: anywhere on its travel', changed: false });
		expect(rows['sender:temp-sender'].range).toBe('level unknown: anywhere on its travel');
	});

	it('says what was changed, counts measured wires, names a known sender\u2019s position, and the battery once read', () => {
		const measured: HarnessDocument = { ...doc, wires: doc.wires.map((w, i) => (i < 3 ? { ...w, lengthMeasured: true } : w)) };
		const u = uncertaintyOf({ battery: { low: 12.1, high: 12.3 }, wireLength: 0.3, knownSenders: ['fuel-sender'], measuredWires: [doc.wires[5].id] });
		const rows = byId(rangesInForce({ doc: measured, scenario: { ...scenario, senders: { ...scenario.senders, 'fuel-sender': 0.25 } }, uncertainty: u, battery: { measured: -12.53 } }));
		// batteryRange keeps the model's own 12.6 V inside the range (uncertainty.ts).
		expect(rows.battery).toMatchObject({ range: '12.1–12.6 V', source: SOURCES.batterySet, changed: true });
		expect(rows.battery.note).toBe('Set to 12.1–12.3 V; the drawing’s battery, 12.6 V, is kept inside. Read at its posts: 12.53 V. Every expected reading is worked out from that.');
		expect(rows.wires).toMatchObject({ range: '±30 % unless measured', changed: true });
		expect(rows.wires.note).toBe(`4 of ${doc.wires.length} wires measured: held at their length.`);
		// 145 Ω empty to 21 Ω full, linear: 145 − 124 × 0.25 = 114 Ω.
		expect(rows['sender:fuel-sender']).toMatchObject({ range: 'known: position 0.25 (114 Ω)', changed: true });
	});

	it('gives a 6 V vehicle its own volts and the per-12 V figures beside them', () => {
		const six: HarnessDocument = { ...doc, vehicle: { ...doc.vehicle, systemVoltage: 6 } };
		const rows = byId(rangesInForce({ doc: six, scenario, uncertainty: null }));
		expect(rows.battery.range).toBe('5.95–6.4 V (11.9–12.8 V per 12 V)');
		expect(rows.stabilizer.range).toBe('4.75–5.25 V (9.5–10.5 V per 12 V)');
	});

	it('uses the running range with the engine running', () => {
		const rows = byId(rangesInForce({ doc, scenario: { ...scenario, engineRunning: true }, uncertainty: null }));
		expect(rows.battery).toMatchObject({ what: 'Battery, engine running', range: '13.5–14.5 V', source: SOURCES.batteryRunning });
	});
});

describe('the ranges form', () => {
	it('reads the untouched defaults back as "the defaults" (null), and changes nothing in the scenario', () => {
		const draft = draftOf(doc, scenario, null);
		expect(draft).toMatchObject({ batteryLow: '', batteryHigh: '', lampPct: '10', loadPct: '10', wirePct: '50', stabilizerLow: '9.5', stabilizerHigh: '10.5' });
		expect(readDraft(doc, scenario, null, draft)).toEqual({ ok: true, uncertainty: null, scenario: null });
	});

	it('reads a changed battery range, tolerances and a known sender with its new position', () => {
		const draft = draftOf(doc, scenario, null);
		const r = readDraft(doc, scenario, uncertaintyOf({ measuredWires: ['w-ign-fuse'] }), {
			...draft,
			batteryLow: '12,1',
			batteryHigh: '12.3',
			lampPct: '5',
			senders: { ...draft.senders, 'fuel-sender': { known: true, position: 0.25 } }
		});
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.uncertainty).toEqual(uncertaintyOf({ battery: { low: 12.1, high: 12.3 }, lampWatts: 0.05, knownSenders: ['fuel-sender'], measuredWires: ['w-ign-fuse'] }));
		expect(r.scenario?.senders['fuel-sender']).toBe(0.25);
		// The other sender keeps its position.
		expect(r.scenario?.senders['temp-sender']).toBe(scenario.senders['temp-sender']);
		// And back: the draft of what was read shows the same fields.
		expect(draftOf(doc, r.scenario!, r.uncertainty)).toMatchObject({ batteryLow: '12.1', batteryHigh: '12.3', lampPct: '5', senders: { 'fuel-sender': { known: true, position: 0.25 } } });
	});

	it('takes the default battery range typed in as the default', () => {
		const r = readDraft(doc, scenario, null, { ...draftOf(doc, scenario, null), batteryLow: '11.9', batteryHigh: '12.8' });
		expect(r).toEqual({ ok: true, uncertainty: null, scenario: null });
	});

	it('names every problem at the path the API uses, and the field it belongs to', () => {
		const draft = draftOf(doc, scenario, null);
		const r = readDraft(doc, scenario, null, { ...draft, batteryLow: '12.9', batteryHigh: '', lampPct: 'ten', wirePct: '95', stabilizerHigh: '' });
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.issues.map((i) => i.path)).toEqual(['uncertainty.battery.high', 'uncertainty.stabilizer.high', 'uncertainty.lampWatts', 'uncertainty.wireLength']);
		expect(r.issues.map((i) => fieldOf(i.path))).toEqual(['battery', 'stabilizer', 'lampWatts', 'wireLength']);
		const upside = readDraft(doc, scenario, null, { ...draft, batteryLow: '12.9', batteryHigh: '12.1' });
		expect(!upside.ok && upside.issues).toEqual([{ path: 'uncertainty.battery', message: 'low must not be above high' }]);
		const flat = readDraft(doc, scenario, null, { ...draft, batteryLow: '0', batteryHigh: '12' });
		expect(!flat.ok && flat.issues.map((i) => i.path)).toEqual(['uncertainty.battery.low']);
	});

	it('maps the API\u2019s paths to the form\u2019s fields', () => {
		expect(fieldOf('uncertainty.knownSenders[1]', ['fuel-sender', 'temp-sender'])).toBe('sender:temp-sender');
		expect(fieldOf('scenario.senders.fuel-sender')).toBe('sender:fuel-sender');
		expect(fieldOf('uncertainty.measuredWires[0]')).toBe('wireLength');
		expect(fieldOf('version')).toBe('form');
	});
});
