// The diagnosis page's state: the stored diagnosis and its readings, the readings queued while
// offline, and the plan made from all of them in the browser (so the suspects narrow and the
// plan re-plans without a network, and every probe's full entry is at hand). Readings go to the server through the API; a queued one is
// sent again until the server has it, and the server stores each clientId once.
import { api } from '$lib/api';
import type { Scenario } from '$lib/circuit/scenario';
import type { HarnessDocument } from '$lib/circuit/schema';
import type { Uncertainty } from '$lib/circuit/uncertainty';
import { Planner } from './planner';
import { mergeReadings, ReadingQueue, type KeyValueStore } from './queue';
import type { DiagnosisJson, ReadingJson, ReadingOutcome } from './session';
import type { PlanView } from './view';

type ReadingsReply = { stored: number; already: number; readings: ReadingJson[]; plan: PlanView };

/** Which readings a plan was made from: the same clientIds, struck or not, give the same plan. */
const readingsKey = (list: readonly ReadingJson[]) => list.map((x) => `${x.clientId}:${x.struck ? 1 : 0}`).sort().join(',');

export interface HuntInit {
	diagnosis: DiagnosisJson;
	document: HarnessDocument;
	readings: ReadingJson[];
	plan: PlanView;
	canEdit: boolean;
	store?: KeyValueStore;
}

export class Hunt {
	diagnosis: DiagnosisJson = $state.raw() as DiagnosisJson;
	readonly document: HarnessDocument;
	readonly canEdit: boolean;
	/** Readings the server has. */
	stored: ReadingJson[] = $state.raw([]);
	/** Readings typed here and not yet on the server. */
	queued: ReadingJson[] = $state.raw([]);
	plan: PlanView = $state.raw() as PlanView;
	planning = $state(false);
	online = $state(true);
	syncing = $state(false);
	/** A message about the last thing that went wrong (shown beside the reading entry). */
	problem: string | null = $state(null);
	/** Readings the server refused, with why (they leave the queue; the person can enter them again). */
	refused: { reading: ReadingJson; message: string }[] = $state.raw([]);

	readonly all: ReadingJson[] = $derived(mergeReadings(this.stored, this.queued));

	private readonly queue: ReadingQueue | null;
	private readonly planner = new Planner();
	private planAsked = 0;
	/** The readings the shown plan was made here from (null: it came from the server). */
	private plannedFor: string | null = null;

	constructor(init: HuntInit) {
		this.diagnosis = init.diagnosis;
		this.document = init.document;
		this.canEdit = init.canEdit;
		this.stored = init.readings;
		this.plan = init.plan;
		const store = init.store ?? (typeof localStorage !== 'undefined' ? localStorage : null);
		this.queue = store ? new ReadingQueue(init.diagnosis.id, store) : null;
		this.queued = this.queue?.list() ?? [];
	}

	/** On the page: warm the planner, plan with any queued readings, send them. */
	start(): () => void {
		this.planner.warm();
		this.online = navigator.onLine;
		const on = () => {
			this.online = true;
			void this.sync();
		};
		const off = () => (this.online = false);
		window.addEventListener('online', on);
		window.addEventListener('offline', off);
		// Not every network coming back says so: try the queue again now and then; and fetch the
		// readings someone else may be taking on another phone.
		const retry = setInterval(() => {
			void this.sync();
			if (document.visibilityState === 'visible') void this.refresh();
		}, 15_000);
		// The page came with the plan as the server made it (every probe by name, the next one in
		// full); plan here too, quietly, which gives every probe's full entry for a probe chosen out of the plan.
		void this.replan(!this.queued.length);
		void this.refresh();
		if (this.queued.length) void this.sync();
		this.keepForOffline();
		return () => {
			window.removeEventListener('online', on);
			window.removeEventListener('offline', off);
			clearInterval(retry);
			this.planner.stop();
		};
	}

	/** Ask the service worker to keep this diagnosis, its data and its checklist for use offline. */
	private keepForOffline(): void {
		const id = this.diagnosis.id;
		navigator.serviceWorker?.ready
			.then((registration) => registration.active?.postMessage({ type: 'keep', urls: [`/diagnoses/${id}`, `/diagnoses/${id}/checklist`, `/api/diagnoses/${id}`] }))
			.catch(() => undefined);
	}

	/** A reading off the meter: queued at once (survives a reload), planned on, then sent. */
	async take(probe: string, outcome: ReadingOutcome, value: number | null, unit: string, note = ''): Promise<void> {
		const reading: ReadingJson = { clientId: crypto.randomUUID(), probeId: probe, outcome, value: outcome === 'value' ? value : null, unit, note, takenAt: new Date().toISOString(), queued: true };
		this.queued = this.queue ? this.queue.add(reading) : [...this.queued, reading];
		this.problem = null;
		await this.replan();
		await this.sync();
	}

	/** Plans from the readings here; `quiet`: the same readings as the plan shown, so nothing to say "planning again" about. */
	private async replan(quiet = false): Promise<void> {
		const asked = ++this.planAsked;
		const key = readingsKey(this.all);
		this.planning = !quiet;
		try {
			const plan = await this.planner.plan(this.document, this.diagnosis, this.all);
			if (asked === this.planAsked) {
				this.plan = plan;
				this.plannedFor = key;
			}
		} catch (e) {
			if (asked === this.planAsked) this.problem = `Could not plan again: ${e instanceof Error ? e.message : String(e)}`;
		} finally {
			if (asked === this.planAsked) this.planning = false;
		}
	}

	/** The readings on the server (another phone may have added some); plans again when they changed. */
	async refresh(): Promise<void> {
		if (this.syncing) return;
		const r = await api.get<{ readings: ReadingJson[] }>(`/api/diagnoses/${this.diagnosis.id}/readings`);
		if (!r.ok) {
			if (r.status === 0) this.online = false;
			return;
		}
		this.online = true;
		if (readingsKey(r.data.readings) === readingsKey(this.stored)) return;
		this.stored = r.data.readings;
		await this.replan();
	}

	/** Sends the queue; keeps it when the network is gone, drops what the server refuses for good. */
	async sync(): Promise<void> {
		if (this.syncing || !this.queued.length) return;
		this.syncing = true;
		try {
			while (this.queued.length) {
				const batch = this.queued;
				const r = await api.post<ReadingsReply>(`/api/diagnoses/${this.diagnosis.id}/readings`, {
					readings: batch.map((x) => ({ clientId: x.clientId, probe: x.probeId, outcome: x.outcome, value: x.value, unit: x.unit, note: x.note, takenAt: x.takenAt }))
				});
				if (r.ok) {
					this.online = true;
					this.stored = r.data.readings;
					this.queued = this.queue ? this.queue.remove(batch.map((x) => x.clientId)) : this.queued.filter((x) => !batch.includes(x));
					// The server's plan names the probes only: plan here (unless already planned from these
					// very readings), which keeps every probe's full entry.
					if (!this.queued.length && readingsKey(this.all) !== this.plannedFor) await this.replan();
					continue;
				}
				if (r.status === 0 || r.status >= 500) {
					// No network (or the server is down): keep the queue, try again when back.
					this.online = r.status !== 0 ? this.online : false;
					this.problem = r.status === 0 ? null : r.error;
					return;
				}
				if (r.status === 400 && r.issues.length) {
					const bad = new Map<number, string>();
					for (const i of r.issues) {
						const m = /^readings\[(\d+)\]/.exec(i.path);
						if (m) bad.set(Number(m[1]), i.message);
					}
					if (bad.size) {
						this.refused = [...this.refused, ...[...bad].map(([i, message]) => ({ reading: batch[i], message }))];
						this.queued = this.queue ? this.queue.remove([...bad.keys()].map((i) => batch[i].clientId)) : this.queued.filter((_, i) => !bad.has(i));
						await this.replan();
						continue;
					}
				}
				// Signed out, no longer allowed, or gone: keep the queue and say so.
				this.problem = `${r.error} The readings stay on this device until they can be sent.`;
				return;
			}
		} finally {
			this.syncing = false;
		}
	}

	async strike(reading: ReadingJson): Promise<void> {
		if (reading.queued || reading.id === undefined) {
			this.queued = this.queue ? this.queue.remove([reading.clientId]) : this.queued.filter((x) => x.clientId !== reading.clientId);
			await this.replan();
			return;
		}
		const r = await api.delete<{ readings: ReadingJson[] }>(`/api/diagnoses/${this.diagnosis.id}/readings/${reading.id}`);
		if (!r.ok) {
			this.problem = r.status === 0 ? 'Striking a reading needs the network; try again when it is back.' : r.error;
			return;
		}
		this.stored = r.data.readings;
		await this.replan();
	}

	async conclude(input: { foundSuspect: string | null; conclusion: string; partsReplaced: string[] }): Promise<{ ok: true } | { ok: false; error: string; issues: { path: string; message: string }[] }> {
		const r = await api.post<{ diagnosis: DiagnosisJson }>(`/api/diagnoses/${this.diagnosis.id}/conclude`, { version: this.diagnosis.version, ...input });
		if (!r.ok) return { ok: false, error: r.status === 0 ? 'Concluding needs the network; your readings are kept. Try again when it is back.' : r.error, issues: r.issues };
		this.diagnosis = r.data.diagnosis;
		return { ok: true };
	}

	/**
	 * New ranges for what the drawing cannot know (and the known senders' positions), stored under
	 * the version check, then planned again here. A stale version (409) stores nothing; the message
	 * comes back for the form to keep showing beside the person's own values.
	 */
	async setRanges(uncertainty: Uncertainty | null, scenario: Scenario | null): Promise<{ ok: true } | { ok: false; error: string; issues: { path: string; message: string }[]; stale: boolean }> {
		const r = await api.patch<{ diagnosis: DiagnosisJson; plan: PlanView }>(`/api/diagnoses/${this.diagnosis.id}`, { version: this.diagnosis.version, uncertainty, ...(scenario ? { scenario } : {}) });
		if (!r.ok) return { ok: false, error: r.status === 0 ? 'Changing the ranges needs the network; nothing was changed. Try again when it is back.' : r.error, issues: r.issues, stale: r.status === 409 };
		this.diagnosis = r.data.diagnosis;
		await this.replan();
		return { ok: true };
	}

	async reopen(): Promise<string | null> {
		const r = await api.patch<{ diagnosis: DiagnosisJson; plan: PlanView }>(`/api/diagnoses/${this.diagnosis.id}`, { version: this.diagnosis.version, status: 'open' });
		if (!r.ok) return r.error;
		this.diagnosis = r.data.diagnosis;
		return null;
	}
}
