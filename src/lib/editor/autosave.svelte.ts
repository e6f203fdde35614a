// Autosave: a short pause after the last edit, then PUT /api/diagrams/:id with the revision the
// edits were made on. A stale revision answers 409 and nothing is overwritten: saving stops,
// the local edits stay on screen, and the person chooses to load the other save or keep theirs
// as a new diagram. Network trouble retries with a growing delay.
import { api, type ApiResult } from '$lib/api';
import { parseDocument, type HarnessDocument } from '$lib/circuit/schema';

export type SaveState = 'saved' | 'waiting' | 'saving' | 'conflict' | 'retrying' | 'refused';

type DiagramBody = { diagram: { id: string; revision: number; title: string; vehicleId: string; document?: unknown; updatedAt?: string } };

export type SaveClient = {
	put: (path: string, body: unknown) => Promise<ApiResult<DiagramBody>>;
	get: (path: string) => Promise<ApiResult<DiagramBody>>;
	post: (path: string, body: unknown) => Promise<ApiResult<DiagramBody>>;
};

const defaultClient: SaveClient = {
	put: (p, b) => api.put<DiagramBody>(p, b),
	get: (p) => api.get<DiagramBody>(p),
	post: (p, b) => api.post<DiagramBody>(p, b)
};

export type AutosaveOptions = {
	diagramId: string;
	revision: number;
	/** The document as last saved (what the server has). */
	saved: HarnessDocument;
	/** Reads the current document. */
	current: () => HarnessDocument;
	delayMs?: number;
	client?: SaveClient;
};

export class Autosave {
	state: SaveState = $state('saved');
	/** Plain words for the indicator and for screen readers. */
	message = $state('All changes saved');
	revision = $state(0);
	savedAt: Date | null = $state(null);
	/** Set on a 409: the revision someone else saved. */
	conflict: { theirRevision: number } | null = $state.raw(null);

	private saved: HarnessDocument;
	private timer: ReturnType<typeof setTimeout> | null = null;
	private inFlight: Promise<void> | null = null;
	private again = false;
	private failures = 0;
	private readonly o: Required<Omit<AutosaveOptions, 'client'>> & { client: SaveClient };

	constructor(options: AutosaveOptions) {
		this.o = { delayMs: 1500, client: defaultClient, ...options };
		this.revision = options.revision;
		this.saved = options.saved;
	}

	get path(): string {
		return `/api/diagrams/${this.o.diagramId}`;
	}

	/** True when what is on screen is not yet on the server. */
	get unsaved(): boolean {
		return this.o.current() !== this.saved;
	}

	/** The document changed: save after a pause (not while a conflict waits for a choice). */
	changed(): void {
		if (this.state === 'conflict') return;
		if (!this.unsaved) {
			this.clearTimer();
			if (!this.inFlight) this.set('saved', 'All changes saved');
			return;
		}
		this.set('waiting', 'Unsaved changes');
		this.schedule(this.o.delayMs);
	}

	/** Saves now (leaving the page, pressing the save-status button). */
	async flush(): Promise<void> {
		this.clearTimer();
		if (this.inFlight) {
			this.again = true;
			await this.inFlight;
			return;
		}
		await this.save();
	}

	private schedule(ms: number) {
		this.clearTimer();
		this.timer = setTimeout(() => {
			this.timer = null;
			void this.flush();
		}, ms);
	}

	private clearTimer() {
		if (this.timer) clearTimeout(this.timer);
		this.timer = null;
	}

	private set(state: SaveState, message: string) {
		this.state = state;
		this.message = message;
	}

	private save(): Promise<void> {
		if (this.state === 'conflict') return Promise.resolve();
		const doc = this.o.current();
		if (doc === this.saved) {
			this.set('saved', 'All changes saved');
			return Promise.resolve();
		}
		const checked = parseDocument(JSON.parse(JSON.stringify(doc)));
		if (!checked.ok) {
			const first = checked.errors[0];
			this.set('refused', `Not saved: ${first.path}: ${first.message}`);
			return Promise.resolve();
		}
		this.set('saving', 'Saving…');
		const run = async () => {
			const r = await this.o.client.put(this.path, { revision: this.revision, document: doc });
			if (r.ok) {
				this.failures = 0;
				this.revision = r.data.diagram.revision;
				this.saved = doc;
				this.savedAt = new Date();
				this.set('saved', `Saved as revision ${this.revision}`);
			} else if (r.status === 409) {
				const theirs = typeof r.body.revision === 'number' ? r.body.revision : this.revision + 1;
				this.conflict = { theirRevision: theirs };
				this.set('conflict', `Someone else saved this diagram (revision ${theirs}). Your changes are kept here, not saved.`);
			} else if (r.status === 0 || r.status >= 500) {
				this.failures++;
				const wait = Math.min(30_000, 2_000 * 2 ** (this.failures - 1));
				this.set('retrying', `Not saved yet: ${r.error} Trying again in ${Math.round(wait / 1000)} s.`);
				this.schedule(wait);
			} else {
				const where = r.issues[0] ? ` (${r.issues[0].path}: ${r.issues[0].message})` : '';
				this.set('refused', `Not saved: ${r.error}${where}`);
			}
		};
		this.inFlight = run().finally(() => {
			this.inFlight = null;
			if (this.again || (this.state === 'saved' && this.unsaved)) {
				this.again = false;
				if (this.state === 'saved' || this.state === 'waiting') this.schedule(0);
			}
		});
		return this.inFlight;
	}

	/** Fetches the other save. The caller shows it (undoably) and calls `adopted`. */
	async fetchTheirs(): Promise<{ ok: true; document: unknown; revision: number } | { ok: false; error: string }> {
		const r = await this.o.client.get(this.path);
		if (!r.ok) return { ok: false, error: r.error };
		return { ok: true, document: r.data.diagram.document, revision: r.data.diagram.revision };
	}

	/** The other save is now on screen: saving resumes from its revision. */
	adopted(doc: HarnessDocument, revision: number): void {
		this.saved = doc;
		this.revision = revision;
		this.conflict = null;
		this.set('saved', `Showing revision ${revision}, saved elsewhere`);
	}

	/** Saves the local document as a new diagram of the same vehicle; returns its id. */
	async keepAsCopy(vehicleId: string, title: string): Promise<{ ok: true; id: string } | { ok: false; error: string }> {
		const r = await this.o.client.post('/api/diagrams', { vehicleId, title, document: this.o.current() });
		if (!r.ok) return { ok: false, error: r.issues[0] ? `${r.error} ${r.issues[0].path}: ${r.issues[0].message}` : r.error };
		return { ok: true, id: r.data.diagram.id };
	}

	dispose(): void {
		this.clearTimer();
	}
}
