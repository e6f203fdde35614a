// The page's side of the plan worker: the latest request wins (a reading typed while the last
// plan is still being made supersedes it). Its plans carry every probe's full entry (view.ts). Falls back to planning on the page's thread where
// workers are not available.
import type { HarnessDocument } from '../circuit/schema';
import type { PlanReply, PlanRequest } from './plan.worker';
import { planDiagnosis, type PlanInputs, type ReadingJson } from './session';
import { planView, type PlanView } from './view';

const here = (m: Omit<PlanRequest, 'id'>): PlanView => planView(planDiagnosis(m.document, m.diagnosis, m.readings), 'all');

export class Planner {
	private worker: Worker | null = null;
	private nextId = 1;
	private waiting = new Map<number, { resolve: (p: PlanView) => void; reject: (e: Error) => void; message: Omit<PlanRequest, 'id'> }>();
	/** The worker could not start (its script did not load, say offline): plan on the page. */
	private broken = false;

	private start(): Worker | null {
		if (this.worker || this.broken || typeof Worker === 'undefined') return this.worker;
		this.worker = new Worker(new URL('./plan.worker.ts', import.meta.url), { type: 'module' });
		this.worker.onmessage = (event: MessageEvent<PlanReply>) => {
			const reply = event.data;
			const w = this.waiting.get(reply.id);
			if (!w) return;
			this.waiting.delete(reply.id);
			if ('error' in reply) w.reject(new Error(reply.error));
			else w.resolve(reply.plan);
		};
		this.worker.onerror = () => {
			this.broken = true;
			this.worker?.terminate();
			this.worker = null;
			for (const w of this.waiting.values()) {
				try {
					w.resolve(here(w.message));
				} catch (e) {
					w.reject(e instanceof Error ? e : new Error(String(e)));
				}
			}
			this.waiting.clear();
		};
		return this.worker;
	}

	/** Start the worker now, so planning works after the network goes (its script is loaded). */
	warm(): void {
		this.start();
	}

	plan(document: HarnessDocument, diagnosis: PlanInputs, readings: ReadingJson[]): Promise<PlanView> {
		const w = this.start();
		const inputs: PlanInputs = { scenario: diagnosis.scenario, marks: diagnosis.marks, meter: diagnosis.meter, uncertainty: diagnosis.uncertainty ?? null };
		const message: Omit<PlanRequest, 'id'> = JSON.parse(JSON.stringify({ document, diagnosis: inputs, readings }));
		if (!w) return Promise.resolve().then(() => here(message));
		const id = this.nextId++;
		return new Promise((resolve, reject) => {
			this.waiting.set(id, { resolve, reject, message });
			w.postMessage({ id, ...message } satisfies PlanRequest);
		});
	}

	stop(): void {
		this.worker?.terminate();
		this.worker = null;
		for (const w of this.waiting.values()) w.reject(new Error('The planner was stopped.'));
		this.waiting.clear();
	}
}
