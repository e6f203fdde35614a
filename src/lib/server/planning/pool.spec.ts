// The planning threads: the same plan as in process, the server's own thread left free meanwhile,
// and the limits (time budget, heap) answered as 503s that say why.
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { DiagnoseError } from '../../circuit/diagnose';
import { demoHarness } from '../../circuit/demo';
import { defaultScenario } from '../../circuit/scenario';
import { basePlan, planDiagnosis, type PlanInputs, type ReadingJson } from '../../diagnosis/session';
import { OPEN_HUNT } from '../../diagnosis/demo';
import { ServiceUnavailable } from '../http';
import { basePlanned, closePlanning, readingsPlanned } from './pool';

const doc = demoHarness();
const inputs: PlanInputs = { scenario: defaultScenario(doc), marks: OPEN_HUNT.marks, meter: 'entry-dmm', uncertainty: null };

afterEach(() => {
	delete process.env.LOOM_PLAN_BUDGET_MS;
	delete process.env.LOOM_PLAN_HEAP_MB;
});
afterAll(() => closePlanning());

describe('planning threads', () => {
	it('make the same plan as the circuit core in process, before and after a reading', async () => {
		const here = basePlan(doc, inputs);
		const t0 = performance.now();
		const lag = monitorEventLoopDelay({ resolution: 10 });
		lag.enable();
		const there = await basePlanned(doc, inputs);
		lag.disable();
		const took = performance.now() - t0;
		expect(JSON.stringify(there)).toBe(JSON.stringify(here));
		// The solves ran elsewhere: the longest stall of this thread is a small part of the plan's time
		// (the copy of the answer across), where in process it would be all of it.
		expect(took).toBeGreaterThan(300);
		expect(lag.max / 1e6).toBeLessThan(took / 2);

		const battery = here.probes.find((p) => p.id.startsWith('volts:battery'))!;
		const readings: ReadingJson[] = [{ id: 1, clientId: 'a', probeId: battery.id, outcome: 'value', value: -12.4, unit: 'V', note: '', takenAt: new Date(0).toISOString(), takenBy: null, struck: false }];
		const afterHere = planDiagnosis(doc, inputs, readings, here);
		const afterThere = await readingsPlanned(doc, inputs, readings, there);
		expect(afterThere.used).toEqual({ [battery.id]: -12.4 });
		expect(JSON.stringify(afterThere.result.suspects)).toBe(JSON.stringify(afterHere.result.suspects));
	});

	it("pass the planner's field errors back as a DiagnoseError", async () => {
		const bad = basePlanned(doc, { ...inputs, marks: [{ part: 'no-such-part', mark: 'dead' }] });
		await expect(bad).rejects.toBeInstanceOf(DiagnoseError);
		await expect(bad).rejects.toMatchObject({ issues: [expect.objectContaining({ path: expect.stringMatching(/^marks/) })] });
	});

	it('stop a plan over its time budget with a 503 that says so', async () => {
		process.env.LOOM_PLAN_BUDGET_MS = '50';
		const err = await basePlanned(doc, inputs).catch((e) => e);
		expect(err).toBeInstanceOf(ServiceUnavailable);
		expect(err.message).toMatch(/took longer than/);
		expect(err.retryAfterSeconds).toBeGreaterThan(0);
		// The stopped thread is replaced: the next plan is made.
		delete process.env.LOOM_PLAN_BUDGET_MS;
		expect((await basePlanned(doc, inputs)).suspects.length).toBeGreaterThan(1);
	});

	it('say the region is too large when a plan outgrows its heap, instead of growing', async () => {
		await closePlanning();
		process.env.LOOM_PLAN_HEAP_MB = '16';
		const err = await basePlanned(doc, inputs).catch((e) => e);
		await closePlanning();
		expect(err).toBeInstanceOf(ServiceUnavailable);
		expect(err.message).toMatch(/too large to reason about at once/);
	});
});
