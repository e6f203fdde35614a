// Scanned manual pages through the built server and the S3 fake (S3_ENDPOINT, started by
// scripts/test.sh): upload checked by content and size, bytes served only to those who may view
// the diagram, tracing settings, and files deleted with their page or their diagram.
import { readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { manualPages } from '../../src/lib/server/db/schema';
import * as storage from '../../src/lib/server/storage';
import { api as call, baseUrl, signedInAccount as account } from './helpers';

const page = new Uint8Array(readFileSync(new URL('../../fixtures/manual-page.png', import.meta.url)));

async function upload(diagramId: string, cookie: string, bytes: Uint8Array, name: string, type = 'image/png') {
	const form = new FormData();
	form.append('file', new File([bytes as BlobPart], name, { type }));
	// The browser sends Origin on a form POST; SvelteKit's CSRF check wants it.
	// A time limit of its own, so a stalled upload fails here, by name, before the test's own.
	const res = await fetch(`${baseUrl()}/api/diagrams/${diagramId}/pages`, {
		method: 'POST',
		headers: { cookie, origin: baseUrl(), accept: 'application/json' },
		body: form,
		signal: AbortSignal.timeout(20_000)
	}).catch((e) => {
		throw new Error(`upload of ${name} (${bytes.byteLength} bytes) got no answer: ${e}`);
	});
	return { status: res.status, body: await res.json() };
}

let owner: { id: string; cookie: string };
let stranger: { id: string; cookie: string };
let vehicleId: string;

async function newDiagram(title: string) {
	const d = await call('POST', '/api/diagrams', owner.cookie, { vehicleId, title });
	expect(d.status).toBe(201);
	return d.body.diagram.id as string;
}

beforeAll(async () => {
	owner = await account('Tracer');
	stranger = await account('Onlooker');
	const v = await call('POST', '/api/vehicles', owner.cookie, { name: 'Test Roadster', systemVoltage: 6, earthPolarity: 'positive' });
	expect(v.status).toBe(201);
	vehicleId = v.body.vehicle.id;
});

describe('manual pages', () => {
	it('uploads a PNG, lists it and serves the same bytes to the owner only', async () => {
		const diagramId = await newDiagram('Lighting');
		const up = await upload(diagramId, owner.cookie, page, 'plate-7.png');
		expect(up.status).toBe(201);
		expect(up.body.page).toMatchObject({ contentType: 'image/png', byteSize: page.byteLength, originalName: 'plate-7.png', pageOrder: 0 });

		const list = await call('GET', `/api/diagrams/${diagramId}/pages`, owner.cookie);
		expect(list.body.pages.map((p: { id: string }) => p.id)).toEqual([up.body.page.id]);

		const url = baseUrl() + up.body.page.url;
		const got = await fetch(url, { headers: { cookie: owner.cookie } });
		expect(got.status).toBe(200);
		expect(got.headers.get('content-type')).toBe('image/png');
		expect(got.headers.get('cache-control')).toContain('private');
		expect(new Uint8Array(await got.arrayBuffer())).toEqual(page);

		// Another account: 404, as for something that does not exist (access.ts); no session: 401.
		expect((await fetch(url, { headers: { cookie: stranger.cookie } })).status).toBe(404);
		expect((await fetch(url)).status).toBe(401);
		expect((await call('GET', `/api/diagrams/${diagramId}/pages`, stranger.cookie)).status).toBe(404);
		expect((await upload(diagramId, stranger.cookie, page, 'x.png')).status).toBe(404);
	});

	it('checks the content, not the name, and states the limit', async () => {
		const diagramId = await newDiagram('Checks');
		const text = await upload(diagramId, owner.cookie, new TextEncoder().encode('GIF89a pretending'), 'page.png');
		expect(text.status).toBe(400);
		expect(text.body.error).toMatch(/not a PNG, JPEG or WebP/);
		expect(text.body.issues[0].path).toBe('file');

		// A JPEG named .png is stored as what it is (SOI + APP0 marker, ITU-T T.81).
		const jpeg = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46, 0x49, 0x46, 0, 1]);
		const j = await upload(diagramId, owner.cookie, jpeg, 'scan.png', 'image/png');
		expect(j.status).toBe(201);
		expect(j.body.page.contentType).toBe('image/jpeg');

		const big = new Uint8Array(15 * 1024 * 1024 + 1);
		big.set(page.subarray(0, 8));
		const tooBig = await upload(diagramId, owner.cookie, big, 'huge.png');
		expect(tooBig.status).toBe(400);
		expect(tooBig.body.error).toMatch(/15 MB/);
		expect((await call('GET', `/api/diagrams/${diagramId}/pages`, owner.cookie)).body.pages).toHaveLength(1);
	});

	it('an upload refused before it is read leaves its connection fit for the next request', async () => {
		const diagramId = await newDiagram('Refused uploads');
		// Without the server reading the refused body, about one pair in twenty hung; sixty pairs
		// catch that almost always.
		for (let i = 0; i < 60; i++) {
			// Refused by the access check before the handler reads the body.
			expect((await upload(diagramId, stranger.cookie, page, 'x.png')).status).toBe(404);
			expect((await upload(diagramId, owner.cookie, new TextEncoder().encode('not an image'), 'n.png')).status).toBe(400);
		}
	});

	it('keeps tracing settings and refuses out-of-range ones by field', async () => {
		const diagramId = await newDiagram('Tracing');
		const up = await upload(diagramId, owner.cookie, page, 'p.png');
		const path = `/api/diagrams/${diagramId}/pages/${up.body.page.id}`;
		const ok = await call('PATCH', path, owner.cookie, { opacity: 0.3, scale: 1.5, offsetX: -40, offsetY: 12.5, locked: true });
		expect(ok.status).toBe(200);
		expect(ok.body.page.tracing).toEqual({ opacity: 0.3, scale: 1.5, offsetX: -40, offsetY: 12.5, locked: true });
		const bad = await call('PATCH', path, owner.cookie, { opacity: 2 });
		expect(bad.status).toBe(400);
		expect(bad.body.issues[0].path).toBe('opacity');
		expect((await call('PATCH', path, stranger.cookie, { opacity: 0.1 })).status).toBe(404);
		const list = await call('GET', `/api/diagrams/${diagramId}/pages`, owner.cookie);
		expect(list.body.pages[0].tracing.opacity).toBe(0.3);
	});

	it('deletes the stored file with its page, and every page’s file with its diagram', async () => {
		const diagramId = await newDiagram('Doomed');
		const a = await upload(diagramId, owner.cookie, page, 'a.png');
		const b = await upload(diagramId, owner.cookie, page, 'b.png');
		expect(b.body.page.pageOrder).toBe(1);
		const keys = (await db.select().from(manualPages).where(eq(manualPages.diagramId, diagramId))).map((r) => r.storageKey);
		expect(keys).toHaveLength(2);
		for (const k of keys) expect(await storage.get(k)).not.toBeNull();

		const [first] = await db.select().from(manualPages).where(eq(manualPages.id, a.body.page.id));
		expect((await call('DELETE', `/api/diagrams/${diagramId}/pages/${a.body.page.id}`, owner.cookie)).status).toBe(204);
		expect(await storage.get(first.storageKey)).toBeNull();

		expect((await call('DELETE', `/api/diagrams/${diagramId}`, owner.cookie)).status).toBe(204);
		for (const k of keys) expect(await storage.get(k)).toBeNull();
		expect(await db.select().from(manualPages).where(eq(manualPages.diagramId, diagramId))).toHaveLength(0);
	});

	it('deletes the pages’ files of every diagram of a deleted vehicle', async () => {
		const v = await call('POST', '/api/vehicles', owner.cookie, { name: 'Sold Roadster', systemVoltage: 12, earthPolarity: 'negative' });
		const d = await call('POST', '/api/diagrams', owner.cookie, { vehicleId: v.body.vehicle.id, title: 'Gone with it' });
		const up = await upload(d.body.diagram.id, owner.cookie, page, 'c.png');
		expect(up.status).toBe(201);
		const [row] = await db.select().from(manualPages).where(eq(manualPages.id, up.body.page.id));
		expect(await storage.get(row.storageKey)).not.toBeNull();
		expect((await call('DELETE', `/api/vehicles/${v.body.vehicle.id}`, owner.cookie)).status).toBe(204);
		expect(await storage.get(row.storageKey)).toBeNull();
	});
});
