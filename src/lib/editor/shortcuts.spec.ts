import { describe, expect, it } from 'vitest';
import { actionFor, isTyping, keyLabel, shortcuts } from './shortcuts';

// Expected keys are the platform conventions for editing (Ctrl+Z/Ctrl+Y on Windows and
// Linux, Cmd+Z/Cmd+Shift+Z on a Mac; common practice).
describe('actionFor', () => {
	it.each([
		{ event: { key: 'z', ctrlKey: true }, mac: false, action: 'undo' },
		{ event: { key: 'Z', ctrlKey: true, shiftKey: true }, mac: false, action: 'redo' },
		{ event: { key: 'y', ctrlKey: true }, mac: false, action: 'redo' },
		{ event: { key: 'z', metaKey: true }, mac: true, action: 'undo' },
		{ event: { key: 'z', ctrlKey: true }, mac: true, action: null },
		{ event: { key: 'c', ctrlKey: true }, mac: false, action: 'copy' },
		{ event: { key: 'v', ctrlKey: true }, mac: false, action: 'paste' },
		{ event: { key: 'Delete' }, mac: false, action: 'delete' },
		{ event: { key: 'Backspace' }, mac: true, action: 'delete' },
		{ event: { key: '?', shiftKey: true }, mac: false, action: 'help' },
		{ event: { key: '+', shiftKey: true }, mac: false, action: 'zoomIn' },
		{ event: { key: 'f' }, mac: false, action: 'fitView' },
		{ event: { key: 'f', ctrlKey: true }, mac: false, action: null },
		{ event: { key: 'z', ctrlKey: true, altKey: true }, mac: false, action: null },
		{ event: { key: 'q' }, mac: false, action: null }
	])('$event.key (mac $mac) → $action', ({ event, mac, action }) => {
		expect(actionFor(event, mac)).toBe(action);
	});

	it('has a description for every shortcut', () => {
		for (const s of shortcuts) expect(s.description.length).toBeGreaterThan(3);
	});
});

describe('keyLabel and isTyping', () => {
	it('writes keys for each platform', () => {
		const redo = shortcuts.find((s) => s.action === 'redo' && s.shift)!;
		expect(keyLabel(redo, false)).toBe('Ctrl+Shift+Z');
		expect(keyLabel(redo, true)).toBe('⌘ShiftZ');
		expect(keyLabel(shortcuts.find((s) => s.action === 'clearSelection')!, false)).toBe('Esc');
	});
	it('knows fields from other targets', () => {
		expect(isTyping({ tagName: 'INPUT' } as unknown as EventTarget)).toBe(true);
		expect(isTyping({ tagName: 'DIV', isContentEditable: false } as unknown as EventTarget)).toBe(false);
		expect(isTyping(null)).toBe(false);
	});
});
