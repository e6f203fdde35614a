// Undo/redo over whole-document snapshots. The document is immutable (every edit returns a new
// object sharing unchanged parts), so a snapshot costs only the changed spine, and one history
// covers the canvas, the properties panel and the tables alike.

export type HistoryEntry<T> = {
	/** The document as it was before the edit. */
	before: T;
	/** What the edit was, for "Undo move part 12". */
	label: string;
	/** Edits with the same key, made one right after another, fold into one step (typing a label). */
	mergeKey?: string;
	at: number;
};

export type HistoryOptions = {
	/** Steps kept; older ones fall off. */
	limit?: number;
	/** Edits with the same merge key within this many milliseconds fold into one step. */
	mergeWindowMs?: number;
};

export class History<T> {
	private past: HistoryEntry<T>[] = [];
	private future: HistoryEntry<T>[] = [];
	private readonly limit: number;
	private readonly mergeWindowMs: number;

	constructor(options: HistoryOptions = {}) {
		this.limit = options.limit ?? 300;
		this.mergeWindowMs = options.mergeWindowMs ?? 1200;
		if (this.limit < 1) throw new Error('History: limit must be at least 1');
	}

	/**
	 * Record that the document was `before` and has just been changed by an edit.
	 * @example history.record(doc, 'Move part 12'); doc = moved;
	 */
	record(before: T, label: string, mergeKey?: string, now = Date.now()): void {
		const last = this.past[this.past.length - 1];
		this.future = [];
		if (mergeKey && last && last.mergeKey === mergeKey && now - last.at <= this.mergeWindowMs) {
			// Keep the oldest `before`: undo goes back past the whole burst of typing.
			last.at = now;
			return;
		}
		this.past.push({ before, label, mergeKey, at: now });
		if (this.past.length > this.limit) this.past.splice(0, this.past.length - this.limit);
	}

	/** Returns the document to show after undoing, or null when there is nothing to undo. */
	undo(current: T): T | null {
		const entry = this.past.pop();
		if (!entry) return null;
		this.future.push({ ...entry, before: current });
		return entry.before;
	}

	/** Returns the document to show after redoing, or null when there is nothing to redo. */
	redo(current: T): T | null {
		const entry = this.future.pop();
		if (!entry) return null;
		this.past.push({ ...entry, before: current, mergeKey: undefined });
		return entry.before;
	}

	/** Stops the last step from absorbing the next edit (a field lost focus). */
	seal(): void {
		const last = this.past[this.past.length - 1];
		if (last) last.mergeKey = undefined;
	}

	clear(): void {
		this.past = [];
		this.future = [];
	}

	get canUndo(): boolean {
		return this.past.length > 0;
	}
	get canRedo(): boolean {
		return this.future.length > 0;
	}
	get undoLabel(): string | null {
		return this.past[this.past.length - 1]?.label ?? null;
	}
	get redoLabel(): string | null {
		return this.future[this.future.length - 1]?.label ?? null;
	}
	get depth(): { undo: number; redo: number } {
		return { undo: this.past.length, redo: this.future.length };
	}
}
