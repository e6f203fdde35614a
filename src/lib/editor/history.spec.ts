import { describe, expect, it } from 'vitest';
import { History } from './history';

// Expected behaviour worked by hand: a sequence of edits 0 → 1 → 2 must come back in reverse
// order on undo and forward again on redo; a new edit after an undo drops the redo branch
// (the usual linear undo model of text editors, common practice).
describe('History', () => {
	it('undoes and redoes in order', () => {
		const h = new History<number>();
		let doc = 0;
		h.record(doc, 'one', undefined, 0);
		doc = 1;
		h.record(doc, 'two', undefined, 10_000);
		doc = 2;
		expect(h.undoLabel).toBe('two');
		doc = h.undo(doc)!;
		expect(doc).toBe(1);
		doc = h.undo(doc)!;
		expect(doc).toBe(0);
		expect(h.undo(doc)).toBeNull();
		expect(h.redoLabel).toBe('one');
		doc = h.redo(doc)!;
		expect(doc).toBe(1);
		doc = h.redo(doc)!;
		expect(doc).toBe(2);
		expect(h.redo(doc)).toBeNull();
	});

	it('drops the redo branch on a new edit', () => {
		const h = new History<string>();
		h.record('a', 'edit', undefined, 0);
		const back = h.undo('b');
		expect(back).toBe('a');
		h.record('a', 'other', undefined, 5_000);
		expect(h.canRedo).toBe(false);
		expect(h.undo('c')).toBe('a');
	});

	it.each([
		{ gap: 300, steps: 1, note: 'typing within the window folds into one step' },
		{ gap: 5_000, steps: 3, note: 'pauses longer than the window make separate steps' }
	])('merges edits with the same key: $note', ({ gap, steps }) => {
		const h = new History<string>({ mergeWindowMs: 1200 });
		h.record('', 'Label', 'label:p1', 0);
		h.record('L', 'Label', 'label:p1', gap);
		h.record('La', 'Label', 'label:p1', 2 * gap);
		expect(h.depth.undo).toBe(steps);
		// Undoing everything always returns to the empty label.
		let doc = 'Lam';
		for (let i = 0; i < steps; i++) doc = h.undo(doc)!;
		expect(doc).toBe('');
	});

	it('seal stops merging', () => {
		const h = new History<string>();
		h.record('', 'Label', 'k', 0);
		h.seal();
		h.record('x', 'Label', 'k', 10);
		expect(h.depth.undo).toBe(2);
	});

	it('keeps at most limit steps', () => {
		const h = new History<number>({ limit: 3 });
		for (let i = 0; i < 10; i++) h.record(i, `e${i}`, undefined, i * 10_000);
		expect(h.depth.undo).toBe(3);
		let doc = 10;
		doc = h.undo(doc)!;
		doc = h.undo(doc)!;
		doc = h.undo(doc)!;
		expect(doc).toBe(7);
		expect(h.canUndo).toBe(false);
	});
});
