// The one document store of the drawing board. The canvas, the properties panel and both
// tables edit through `apply`, so every change lands in one undo history and one autosave.
import type { HarnessDocument } from '$lib/circuit/schema';
import type { Palette } from '$lib/circuit/colours';
import { History } from './history';
import { EditError, paletteOf } from './ops';

export type Selection = { parts: ReadonlySet<string>; wires: ReadonlySet<string> };
const none: Selection = { parts: new Set(), wires: new Set() };

export class HarnessStore {
	doc: HarnessDocument = $state.raw()!;
	palette: Palette = $derived(paletteOf(this.doc));
	/** What is selected, in the canvas and the tables alike. */
	selection: Selection = $state.raw(none);
	/** The last refused edit, shown until the next good one. */
	problem: { message: string; field?: string } | null = $state.raw(null);
	/** Bumped on every history change, so labels and buttons follow. */
	private version = $state(0);
	private history = new History<HarnessDocument>();
	private listeners = new Set<(doc: HarnessDocument) => void>();

	constructor(doc: HarnessDocument) {
		this.doc = doc;
	}

	/**
	 * Runs an edit; records it for undo when it changed anything. Returns false (and sets
	 * `problem`) when the edit was refused.
	 * @example store.apply('Move part 4', (d) => ops.moveParts(d, moves));
	 */
	apply(label: string, edit: (doc: HarnessDocument) => HarnessDocument, mergeKey?: string): boolean {
		let next: HarnessDocument;
		try {
			next = edit(this.doc);
		} catch (e) {
			if (e instanceof EditError) {
				this.problem = { message: e.message, field: e.field };
				return false;
			}
			throw e;
		}
		this.problem = null;
		if (next === this.doc) return true;
		this.history.record(this.doc, label, mergeKey);
		this.set(next);
		return true;
	}

	/** Replaces the whole document as one undoable step (loading someone else's save). */
	replace(doc: HarnessDocument, label: string): void {
		this.history.record(this.doc, label);
		this.set(doc);
	}

	undo(): void {
		const back = this.history.undo(this.doc);
		if (back) this.set(back);
	}

	redo(): void {
		const again = this.history.redo(this.doc);
		if (again) this.set(again);
	}

	/** Ends a run of merged edits (a field lost focus), so the next edit is its own step. */
	seal(): void {
		this.history.seal();
	}

	select(parts: Iterable<string> = [], wires: Iterable<string> = []): void {
		this.selection = { parts: new Set(parts), wires: new Set(wires) };
	}

	get canUndo(): boolean {
		void this.version;
		return this.history.canUndo;
	}
	get canRedo(): boolean {
		void this.version;
		return this.history.canRedo;
	}
	get undoLabel(): string | null {
		void this.version;
		return this.history.undoLabel;
	}
	get redoLabel(): string | null {
		void this.version;
		return this.history.redoLabel;
	}

	/** Called after every change of the document (autosave listens here). */
	onChange(listener: (doc: HarnessDocument) => void): () => void {
		this.listeners.add(listener);
		return () => this.listeners.delete(listener);
	}

	private set(doc: HarnessDocument) {
		this.doc = doc;
		this.version++;
		// Drop selected ids that no longer exist (after a delete or an undo of an add).
		const parts = new Set(doc.parts.map((p) => p.id));
		const wires = new Set(doc.wires.map((w) => w.id));
		const s = this.selection;
		if ([...s.parts].some((id) => !parts.has(id)) || [...s.wires].some((id) => !wires.has(id))) {
			this.selection = { parts: new Set([...s.parts].filter((id) => parts.has(id))), wires: new Set([...s.wires].filter((id) => wires.has(id))) };
		}
		for (const l of this.listeners) l(doc);
	}
}
