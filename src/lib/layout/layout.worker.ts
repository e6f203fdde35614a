// The auto-layout off the page's thread: ELK's layered run on a large loom takes a second or
// more, during which the drawing board must keep answering. One message in, one out:
//   in:  { id, document }      out: { id, positions: [partId, x, y][] } or { id, error }
// On start it lays out a small chain once, so the first "Tidy" does not pay for loading ELK.
import type { HarnessDocument } from '../circuit/schema';
import { layoutPositions } from './elk';
import { warmUpDocument } from './warm-up';

export type LayoutRequest = { id: number; document: HarnessDocument };
export type LayoutReply = { id: number; positions: [string, number, number][] } | { id: number; error: string };

// The project's TypeScript lib is the DOM's; a worker's global scope is typed by hand here.
const scope = self as unknown as { onmessage: ((event: MessageEvent<LayoutRequest>) => void) | null; postMessage(message: LayoutReply): void };

const ready = layoutPositions(warmUpDocument()).catch(() => undefined);

scope.onmessage = async (event) => {
	const { id, document } = event.data;
	await ready;
	try {
		const positions = await layoutPositions(document);
		const reply: LayoutReply = { id, positions: [...positions].map(([part, p]) => [part, p.x, p.y]) };
		scope.postMessage(reply);
	} catch (e) {
		scope.postMessage({ id, error: e instanceof Error ? e.message : String(e) });
	}
};
