// Copied parts as text, so they can be pasted into another tab or another diagram: a JSON
// object with a marker saying it is Loomwright's, the parts, the wires among them, and the
// palette their codes are written in (the diagram pasted into may use another). The same text
// goes to the system clipboard and to localStorage (for a paste that gets no clipboard access).
import { z } from 'zod';
import { PaletteSchema, type Palette } from '$lib/circuit/colours';
import { PartSchema, WireSchema, formatPath } from '$lib/circuit/schema';
import type { Clipboard } from './ops';

export const CLIP_MARKER = 'loomwright/parts';
export const CLIP_VERSION = 1;
/** Where the last copy is kept for other tabs of the same browser. */
export const CLIP_STORAGE_KEY = 'loomwright.clipboard';

const ClipSchema = z.object({
	loomwright: z.literal(CLIP_MARKER),
	version: z.literal(CLIP_VERSION),
	/** The diagram it was copied from: a paste there offsets the copy, elsewhere it lands in view. */
	diagramId: z.string().optional(),
	palette: PaletteSchema,
	parts: z.array(PartSchema).min(1).max(5000),
	wires: z.array(WireSchema).max(20000)
});

export type CopiedParts = { clip: Clipboard; palette: Palette; diagramId?: string };

export function writeClip({ clip, palette, diagramId }: CopiedParts): string {
	return JSON.stringify({ loomwright: CLIP_MARKER, version: CLIP_VERSION, diagramId, palette, parts: clip.parts, wires: clip.wires });
}

/**
 * Reads copied parts back. `null` when the text is not Loomwright's at all (someone copied
 * other text: not an error); an error naming the path when it claims to be but is damaged.
 * @example readClip('hello') // null
 */
export function readClip(text: string): { ok: true; copied: CopiedParts } | { ok: false; error: string } | null {
	let raw: unknown;
	try {
		raw = JSON.parse(text);
	} catch {
		return null;
	}
	if (!raw || typeof raw !== 'object' || (raw as { loomwright?: unknown }).loomwright !== CLIP_MARKER) return null;
	const parsed = ClipSchema.safeParse(raw);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		return { ok: false, error: `The copied parts cannot be read (${formatPath(issue.path)}: ${issue.message}).` };
	}
	const { parts, wires, palette, diagramId } = parsed.data;
	const ids = new Set(parts.map((p) => p.id));
	// Only wires with both ends among the copied parts travel with them.
	return { ok: true, copied: { clip: { parts, wires: wires.filter((w) => ids.has(w.from.part) && ids.has(w.to.part)) }, palette, diagramId } };
}

/** The copied parts' bounding box centre, to land a paste from elsewhere in the middle of the view. */
export function clipCentre(clip: Clipboard): { x: number; y: number } {
	const xs = clip.parts.map((p) => p.position.x);
	const ys = clip.parts.map((p) => p.position.y);
	return { x: (Math.min(...xs) + Math.max(...xs)) / 2, y: (Math.min(...ys) + Math.max(...ys)) / 2 };
}
