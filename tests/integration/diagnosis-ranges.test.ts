// What the drawing cannot know, stored with a diagnosis over HTTP: started with ranges, read back,
// refused with every bad field named, changed under the version check (a stale version changes
// nothing, the current one changes it and plans again), and back to the defaults. Default ranges:
// TRADE.md, "Tolerances for the uncertainty model" (battery at rest 11.9–12.8 V per 12 V from the
// BCI rest table; lamps and loads ±10 % from memory; wire lengths ±50 % unless measured, our
// default; a healthy stabilizer 9.5–10.5 V per 12 V from enthusiast technical pages).
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '../../src/lib/circuit/demo';
import { OPEN_HUNT } from '../../src/lib/diagnosis/demo';
import { api, signedInAccount, type SignedIn } from './helpers';

let owner: SignedIn;
let stranger: SignedIn;
let diagramId: string;

beforeAll(async () => {
	owner = await signedInAccount('Range Setter');
	stranger = await signedInAccount('Range Passer-by');
	const v = await api('POST', '/api/vehicles', owner.cookie, { name: 'Ranges Ostrimmel', systemVoltage: 12, earthPolarity: 'positive' });
	// The demo harness (invented) with its ignition fuse feed marked measured on the drawing.
	const drawn = demoHarness();
	const document = { ...drawn, wires: drawn.wires.map((w) => (w.id === 'w-ign-fuse' ? { ...w, lengthMeasured: true } : w)) };
	const d = await api('POST', '/api/diagrams', owner.cookie, { vehicleId: v.body.vehicle.id, title: 'Complete harness', document });
	expect(d.status, JSON.stringify(d.body)).toBe(201);
	diagramId = d.body.diagram.id;
});

type Started = { diagnosis: { id: string; version: number; uncertainty: Record<string, unknown> | null; scenario: { senders: Record<string, number> } }; plan: { battery: { assumed: { low: number; high: number } } } };

async function start(uncertainty?: unknown) {
	const r = await api('POST', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie, { revision: 1, marks: OPEN_HUNT.marks, ...(uncertainty === undefined ? {} : { uncertainty }) });
	return r as { status: number; body: Started & { issues?: { path: string; message: string }[] } };
}

/** A battery range in force, to the millivolt (the drawing's 12.6 V is 12 V × 1.05, not exact in floating point). */
function expectBattery(assumed: { low: number; high: number }, low: number, high: number) {
	expect(assumed.low).toBeCloseTo(low, 3);
	expect(assumed.high).toBeCloseTo(high, 3);
}

// The defaults as the schema fills them in (uncertainty.ts UncertaintySchema).
const DEFAULTS = { lampWatts: 0.1, partResistance: 0.1, wireLength: 0.5, measuredWires: [], knownSenders: [], stabilizer: { low: 9.5, high: 10.5 } };

describe('a diagnosis\u2019s ranges', () => {
	it('are the defaults (null) when the start does not give them', async () => {
		const r = await start();
		expect(r.status, JSON.stringify(r.body)).toBe(201);
		expect(r.body.diagnosis.uncertainty).toBeNull();
		expectBattery(r.body.plan.battery.assumed, 11.9, 12.8);
	});

	it('are stored as started, filled in with the defaults, read back, and planned with', async () => {
		// Invented: a battery the restorer knows to be about half charged, and the fuel level known.
		const r = await start({ battery: { low: 12.1, high: 12.3 }, lampWatts: 0.05, knownSenders: ['fuel-sender'] });
		expect(r.status, JSON.stringify(r.body)).toBe(201);
		const stored = { ...DEFAULTS, battery: { low: 12.1, high: 12.3 }, lampWatts: 0.05, knownSenders: ['fuel-sender'] };
		expect(r.body.diagnosis.uncertainty).toEqual(stored);
		// The range in force keeps the drawing's own 12.6 V inside (uncertainty.ts batteryRange).
		expectBattery(r.body.plan.battery.assumed, 12.1, 12.6);
		const back = await api('GET', `/api/diagnoses/${r.body.diagnosis.id}`, owner.cookie);
		expect(back.status).toBe(200);
		expect(back.body.diagnosis.uncertainty).toEqual(stored);
		expectBattery(back.body.plan.battery.assumed, 12.1, 12.6);
		// The page's data carries the document with the wire marked measured.
		expect(back.body.document.wires.find((w: { id: string }) => w.id === 'w-ign-fuse').lengthMeasured).toBe(true);
	});

	it('are refused with every bad field named, and nothing is stored', async () => {
		const before = (await api('GET', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie)).body.diagnoses.length;
		const shape = await start({ battery: { low: 12.8, high: 12.1 }, lampWatts: 2, stabilizer: { low: 'ten', high: 10.5 } });
		expect(shape.status).toBe(400);
		expect(shape.body.issues!.map((i) => i.path).sort()).toEqual(['uncertainty.battery', 'uncertainty.lampWatts', 'uncertainty.stabilizer.low']);
		const refs = await start({ battery: { low: 0, high: 12.8 }, knownSenders: ['fuel-sender', 'fuel-gauge'], measuredWires: ['w-nowhere'] });
		expect(refs.status).toBe(400);
		expect(refs.body.issues!.map((i) => i.path)).toEqual(['uncertainty.battery.low', 'uncertainty.knownSenders[1]', 'uncertainty.measuredWires[0]']);
		expect((await api('GET', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie)).body.diagnoses.length).toBe(before);
	});

	it('change under the version check: a stale version changes nothing, the current one changes them and plans again', async () => {
		const { body } = await start();
		const id = body.diagnosis.id;
		const v1 = body.diagnosis.version;
		// Someone else changes the title first: version 1 is now stale.
		const other = await api('PATCH', `/api/diagnoses/${id}`, owner.cookie, { version: v1, title: 'Gauges low, checked on the drive' });
		expect(other.status, JSON.stringify(other.body)).toBe(200);
		const v2 = other.body.diagnosis.version;
		expect(v2).toBe(v1 + 1);

		const change = { uncertainty: { battery: { low: 12.0, high: 12.2 }, knownSenders: ['fuel-sender'] }, scenario: { ...body.diagnosis.scenario, senders: { ...body.diagnosis.scenario.senders, 'fuel-sender': 0.25 } } };
		const stale = await api('PATCH', `/api/diagnoses/${id}`, owner.cookie, { version: v1, ...change });
		expect(stale.status).toBe(409);
		expect(stale.body.error).toMatch(/changed elsewhere \(now version 2\)/);
		// Nothing half-saved: neither the ranges nor the sender's position.
		const still = await api('GET', `/api/diagnoses/${id}`, owner.cookie);
		expect(still.body.diagnosis.version).toBe(v2);
		expect(still.body.diagnosis.uncertainty).toBeNull();
		expect(still.body.diagnosis.scenario.senders['fuel-sender']).toBe(body.diagnosis.scenario.senders['fuel-sender']);

		const good = await api('PATCH', `/api/diagnoses/${id}`, owner.cookie, { version: v2, ...change });
		expect(good.status, JSON.stringify(good.body)).toBe(200);
		expect(good.body.diagnosis.version).toBe(v2 + 1);
		expect(good.body.diagnosis.uncertainty).toEqual({ ...DEFAULTS, battery: { low: 12.0, high: 12.2 }, knownSenders: ['fuel-sender'] });
		expect(good.body.diagnosis.scenario.senders['fuel-sender']).toBe(0.25);
		// Planned again with the new battery range.
		expectBattery(good.body.plan.battery.assumed, 12.0, 12.6);
		const read = await api('GET', `/api/diagnoses/${id}`, owner.cookie);
		expect(read.body.diagnosis.uncertainty).toEqual(good.body.diagnosis.uncertainty);
		expectBattery(read.body.plan.battery.assumed, 12.0, 12.6);

		// A bad range on the current version: 400 with its path, and the version stays.
		const bad = await api('PATCH', `/api/diagnoses/${id}`, owner.cookie, { version: v2 + 1, uncertainty: { knownSenders: ['temp-gauge'] } });
		expect(bad.status).toBe(400);
		expect(bad.body.issues).toEqual([{ path: 'uncertainty.knownSenders[0]', message: '"temp-gauge" is not a sender of this diagram' }]);

		// Back to the defaults.
		const reset = await api('PATCH', `/api/diagnoses/${id}`, owner.cookie, { version: v2 + 1, uncertainty: null });
		expect(reset.status, JSON.stringify(reset.body)).toBe(200);
		expect(reset.body.diagnosis.uncertainty).toBeNull();
		expectBattery(reset.body.plan.battery.assumed, 11.9, 12.8);
	});

	it('cannot be changed by an account the diagnosis is not shared with', async () => {
		const { body } = await start();
		const r = await api('PATCH', `/api/diagnoses/${body.diagnosis.id}`, stranger.cookie, { version: body.diagnosis.version, uncertainty: null });
		expect(r.status).toBe(404);
	});
});
