// The drawing board's manual pages: the list from the API, which page is traced, and its
// tracing settings. Settings change on screen at once and are saved shortly after (one PATCH
// per pause), so a slider drag is not a request per pixel.
import { getContext, setContext } from 'svelte';
import { api } from '$lib/api';
import { PAGE_LIMIT_TEXT, pageProblem } from '$lib/harness-io/images';

export type Tracing = { opacity: number; scale: number; offsetX: number; offsetY: number; locked: boolean };
export type ManualPage = {
	id: string;
	contentType: string;
	byteSize: number;
	originalName: string;
	pageOrder: number;
	tracing: Tracing;
	url: string;
};

export class ManualPages {
	pages: ManualPage[] = $state([]);
	activeId: string | null = $state(null);
	/** Whether the active page is drawn under the canvas. */
	shown = $state(true);
	busy = $state(false);
	error: string | null = $state(null);
	readonly limit = PAGE_LIMIT_TEXT;
	private timers = new Map<string, ReturnType<typeof setTimeout>>();

	constructor(
		readonly diagramId: string,
		readonly editable: boolean
	) {}

	get active(): ManualPage | null {
		return this.pages.find((p) => p.id === this.activeId) ?? null;
	}

	async load(): Promise<void> {
		const r = await api.get<{ pages: ManualPage[] }>(`/api/diagrams/${this.diagramId}/pages`);
		if (!r.ok) {
			this.error = r.error;
			return;
		}
		this.pages = r.data.pages;
		if (!this.active) this.activeId = this.pages[0]?.id ?? null;
	}

	async upload(file: File): Promise<boolean> {
		this.error = null;
		const problem = pageProblem(new Uint8Array(await file.slice(0, 16).arrayBuffer()));
		if (file.size > 15 * 1024 * 1024) this.error = `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; a page can be at most ${PAGE_LIMIT_TEXT}.`;
		else if (problem && !/at most/.test(problem)) this.error = `${file.name}: ${problem}`;
		if (this.error) return false;
		this.busy = true;
		try {
			const form = new FormData();
			form.append('file', file);
			const res = await fetch(`/api/diagrams/${this.diagramId}/pages`, { method: 'POST', body: form, headers: { accept: 'application/json' } });
			const body = await res.json().catch(() => ({}));
			if (!res.ok) {
				this.error = typeof body.error === 'string' ? body.error : `The upload failed (${res.status}).`;
				return false;
			}
			this.pages = [...this.pages, body.page as ManualPage];
			this.activeId = (body.page as ManualPage).id;
			this.shown = true;
			return true;
		} catch {
			this.error = 'Could not reach Loomwright. Check the connection and try again.';
			return false;
		} finally {
			this.busy = false;
		}
	}

	/** Changes a page's tracing settings now; saves them after a short pause. */
	setTracing(id: string, patch: Partial<Tracing>): void {
		this.pages = this.pages.map((p) => (p.id === id ? { ...p, tracing: { ...p.tracing, ...patch } } : p));
		if (!this.editable) return;
		clearTimeout(this.timers.get(id));
		this.timers.set(
			id,
			setTimeout(async () => {
				this.timers.delete(id);
				const page = this.pages.find((p) => p.id === id);
				if (!page) return;
				const r = await api.patch(`/api/diagrams/${this.diagramId}/pages/${id}`, page.tracing);
				if (!r.ok) this.error = r.issues.length ? `${r.error} ${r.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}` : r.error;
			}, 400)
		);
	}

	async remove(id: string): Promise<void> {
		clearTimeout(this.timers.get(id));
		const r = await api.delete(`/api/diagrams/${this.diagramId}/pages/${id}`);
		if (!r.ok) {
			this.error = r.error;
			return;
		}
		this.pages = this.pages.filter((p) => p.id !== id);
		if (this.activeId === id) this.activeId = this.pages[0]?.id ?? null;
	}

	/** Sends settings still waiting for their pause (the drawing board is closing). */
	dispose(): void {
		for (const [id, t] of this.timers) {
			clearTimeout(t);
			const page = this.pages.find((p) => p.id === id);
			if (page) void api.patch(`/api/diagrams/${this.diagramId}/pages/${id}`, page.tracing);
		}
		this.timers.clear();
	}
}

const CONTEXT = Symbol('manual-pages');

/** Makes the pages available to the canvas, which draws the active one under the drawing. */
export function setPagesContext(pages: ManualPages): ManualPages {
	setContext(CONTEXT, pages);
	return pages;
}

export function pagesContext(): ManualPages | undefined {
	return getContext<ManualPages | undefined>(CONTEXT);
}
