// The JSON API: 401 without a session, 404 for what belongs to another account, 400 naming the
// field, and the revision check on saves (409, never an overwrite).
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { diagramRevisions, diagrams, vehicles } from '../../src/lib/server/db/schema';
import { api as call, baseUrl, signedInAccount as account } from './helpers';

const ostrimmel = { name: 'Test Ostrimmel', make: 'Ombrith & Vessick', model: 'Ostrimmel Tourer', year: '1962', systemVoltage: 12, earthPolarity: 'positive' };
const oneLamp = {
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'positive' },
	parts: [{ id: 'lamp1', key: '14', kind: 'lamp', label: 'Panel lamp' }],
	wires: []
};

let owner: { id: string; cookie: string };
let stranger: { id: string; cookie: string };
let vehicleId: string;
let diagramId: string;

beforeAll(async () => {
	owner = await account('Owner');
	stranger = await account('Stranger');
	const v = await call('POST', '/api/vehicles', owner.cookie, ostrimmel);
	expect(v.status).toBe(201);
	vehicleId = v.body.vehicle.id;
	const d = await call('POST', '/api/diagrams', owner.cookie, { vehicleId, title: 'Instruments' });
	expect(d.status).toBe(201);
	diagramId = d.body.diagram.id;
});

afterAll(async () => {
	await db.$client.end();
});

describe('without a session', () => {
	it.each([
		['GET', '/api/vehicles'],
		['POST', '/api/vehicles'],
		['GET', '/api/diagrams'],
		['GET', '/api/vehicles/:vehicle'],
		['PATCH', '/api/vehicles/:vehicle'],
		['GET', '/api/diagrams/:diagram'],
		['PUT', '/api/diagrams/:diagram'],
		['DELETE', '/api/diagrams/:diagram']
	])('%s %s answers 401 in the JSON error shape', async (method, template) => {
		const path = template.replace(':vehicle', vehicleId).replace(':diagram', diagramId);
		const res = await call(method, path, null, method === 'GET' || method === 'DELETE' ? undefined : {});
		expect(res.status).toBe(401);
		expect(res.body).toEqual({ error: 'Sign in to do that.' });
	});
});

describe('another account’s vehicle and diagram', () => {
	it('answers 404 exactly like something that does not exist, and changes nothing', async () => {
		const missing = await call('GET', '/api/vehicles/00000000-0000-4000-8000-000000000000', stranger.cookie);
		expect(missing.status).toBe(404);
		const cases: [string, string, unknown?][] = [
			['GET', `/api/vehicles/${vehicleId}`],
			['PATCH', `/api/vehicles/${vehicleId}`, { name: 'Stolen' }],
			['DELETE', `/api/vehicles/${vehicleId}`],
			['GET', `/api/diagrams/${diagramId}`],
			['PUT', `/api/diagrams/${diagramId}`, { revision: 1, document: oneLamp }],
			['DELETE', `/api/diagrams/${diagramId}`],
			['GET', `/api/diagrams?vehicleId=${vehicleId}`],
			['POST', '/api/diagrams', { vehicleId, title: 'Planted' }]
		];
		for (const [method, path, body] of cases) {
			const res = await call(method, path, stranger.cookie, body);
			expect(res.status, `${method} ${path}`).toBe(404);
			expect(res.body, `${method} ${path}`).toEqual(missing.body);
		}
		const [v] = await db.select().from(vehicles).where(eq(vehicles.id, vehicleId));
		expect(v.name).toBe('Test Ostrimmel');
		const [d] = await db.select().from(diagrams).where(eq(diagrams.id, diagramId));
		expect(d.revision).toBe(1);
		expect(await db.select().from(diagrams).where(eq(diagrams.title, 'Planted'))).toHaveLength(0);
	});

	it('lists only the account’s own vehicles and diagrams', async () => {
		const mine = await call('GET', '/api/vehicles', stranger.cookie);
		expect(mine.body.vehicles.map((v: { id: string }) => v.id)).not.toContain(vehicleId);
		const theirs = await call('GET', '/api/diagrams', stranger.cookie);
		expect(theirs.body.diagrams.map((d: { id: string }) => d.id)).not.toContain(diagramId);
		const owned = await call('GET', '/api/vehicles', owner.cookie);
		expect(owned.body.vehicles.map((v: { id: string }) => v.id)).toContain(vehicleId);
	});

	it('answers 404 for the pages too', async () => {
		for (const path of [`/garage/${vehicleId}`, `/diagrams/${diagramId}`, '/garage/not-a-uuid', '/diagrams/not-a-uuid']) {
			const res = await fetch(baseUrl() + path, { headers: { accept: 'text/html', cookie: stranger.cookie } });
			expect(res.status, path).toBe(404);
			const html = await res.text();
			expect(html).not.toContain('Test Ostrimmel');
		}
		const own = await fetch(`${baseUrl()}/diagrams/${diagramId}`, { headers: { accept: 'text/html', cookie: owner.cookie } });
		expect(own.status).toBe(200);
		expect(await own.text()).toContain('Test Ostrimmel');
	});
});

describe('saving a diagram', () => {
	it('an accepted PUT bumps the revision and writes a diagram_revisions row with author and document', async () => {
		const before = await call('GET', `/api/diagrams/${diagramId}`, owner.cookie);
		const rev = before.body.diagram.revision as number;
		const res = await call('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: rev, document: oneLamp });
		expect(res.status).toBe(200);
		expect(res.body.diagram.revision).toBe(rev + 1);
		expect(res.body.diagram.summary).toMatchObject({ parts: 1, wires: 0 });

		const [row] = await db
			.select()
			.from(diagramRevisions)
			.where(and(eq(diagramRevisions.diagramId, diagramId), eq(diagramRevisions.revision, rev + 1)));
		expect(row.authorId).toBe(owner.id);
		expect((row.document as { parts: { id: string }[] }).parts[0].id).toBe('lamp1');
		const [stored] = await db.select().from(diagrams).where(eq(diagrams.id, diagramId));
		expect(stored.revision).toBe(rev + 1);
	});

	it('a stale PUT gets 409 with the current revision and changes nothing', async () => {
		const current = (await call('GET', `/api/diagrams/${diagramId}`, owner.cookie)).body.diagram;
		const [beforeRow] = await db.select().from(diagrams).where(eq(diagrams.id, diagramId));
		const revisionsBefore = await db.select().from(diagramRevisions).where(eq(diagramRevisions.diagramId, diagramId));

		const stale = { ...oneLamp, parts: [] };
		const res = await call('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: current.revision - 1, document: stale });
		expect(res.status).toBe(409);
		expect(res.body.revision).toBe(current.revision);
		expect(res.body.error).toContain(`now at revision ${current.revision}`);

		const [afterRow] = await db.select().from(diagrams).where(eq(diagrams.id, diagramId));
		expect(afterRow.revision).toBe(beforeRow.revision);
		expect(afterRow.document).toEqual(beforeRow.document);
		expect(afterRow.updatedAt.getTime()).toBe(beforeRow.updatedAt.getTime());
		expect(await db.select().from(diagramRevisions).where(eq(diagramRevisions.diagramId, diagramId))).toHaveLength(revisionsBefore.length);
		const after = (await call('GET', `/api/diagrams/${diagramId}`, owner.cookie)).body.diagram;
		expect(after.document).toEqual(current.document);
	});

	it('of two concurrent PUTs of one revision, exactly one wins', async () => {
		const rev = (await call('GET', `/api/diagrams/${diagramId}`, owner.cookie)).body.diagram.revision as number;
		const a = { ...oneLamp, parts: [{ ...oneLamp.parts[0], label: 'From the bench' }] };
		const b = { ...oneLamp, parts: [{ ...oneLamp.parts[0], label: 'From the phone' }] };
		const results = await Promise.all([
			call('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: rev, document: a }),
			call('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: rev, document: b })
		]);
		expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
		const winner = results.find((r) => r.status === 200)!.body.diagram.document.parts[0].label;
		const [stored] = await db.select().from(diagrams).where(eq(diagrams.id, diagramId));
		expect(stored.revision).toBe(rev + 1);
		expect((stored.document as typeof a).parts[0].label).toBe(winner);
		expect(
			await db.select().from(diagramRevisions).where(and(eq(diagramRevisions.diagramId, diagramId), eq(diagramRevisions.revision, rev + 1)))
		).toHaveLength(1);
	});
});

describe('malformed bodies', () => {
	it('names the field paths for a bad vehicle', async () => {
		const res = await call('POST', '/api/vehicles', owner.cookie, { ...ostrimmel, name: '', systemVoltage: 9 });
		expect(res.status).toBe(400);
		expect(res.body.error).toBe('Some fields need fixing.');
		expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['name', 'systemVoltage']);
	});

	it('names the path inside the document', async () => {
		const rev = (await call('GET', `/api/diagrams/${diagramId}`, owner.cookie)).body.diagram.revision;
		const res = await call('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: rev, document: { ...oneLamp, parts: 'lamp' } });
		expect(res.status).toBe(400);
		expect(res.body.issues.map((i: { path: string }) => i.path)).toContain('document.parts');
	});

	it('names a missing revision', async () => {
		const res = await call('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { document: oneLamp });
		expect(res.status).toBe(400);
		expect(res.body.issues).toEqual([{ path: 'revision', message: 'Send the revision number this save edits.' }]);
	});

	it('says so when the body is not JSON', async () => {
		const res = await call('POST', '/api/vehicles', owner.cookie, '{"name": "unfinished');
		expect(res.status).toBe(400);
		expect(res.body).toEqual({ error: 'The request body is not valid JSON.' });
	});
});

describe('vehicles', () => {
	it('PATCH changes only the fields sent; DELETE takes the diagrams with it', async () => {
		const v = (await call('POST', '/api/vehicles', owner.cookie, { ...ostrimmel, name: 'Spare', notes: 'keep me' })).body.vehicle;
		const patched = await call('PATCH', `/api/vehicles/${v.id}`, owner.cookie, { name: 'Spare chassis' });
		expect(patched.status).toBe(200);
		expect(patched.body.vehicle).toMatchObject({ name: 'Spare chassis', notes: 'keep me', make: 'Ombrith & Vessick' });
		const d = (await call('POST', '/api/diagrams', owner.cookie, { vehicleId: v.id, title: 'Lighting' })).body.diagram;
		expect((await call('DELETE', `/api/vehicles/${v.id}`, owner.cookie)).status).toBe(204);
		expect((await call('GET', `/api/diagrams/${d.id}`, owner.cookie)).status).toBe(404);
		expect(await db.select().from(diagramRevisions).where(eq(diagramRevisions.diagramId, d.id))).toHaveLength(0);
	});

	it('a new diagram starts from an empty document with the vehicle’s voltage and earth', async () => {
		const d = (await call('GET', `/api/diagrams?vehicleId=${vehicleId}`, owner.cookie)).body.diagrams;
		expect(d.length).toBeGreaterThan(0);
		const v6 = (await call('POST', '/api/vehicles', owner.cookie, { name: 'Six-volt twin', systemVoltage: 6, earthPolarity: 'positive' })).body.vehicle;
		const created = await call('POST', '/api/diagrams', owner.cookie, { vehicleId: v6.id, title: 'Charging' });
		expect(created.body.diagram.revision).toBe(1);
		expect(created.body.diagram.document.vehicle).toEqual({ systemVoltage: 6, earth: 'positive' });
		expect(created.body.diagram.summary).toMatchObject({ parts: 0, wires: 0 });
	});
});

describe('errors SvelteKit makes itself', () => {
	it('come in the same JSON shape: unknown address 404, wrong method 405 with Allow', async () => {
		expect(await call('GET', '/api/no-such-thing', owner.cookie)).toEqual({
			status: 404,
			body: { error: 'There is no such address in the Loomwright API.' }
		});
		const res = await fetch(`${baseUrl()}/api/vehicles`, { method: 'PUT', headers: { cookie: owner.cookie } });
		expect(res.status).toBe(405);
		expect(res.headers.get('allow')).toContain('POST');
		expect(await res.json()).toEqual({ error: 'This address does not take that method.' });
	});
});

describe('health', () => {
	it('reports the database up', async () => {
		const res = await call('GET', '/api/health', null);
		expect(res).toEqual({ status: 200, body: { ok: true, db: 'up' } });
	});
});
