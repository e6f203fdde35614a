// Keyboard shortcuts of the drawing board. One table drives both the key handling and the
// help sheet, so the sheet can never disagree with what the keys do.

export type EditorAction =
	| 'undo'
	| 'redo'
	| 'copy'
	| 'paste'
	| 'duplicate'
	| 'delete'
	| 'selectAll'
	| 'clearSelection'
	| 'fitView'
	| 'zoomIn'
	| 'zoomOut'
	| 'help';

export type Shortcut = {
	action: EditorAction;
	/** Key as in KeyboardEvent.key, compared case-insensitively. */
	key: string;
	/** Ctrl on Windows and Linux, Cmd on a Mac. */
	mod?: boolean;
	shift?: boolean;
	/** What the help sheet says. */
	description: string;
};

export const shortcuts: Shortcut[] = [
	{ action: 'undo', key: 'z', mod: true, description: 'Undo the last change' },
	{ action: 'redo', key: 'z', mod: true, shift: true, description: 'Redo' },
	{ action: 'redo', key: 'y', mod: true, description: 'Redo' },
	{ action: 'copy', key: 'c', mod: true, description: 'Copy the selected parts and the wires between them (to paste here, in another tab or another diagram)' },
	{ action: 'paste', key: 'v', mod: true, description: 'Paste copied parts as new parts (key numbers kept where free)' },
	{ action: 'duplicate', key: 'd', mod: true, description: 'Duplicate the selection' },
	{ action: 'delete', key: 'Delete', description: 'Delete the selection (asks first when wires go too)' },
	{ action: 'delete', key: 'Backspace', description: 'Delete the selection' },
	{ action: 'selectAll', key: 'a', mod: true, description: 'Select every part' },
	{ action: 'clearSelection', key: 'Escape', description: 'Clear the selection' },
	{ action: 'fitView', key: 'f', description: 'Show the whole drawing' },
	{ action: 'zoomIn', key: '+', description: 'Zoom in' },
	{ action: 'zoomIn', key: '=', description: 'Zoom in' },
	{ action: 'zoomOut', key: '-', description: 'Zoom out' },
	{ action: 'help', key: '?', description: 'Show this sheet' }
];

export type KeyLike = {
	key: string;
	ctrlKey?: boolean;
	metaKey?: boolean;
	shiftKey?: boolean;
	altKey?: boolean;
};

/** Keys that produce a character already shifted ("?", "+"): Shift is part of the character. */
const shiftedCharacters = new Set(['?', '+']);

/**
 * The action a key press asks for, or null.
 * @example actionFor({ key: 'z', ctrlKey: true }, false) // 'undo'
 */
export function actionFor(event: KeyLike, mac: boolean): EditorAction | null {
	if (event.altKey) return null;
	const mod = mac ? !!event.metaKey : !!event.ctrlKey;
	const key = event.key.length === 1 ? event.key.toLowerCase() : event.key;
	for (const s of shortcuts) {
		const sKey = s.key.length === 1 ? s.key.toLowerCase() : s.key;
		if (sKey !== key) continue;
		if (!!s.mod !== mod) continue;
		if (!shiftedCharacters.has(s.key) && !!s.shift !== !!event.shiftKey) continue;
		return s.action;
	}
	return null;
}

/** How a shortcut is written on the help sheet for this platform. */
export function keyLabel(s: Shortcut, mac: boolean): string {
	const parts: string[] = [];
	if (s.mod) parts.push(mac ? '⌘' : 'Ctrl');
	if (s.shift) parts.push('Shift');
	parts.push(s.key.length === 1 ? s.key.toUpperCase() : s.key === 'Escape' ? 'Esc' : s.key);
	return parts.join(mac ? '' : '+');
}

/** True when the key press is typing into a field and must be left to it. */
export function isTyping(target: EventTarget | null): boolean {
	if (!target || typeof (target as HTMLElement).tagName !== 'string') return false;
	const el = target as HTMLElement;
	const tag = el.tagName.toLowerCase();
	return tag === 'input' || tag === 'textarea' || tag === 'select' || el.isContentEditable === true;
}
