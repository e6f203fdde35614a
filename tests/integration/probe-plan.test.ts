// The probe plan over HTTP, on the demo diagram: the same reasoning as the circuit core's
// diagnose.spec.ts, reached through the API with its access rules and error shape.
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '../../src/lib/circuit/demo';
import { api, baseUrl, signedInAccount, type SignedIn } from './helpers';

let owner: SignedIn;
let stranger: SignedIn;
let diagramId: string;

beforeAll(async () => {
	owner = await signedInAccount('Planner');
	stranger = await signedInAccount('Onlooker');
	const v = await api('POST', '/api/vehicles', owner.cookie, { name: 'Plan Ostrimmel', systemVoltage: 12, earthPolarity: 'positive' });
	expect(v.status).toBe(201);
	const d = await api('POST', '/api/diagrams', owner.cookie, { vehicleId: v.body.vehicle.id, title: 'Complete harness', document: demoHarness() });
	expect(d.status).toBe(201);
	diagramId = d.body.diagram.id;
});

const bothGaugesLow = { marks: [{ part: 'fuel-gauge', mark: 'reads-low' }, { part: 'temp-gauge', mark: 'reads-low' }] };

describe('POST /api/diagrams/[id]/probe-plan', () => {
	it('starts the plan with a probe at a point the suspects disagree on', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/probe-plan`, owner.cookie, bothGaugesLow);
		expect(r.status).toBe(200);
		expect(r.body.revision).toBe(1);
		expect(r.body.suspects.length).toBeGreaterThan(1);
		// Both gauges low together points at what they share (TRADE.md, common practice): the
		// stabilizer is among the suspects.
		expect(JSON.stringify(r.body.suspects)).toMatch(/stabilizer/);
		const first = r.body.plan.steps[0];
		const probe = r.body.probes.find((p: { id: string }) => p.id === first.probe);
		expect(probe).toBeTruthy();
		const readings = new Set(first.expected.map((e: { reading: number | null }) => e.reading));
		expect(readings.size).toBeGreaterThan(1);
		expect(r.body.minimalSet.probes.length).toBeGreaterThan(0);
	});

	it('re-plans from a reading: the suspects that predicted otherwise drop out', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/probe-plan`, owner.cookie, bothGaugesLow);
		const first = r.body.plan.steps[0];
		// Take the reading the likeliest suspect predicts, as if it were the real fault.
		const truth = r.body.suspects[0].id;
		const probe = r.body.probes.find((p: { id: string }) => p.id === first.probe);
		const reading = probe.expected.find((e: { suspect: string }) => e.suspect === truth).reading;
		const again = await api('POST', `/api/diagrams/${diagramId}/probe-plan`, owner.cookie, {
			...bothGaugesLow,
			readings: { [first.probe]: reading }
		});
		expect(again.status).toBe(200);
		const remaining = again.body.readings.remaining.map((x: { suspect: string }) => x.suspect);
		expect(remaining).toContain(truth);
		expect(remaining.length).toBeLessThan(r.body.suspects.length);
	});

	it('answers small: the probes the steps and the minimal set name, every candidate only when asked', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/probe-plan`, owner.cookie, bothGaugesLow);
		const named = new Set([...r.body.plan.steps.map((s: { probe: string }) => s.probe), ...r.body.minimalSet.probes]);
		const sent = r.body.probes.map((p: { id: string }) => p.id);
		expect(new Set(sent)).toEqual(named);
		expect(r.body.probeCount).toBeGreaterThan(sent.length);
		const full = await api('POST', `/api/diagrams/${diagramId}/probe-plan`, owner.cookie, { ...bothGaugesLow, detail: 'full' });
		expect(full.body.probes.length).toBe(r.body.probeCount);
		expect(full.body.plan.steps).toEqual(r.body.plan.steps);
	});

	it('sends its JSON gzip-compressed to a client that takes it (RFC 9110 §8.4), as it is to one that does not', async () => {
		const ask = (encoding: string) =>
			fetch(`${baseUrl()}/api/diagrams/${diagramId}/probe-plan`, {
				method: 'POST',
				headers: { cookie: owner.cookie, 'content-type': 'application/json', 'accept-encoding': encoding },
				body: JSON.stringify(bothGaugesLow)
			});
		const zipped = await ask('gzip');
		expect(zipped.headers.get('content-encoding')).toBe('gzip');
		expect(zipped.headers.get('vary')).toMatch(/accept-encoding/i);
		const plain = await ask('identity');
		expect(plain.headers.get('content-encoding')).toBeNull();
		// fetch unpacks gzip: both carry the same plan.
		expect((await zipped.json()).plan.steps).toEqual((await plain.json()).plan.steps);
	});

	it('answers 400 naming the mark that names no part', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/probe-plan`, owner.cookie, { marks: [{ part: 'no-such-part', mark: 'dead' }] });
		expect(r.status).toBe(400);
		expect(r.body.issues.map((i: { path: string }) => i.path)).toContain('marks[0].part');
	});

	it('answers 404 to another account and 401 without a session', async () => {
		expect((await api('POST', `/api/diagrams/${diagramId}/probe-plan`, stranger.cookie, bothGaugesLow)).status).toBe(404);
		expect((await api('POST', `/api/diagrams/${diagramId}/probe-plan`, null, bothGaugesLow)).status).toBe(401);
	});
});

describe('POST /api/diagrams/[id]/predict', () => {
	it('predicts the healthy readings: battery at rest on a positive-earth vehicle reads about −12.6 V', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/predict`, owner.cookie, {
			probes: [
				{ id: 'bat', kind: 'volts', at: { part: 'battery', terminal: '-' } },
				{ id: 'gauge-feed', kind: 'volts', at: { part: 'fuel-gauge', terminal: 'feed' } }
			]
		});
		expect(r.status).toBe(200);
		const byId = Object.fromEntries(r.body.readings.map((x: { id: string; reading: number }) => [x.id, x.reading]));
		// A charged 12 V battery rests near 12.6 V (BCI state-of-charge table, TRADE.md); positive
		// earth makes the live post read negative to chassis. Ignition-on loads pull it a little lower.
		expect(byId.bat).toBeLessThan(-12.0);
		expect(byId.bat).toBeGreaterThan(-12.8);
		// The stabilized gauge supply averages about 10 V (common practice, TRADE.md).
		expect(Math.abs(byId['gauge-feed'])).toBeGreaterThan(9.5);
		expect(Math.abs(byId['gauge-feed'])).toBeLessThan(10.5);
	});

	it('answers 400 naming the terminal a part does not have', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/predict`, owner.cookie, { probes: [{ id: 'x', kind: 'volts', at: { part: 'battery', terminal: 'nope' } }] });
		expect(r.status).toBe(400);
		expect(r.body.issues.map((i: { path: string }) => i.path)).toContain('probes[0].at.terminal');
	});
});
