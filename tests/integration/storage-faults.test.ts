// The file store away or stalled (issue: storage that never leaves half-done work). The app's page
// store runs here in-process against the S3 fake through a relay this test can cut ("refuse":
// connections dropped, as a store that is down) or freeze (connections held, never answered, as a
// store that stalls). What must hold: a delete with the store down changes nothing and says so;
// an upload to a stalled store fails within 10 s and leaves no page; a file the store may still
// write is recorded and the clean-up removes it once the store answers.
import { createServer, connect, type Server, type Socket } from 'node:net';
import { readFileSync } from 'node:fs';
import { eq, like } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { api as call, signedInAccount as account } from './helpers';

type Mode = 'pass' | 'refuse' | 'freeze';
let mode: Mode = 'pass';
let relay: Server;
const held = new Set<Socket>();
const passing = new Set<Socket>();
/** A change of mode cuts the connections the client keeps alive, so its next call meets the new mode. */
function setMode(next: Mode) {
	mode = next;
	for (const s of passing) s.destroy();
}

// Before any import reads the settings: the app's modules reach the store through the relay, on
// a port of its own beside the integration server's.
const { upstream, relayPort } = vi.hoisted(() => {
	const upstream = new URL(process.env.S3_ENDPOINT ?? 'http://127.0.0.1:4569');
	const relayPort = Number(process.env.INTEGRATION_PORT ?? 4179) + 41;
	process.env.S3_ENDPOINT = `http://127.0.0.1:${relayPort}`;
	return { upstream, relayPort };
});
const png = new Uint8Array(readFileSync(new URL('../../fixtures/manual-page.png', import.meta.url)));

let pages: typeof import('../../src/lib/server/manual-pages');
let storage: typeof import('../../src/lib/server/storage');
let db: typeof import('../../src/lib/server/db').db;
let schema: typeof import('../../src/lib/server/db/schema');
let owner: { id: string; cookie: string };
let diagramId: string;

beforeAll(async () => {
	relay = createServer((socket) => {
		if (mode === 'refuse') return socket.destroy();
		if (mode === 'freeze') {
			held.add(socket);
			socket.on('close', () => held.delete(socket));
			return;
		}
		const to = connect(Number(upstream.port), upstream.hostname);
		passing.add(socket);
		socket.on('close', () => passing.delete(socket));
		socket.pipe(to).pipe(socket);
		to.on('error', () => socket.destroy());
		socket.on('error', () => to.destroy());
	});
	await new Promise<void>((resolve) => relay.listen(relayPort, '127.0.0.1', resolve));
	pages = await import('../../src/lib/server/manual-pages');
	storage = await import('../../src/lib/server/storage');
	db = (await import('../../src/lib/server/db')).db;
	schema = await import('../../src/lib/server/db/schema');

	owner = await account('Storekeeper');
	const v = await call('POST', '/api/vehicles', owner.cookie, { name: 'Store Test Saloon', systemVoltage: 12, earthPolarity: 'negative' });
	expect(v.status).toBe(201);
	const d = await call('POST', '/api/diagrams', owner.cookie, { vehicleId: v.body.vehicle.id, title: 'Dash' });
	expect(d.status).toBe(201);
	diagramId = d.body.diagram.id;
});

afterAll(async () => {
	for (const s of held) s.destroy();
	relay?.close();
	await db?.$client.end();
});

const addPage = () => pages.add({ diagramId, ownerId: owner.id, bytes: png, contentType: 'image/png', originalName: 'plate.png' });

describe('the file store away or stalled', () => {
	it('a page delete with the store down answers "not answering" and keeps the row and the file', async () => {
		setMode('pass');
		const page = await addPage();
		setMode('refuse');
		await expect(pages.remove(page)).rejects.toMatchObject({ retryAfterSeconds: 60, message: expect.stringMatching(/file store is not answering/) });
		expect(await pages.find(diagramId, page.id)).not.toBeNull();
		setMode('pass');
		expect(await storage.get(page.storageKey)).toEqual(png);
		await pages.remove(page);
		expect(await pages.find(diagramId, page.id)).toBeNull();
		expect(await storage.get(page.storageKey)).toBeNull();
	});

	it('an upload to a stalled store fails within 10 s, leaves no page, and records the file it may still write; the clean-up removes it once the store answers', async () => {
		setMode('freeze');
		const before = (await pages.list(diagramId)).length;
		const started = Date.now();
		await expect(addPage()).rejects.toMatchObject({ message: expect.stringMatching(/file store is not answering/) });
		expect(Date.now() - started).toBeLessThan(10_000);
		expect((await pages.list(diagramId)).length).toBe(before);
		const orphans = await db.select().from(schema.storageOrphans).where(like(schema.storageOrphans.storageKey, `diagrams/${diagramId}/%`));
		expect(orphans).toHaveLength(1);

		setMode('pass');
		// The stalled write landing late, as a frozen store may do once it resumes.
		await storage.put(orphans[0].storageKey, png, 'image/png');
		expect(await pages.sweepOrphans(0)).toBeGreaterThanOrEqual(1);
		expect(await storage.get(orphans[0].storageKey)).toBeNull();
		expect(await db.select().from(schema.storageOrphans).where(eq(schema.storageOrphans.storageKey, orphans[0].storageKey))).toHaveLength(0);
	}, 30_000);
});
