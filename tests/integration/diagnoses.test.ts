// Stored diagnoses over HTTP: started on a revision, readings stored once each however often
// they are sent, the plan walked to the planted fault with the readings the predict API gives,
// concluded, and the version and access checks.
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '../../src/lib/circuit/demo';
import { OPEN_HUNT } from '../../src/lib/diagnosis/demo';
import { api, baseUrl, signedInAccount, type SignedIn } from './helpers';

let owner: SignedIn;
let stranger: SignedIn;
let diagramId: string;
let vehicleId: string;

beforeAll(async () => {
	owner = await signedInAccount('Hunter');
	stranger = await signedInAccount('Passer-by');
	const v = await api('POST', '/api/vehicles', owner.cookie, { name: 'Hunt Ostrimmel', systemVoltage: 12, earthPolarity: 'positive' });
	vehicleId = v.body.vehicle.id;
	const d = await api('POST', '/api/diagrams', owner.cookie, { vehicleId, title: 'Complete harness', document: demoHarness() });
	diagramId = d.body.diagram.id;
});

/** A page as the server renders it, as text without tags (the words the restorer reads). */
async function pageText(path: string, cookie: string): Promise<string> {
	const res = await fetch(baseUrl() + path, { headers: { cookie, accept: 'text/html' } });
	expect(res.status).toBe(200);
	const html = await res.text();
	return html
		.replace(/<script[\s\S]*?<\/script>/g, '')
		.replace(/<[^>]+>/g, ' ')
		.replace(/&#39;|&rsquo;/g, '\u2019')
		.replace(/&amp;/g, '&')
		.replace(/\s+/g, ' ');
}

const reading = (probe: string, value: number | null, extra: Record<string, unknown> = {}) => ({
	clientId: crypto.randomUUID(),
	probe,
	outcome: value === null ? 'unreachable' : 'value',
	...(value === null ? {} : { value }),
	unit: 'V',
	takenAt: new Date().toISOString(),
	...extra
});

async function start(marks = OPEN_HUNT.marks) {
	const r = await api('POST', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie, { revision: 1, marks });
	expect(r.status, JSON.stringify(r.body)).toBe(201);
	return r.body as { diagnosis: { id: string; version: number; title: string; diagramRevision: number }; plan: { plan: { steps: { probe: string }[] }; suspects: { id: string }[] } };
}

describe('diagnoses', () => {
	it('starts on the revision the person sees, titled from the marks', async () => {
		const { diagnosis, plan } = await start();
		expect(diagnosis.diagramRevision).toBe(1);
		expect(diagnosis.title).toMatch(/Fuel gauge and .*Temperature gauge: reads low/i);
		expect(plan.plan.steps.length).toBeGreaterThan(0);
		const stale = await api('POST', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie, { revision: 7, marks: OPEN_HUNT.marks });
		expect(stale.status).toBe(400);
		expect(stale.body.issues[0].path).toBe('revision');
		const bad = await api('POST', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie, { revision: 1, marks: [{ part: 'nothing-here', mark: 'dead' }] });
		expect(bad.status).toBe(400);
		expect(bad.body.issues.map((i: { path: string }) => i.path)).toContain('marks[0].part');
	});

	it('stores each reading once, however often the queue is sent', async () => {
		const { diagnosis, plan } = await start();
		const first = plan.plan.steps[0].probe;
		const batch = [reading(first, -12.3), reading('volts:fuse-ign:in', null)];
		const a = await api('POST', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie, { readings: batch });
		expect(a.status, JSON.stringify(a.body)).toBe(200);
		expect([a.body.stored, a.body.already]).toEqual([2, 0]);
		// The same queue again, as after an answer lost on the way back: nothing new.
		const b = await api('POST', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie, { readings: batch });
		expect([b.body.stored, b.body.already]).toEqual([0, 2]);
		const list = await api('GET', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie);
		expect(list.body.readings).toHaveLength(2);
		expect(list.body.readings.find((r: { outcome: string }) => r.outcome === 'unreachable').value).toBeNull();
		// "Couldn't reach" takes the probe out of the plan.
		expect(b.body.plan.readings.unavailable).toContain('volts:fuse-ign:in');
	});

	it('names the reading and field that are wrong, and stores none of the batch', async () => {
		const { diagnosis, plan } = await start();
		const good = reading(plan.plan.steps[0].probe, -12.3);
		const r = await api('POST', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie, {
			readings: [good, reading('volts:nowhere:x', 1), reading(plan.plan.steps[0].probe, 3, { unit: 'Ω' }), { ...reading(plan.plan.steps[0].probe, 1), value: undefined }]
		});
		expect(r.status).toBe(400);
		const paths = r.body.issues.map((i: { path: string }) => i.path);
		expect(paths).toContain('readings[3].value');
		const again = await api('POST', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie, { readings: [good, reading('volts:nowhere:x', 1), reading(plan.plan.steps[0].probe, 3, { unit: 'Ω' })] });
		expect(again.body.issues.map((i: { path: string }) => i.path)).toEqual(['readings[1].probe', 'readings[2].unit']);
		expect((await api('GET', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie)).body.readings).toHaveLength(0);
	});

	it('follows the plan to the planted fault with the readings the predict API gives for it, then concludes', async () => {
		const { diagnosis } = await start();
		let state = (await api('GET', `/api/diagnoses/${diagnosis.id}`, owner.cookie)).body;
		let probes = 0;
		while (state.plan.plan.steps.length && probes < 10) {
			const probe = state.plan.plan.steps[0].probe;
			if (probe === 'joint:w-ign-fuse:to') {
				// A volt drop across a joint: the red lead on the terminal, the black lead on the wire
				// just behind its crimp, in the same words as the printed checklist (common practice).
				const page = await pageText(`/diagnoses/${diagnosis.id}`, owner.cookie);
				expect(page).toContain('Red lead 6 Fuse, ignition accessories, terminal in');
				expect(page).toContain('Black lead Black lead on wire W, just behind its crimp at terminal in');
				expect(page).not.toMatch(/Part 6, terminal in/);
				const checklist = await pageText(`/diagnoses/${diagnosis.id}/checklist`, owner.cookie);
				expect(checklist).toContain('Black lead Black lead on wire W, just behind its crimp at terminal in');
			}
			const predicted = await api('POST', `/api/diagrams/${diagramId}/predict`, owner.cookie, { planProbes: [probe], fault: OPEN_HUNT.plantedFault });
			expect(predicted.status, JSON.stringify(predicted.body)).toBe(200);
			const [{ reading: value, unit }] = predicted.body.readings;
			// Two decimals, as a 3½-digit meter shows it.
			const r = await api('POST', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie, { readings: [reading(probe, Math.round(value * 100) / 100, { unit })] });
			expect(r.status, JSON.stringify(r.body)).toBe(200);
			state = { ...state, plan: r.body.plan };
			probes++;
		}
		expect(state.plan.readings.remaining.map((x: { suspect: string }) => x.suspect)).toEqual([OPEN_HUNT.plantedSuspect]);
		// Fewer probes than suspects: the plan splits them, it does not check them one by one.
		expect(probes).toBeLessThan(state.plan.suspects.length / 2);

		const stale = await api('POST', `/api/diagnoses/${diagnosis.id}/conclude`, owner.cookie, { version: diagnosis.version + 5, foundSuspect: OPEN_HUNT.plantedSuspect });
		expect(stale.status).toBe(409);
		const wrong = await api('POST', `/api/diagnoses/${diagnosis.id}/conclude`, owner.cookie, { version: diagnosis.version, foundSuspect: 'not-a-suspect' });
		expect(wrong.body.issues[0].path).toBe('foundSuspect');
		const done = await api('POST', `/api/diagnoses/${diagnosis.id}/conclude`, owner.cookie, {
			version: diagnosis.version,
			foundSuspect: OPEN_HUNT.plantedSuspect,
			conclusion: 'Fuse clip cleaned.',
			partsReplaced: ['Fuse holder']
		});
		expect(done.status, JSON.stringify(done.body)).toBe(200);
		expect(done.body.diagnosis.status).toBe('concluded');
		expect(done.body.diagnosis.foundLabel).toContain('wire W (white) at terminal in of 6 (Fuse, ignition accessories)');
		expect(done.body.diagnosis.version).toBe(diagnosis.version + 1);

		// Concluded, the page is a record: what was found and replaced and the readings, no work asked.
		const page = await pageText(`/diagnoses/${diagnosis.id}`, owner.cookie);
		expect(page).toContain('Fuse clip cleaned.');
		expect(page).toMatch(/Replaced: Fuse holder/);
		expect(page).toContain('Readings taken');
		expect(page).toContain('The readings pointed to');
		for (const asked of ['Inspect or repair it', 'conclude below', 'To make sure', 'take one more probe', 'Strike', 'Save reading', 'Take a different probe']) expect(page).not.toContain(asked);

		// The checklist names the one suspect left, and has no empty settings heading (no steps left).
		const checklist = await pageText(`/diagnoses/${diagnosis.id}/checklist`, owner.cookie);
		expect(checklist).toContain(`One suspect left: ${done.body.diagnosis.foundLabel}.`);
		expect(checklist).not.toContain('Settings used');
	});

	it('strikes a reading: kept in the record, left out of the plan', async () => {
		const { diagnosis, plan } = await start();
		const probe = plan.plan.steps[0].probe;
		const r = await api('POST', `/api/diagnoses/${diagnosis.id}/readings`, owner.cookie, { readings: [reading(probe, -6.85)] });
		expect(r.body.plan.readings.remaining.length).toBeLessThan(plan.suspects.length);
		const id = r.body.readings[0].id;
		const struck = await api('DELETE', `/api/diagnoses/${diagnosis.id}/readings/${id}`, owner.cookie);
		expect(struck.status).toBe(200);
		expect(struck.body.readings[0].struck).toBe(true);
		const after = await api('GET', `/api/diagnoses/${diagnosis.id}`, owner.cookie);
		expect(after.body.plan.readings).toBeUndefined();
		expect(after.body.plan.suspects.length).toBe(plan.suspects.length);
		expect((await api('DELETE', `/api/diagnoses/${diagnosis.id}/readings/999999`, owner.cookie)).status).toBe(404);
	});

	it('is not there for another account, and asks to sign in without one', async () => {
		const { diagnosis } = await start();
		expect((await api('GET', `/api/diagnoses/${diagnosis.id}`, stranger.cookie)).status).toBe(404);
		expect((await api('GET', `/api/diagnoses/${diagnosis.id}`, null)).status).toBe(401);
		expect((await api('GET', `/api/diagnoses/not-a-uuid`, owner.cookie)).status).toBe(404);
	});
});
