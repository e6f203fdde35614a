// The page's side of the layout worker: one worker per page, started on first use (or by
// `warmLayout` when the drawing board opens), answering one request at a time in order.
import type { HarnessDocument, Position } from '../circuit/schema';
import type { LayoutReply, LayoutRequest } from './layout.worker';

let worker: Worker | null = null;
let nextId = 1;
const waiting = new Map<number, { resolve: (p: Map<string, Position>) => void; reject: (e: Error) => void }>();

function start(): Worker {
	if (worker) return worker;
	worker = new Worker(new URL('./layout.worker.ts', import.meta.url), { type: 'module' });
	worker.onmessage = (event: MessageEvent<LayoutReply>) => {
		const reply = event.data;
		const w = waiting.get(reply.id);
		if (!w) return;
		waiting.delete(reply.id);
		if ('error' in reply) w.reject(new Error(`The layout failed: ${reply.error}`));
		else w.resolve(new Map(reply.positions.map(([id, x, y]) => [id, { x, y }])));
	};
	worker.onerror = (event) => {
		for (const w of waiting.values()) w.reject(new Error(`The layout worker stopped: ${event.message}`));
		waiting.clear();
		worker?.terminate();
		worker = null;
	};
	return worker;
}

/** Starts the worker early so its first layout is quick. */
export function warmLayout(): void {
	start();
}

/** Part positions for a document, laid out in the worker. */
export function layoutInWorker(document: HarnessDocument): Promise<Map<string, Position>> {
	const w = start();
	const id = nextId++;
	return new Promise((resolve, reject) => {
		waiting.set(id, { resolve, reject });
		// $state proxies cannot be cloned into a worker; the document is plain data.
		w.postMessage({ id, document: JSON.parse(JSON.stringify(document)) } satisfies LayoutRequest);
	});
}

/** Stops the worker (when the drawing board closes). */
export function stopLayout(): void {
	worker?.terminate();
	worker = null;
	for (const w of waiting.values()) w.reject(new Error('The layout was stopped.'));
	waiting.clear();
}
