// Revision history: every accepted save is kept; restoring an old revision writes a new one
// (never rewrites history) and obeys the same revision check as a save (409 when stale).
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { diagramRevisions } from '../../src/lib/server/db/schema';
import { api, baseUrl, signedInAccount, type SignedIn } from './helpers';

const vehicle = { name: 'History Ostrimmel', make: 'Ombrith & Vessick', model: 'Ostrimmel Tourer', year: '1962', systemVoltage: 12, earthPolarity: 'positive' };
const withLamp = (label: string) => ({
	schemaVersion: 1,
	vehicle: { systemVoltage: 12, earth: 'positive' },
	parts: [{ id: 'lamp1', key: '14', kind: 'lamp', label }],
	wires: []
});

let owner: SignedIn;
let stranger: SignedIn;
let diagramId: string;

beforeAll(async () => {
	owner = await signedInAccount('Historian');
	stranger = await signedInAccount('Passer-by');
	const v = await api('POST', '/api/vehicles', owner.cookie, vehicle);
	expect(v.status).toBe(201);
	const d = await api('POST', '/api/diagrams', owner.cookie, { vehicleId: v.body.vehicle.id, title: 'Panel lamps', document: withLamp('first') });
	expect(d.status).toBe(201);
	diagramId = d.body.diagram.id;
	for (const [revision, label] of [[1, 'second'], [2, 'third']] as const) {
		const put = await api('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision, document: withLamp(label) });
		expect(put.status).toBe(200);
	}
});

describe('revision history', () => {
	it('lists every accepted save, newest first, with its author', async () => {
		const r = await api('GET', `/api/diagrams/${diagramId}/revisions`, owner.cookie);
		expect(r.status).toBe(200);
		expect(r.body.current).toBe(3);
		expect(r.body.revisions.map((x: { revision: number }) => x.revision)).toEqual([3, 2, 1]);
		// Each with its one-line summary of what it changed against the one before.
		const summaries = r.body.revisions.map((x: { summary: string }) => x.summary);
		expect(summaries[0]).toMatch(/label “second” → “third”/);
		expect(summaries[1]).toMatch(/label “first” → “second”/);
		expect(summaries[2]).toBe('First revision');
	});

	it('shows one old revision with its document', async () => {
		const r = await api('GET', `/api/diagrams/${diagramId}/revisions/1`, owner.cookie);
		expect(r.status).toBe(200);
		expect(r.body.revision.document.parts[0].label).toBe('first');
	});

	it('says on the history page what a revision changed against the one before it', async () => {
		const page = async (n: number) => {
			const res = await fetch(`${baseUrl()}/diagrams/${diagramId}/revisions?view=${n}`, { headers: { cookie: owner.cookie, accept: 'text/html' } });
			expect(res.status).toBe(200);
			return (await res.text()).replace(/<!--.*?-->/g, '');
		};
		const second = await page(2);
		expect(second).toContain('What changed since revision 1');
		expect(second).toContain('Part 14 second: label “first” → “second”');
		// The first revision has nothing before it.
		expect(await page(1)).not.toContain('What changed since');
	});

	it('restores revision 1 as a new revision 4, keeping 1–3 as they were', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/revisions/1/restore`, owner.cookie, { revision: 3 });
		expect(r.status).toBe(200);
		expect(r.body.diagram.revision).toBe(4);
		const now = await api('GET', `/api/diagrams/${diagramId}`, owner.cookie);
		expect(now.body.diagram.document.parts[0].label).toBe('first');
		const rows = await db.select().from(diagramRevisions).where(eq(diagramRevisions.diagramId, diagramId));
		expect(rows.map((x) => x.revision).sort()).toEqual([1, 2, 3, 4]);
		const third = rows.find((x) => x.revision === 3)!;
		expect((third.document as { parts: { label: string }[] }).parts[0].label).toBe('third');
	});

	it('refuses a restore made against a stale revision with 409, changing nothing', async () => {
		const r = await api('POST', `/api/diagrams/${diagramId}/revisions/2/restore`, owner.cookie, { revision: 3 });
		expect(r.status).toBe(409);
		expect(r.body.revision).toBe(4);
		const now = await api('GET', `/api/diagrams/${diagramId}`, owner.cookie);
		expect(now.body.diagram.revision).toBe(4);
		expect(now.body.diagram.document.parts[0].label).toBe('first');
	});

	it('answers 404 to another account and for a revision that does not exist', async () => {
		expect((await api('GET', `/api/diagrams/${diagramId}/revisions`, stranger.cookie)).status).toBe(404);
		expect((await api('POST', `/api/diagrams/${diagramId}/revisions/1/restore`, stranger.cookie, { revision: 4 })).status).toBe(404);
		expect((await api('GET', `/api/diagrams/${diagramId}/revisions/99`, owner.cookie)).status).toBe(404);
		expect((await api('GET', `/api/diagrams/${diagramId}/revisions`, null)).status).toBe(401);
	});
});
