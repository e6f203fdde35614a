import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { emptyDocument, type HarnessDocument } from '$lib/circuit/schema';
import type { ApiResult } from '$lib/api';
import { addParts, createPart } from './ops';
import { Autosave, type SaveClient } from './autosave.svelte';

// A stand-in server with the revision contract of PUT /api/diagrams/:id (DEVELOPERS.md: a save
// must name the revision it edits; a stale one answers 409 with the current revision).
function fakeServer() {
	const s = { revision: 1, document: null as unknown, puts: 0, down: false };
	const ok = <T>(data: T): ApiResult<T> => ({ ok: true, status: 200, data });
	const client: SaveClient = {
		put: async (_p, body) => {
			s.puts++;
			if (s.down) return { ok: false, status: 0, error: 'offline.', issues: [], body: {} };
			const b = body as { revision: number; document: unknown };
			if (b.revision !== s.revision) return { ok: false, status: 409, error: 'stale', issues: [], body: { revision: s.revision } };
			s.revision++;
			s.document = b.document;
			return ok({ diagram: { id: 'd', revision: s.revision, title: 't', vehicleId: 'v' } });
		},
		get: async () => ok({ diagram: { id: 'd', revision: s.revision, title: 't', vehicleId: 'v', document: s.document } }),
		post: async (_p, body) => ({ ok: true, status: 201, data: { diagram: { id: 'copy', revision: 1, title: (body as { title: string }).title, vehicleId: 'v' } } })
	};
	return { s, client };
}

describe('Autosave', () => {
	beforeEach(() => vi.useFakeTimers());
	afterEach(() => vi.useRealTimers());

	const base = emptyDocument({ systemVoltage: 12, earth: 'negative' });
	const withPart = (d: HarnessDocument, key: string) => addParts(d, [createPart(d, 'lamp', { x: 0, y: 0 }, { key })]);

	it('waits for a pause, then saves once with the revision', async () => {
		const { s, client } = fakeServer();
		let doc = base;
		const a = new Autosave({ diagramId: 'd', revision: 1, saved: base, current: () => doc, delayMs: 1000, client });
		doc = withPart(doc, '1');
		a.changed();
		await vi.advanceTimersByTimeAsync(500);
		doc = withPart(doc, '2');
		a.changed();
		expect(a.state).toBe('waiting');
		await vi.advanceTimersByTimeAsync(999);
		expect(s.puts).toBe(0);
		await vi.advanceTimersByTimeAsync(10);
		expect(s.puts).toBe(1);
		expect(a.state).toBe('saved');
		expect(a.revision).toBe(2);
		expect((s.document as HarnessDocument).parts).toHaveLength(2);
	});

	it('on a stale revision stops saving and keeps the local document', async () => {
		const { s, client } = fakeServer();
		s.revision = 3; // someone else saved twice
		let doc = withPart(base, '1');
		const a = new Autosave({ diagramId: 'd', revision: 1, saved: base, current: () => doc, delayMs: 10, client });
		a.changed();
		await vi.advanceTimersByTimeAsync(20);
		expect(a.state).toBe('conflict');
		expect(a.conflict).toEqual({ theirRevision: 3 });
		doc = withPart(doc, '2');
		a.changed();
		await vi.advanceTimersByTimeAsync(5000);
		expect(s.puts).toBe(1);
		expect(a.unsaved).toBe(true);
		const copy = await a.keepAsCopy('v', 'Mine');
		expect(copy).toEqual({ ok: true, id: 'copy' });
	});

	it('adopting theirs resumes saving from their revision', async () => {
		const { s, client } = fakeServer();
		s.revision = 2;
		let doc = withPart(base, '1');
		const a = new Autosave({ diagramId: 'd', revision: 1, saved: base, current: () => doc, delayMs: 10, client });
		await a.flush();
		expect(a.state).toBe('conflict');
		const theirs = await a.fetchTheirs();
		expect(theirs.ok && theirs.revision).toBe(2);
		doc = base;
		a.adopted(base, 2);
		doc = withPart(base, '7');
		a.changed();
		await vi.advanceTimersByTimeAsync(20);
		expect(a.state).toBe('saved');
		expect(s.revision).toBe(3);
	});

	it('retries after a network failure', async () => {
		const { s, client } = fakeServer();
		s.down = true;
		const doc = withPart(base, '1');
		const a = new Autosave({ diagramId: 'd', revision: 1, saved: base, current: () => doc, delayMs: 10, client });
		a.changed();
		await vi.advanceTimersByTimeAsync(20);
		expect(a.state).toBe('retrying');
		s.down = false;
		await vi.advanceTimersByTimeAsync(2100);
		expect(a.state).toBe('saved');
		expect(s.puts).toBe(2);
	});

	it('refuses to send a document the schema rejects, saying where', async () => {
		const { s, client } = fakeServer();
		const broken = { ...withPart(base, '1'), wires: [{ id: 'w', from: { part: 'nope', terminal: 'x' }, to: { part: 'nope', terminal: 'y' }, code: 'B', size: { mm2: 1 }, lengthM: 1 }] } as HarnessDocument;
		const a = new Autosave({ diagramId: 'd', revision: 1, saved: base, current: () => broken, delayMs: 10, client });
		await a.flush();
		expect(a.state).toBe('refused');
		expect(a.message).toMatch(/wires\[0\]\.from\.part/);
		expect(s.puts).toBe(0);
	});
});
