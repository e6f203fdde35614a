// A vehicle's notes are its owner's own: everyone a diagram is shared with (viewer, commenter,
// editor, club member) sees the vehicle's facts but never its notes, in the API and in the data
// of every page that shows the vehicle.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { clubMembers, clubs } from '../../src/lib/server/db/schema';
import { demoHarness } from '../../src/lib/circuit/demo';
import { api, form, get, person, type Person } from './people';

const NOTES = `Spare key under the seat; garage code ${crypto.randomUUID().slice(0, 8)}`;
let owner: Person;
let others: Record<'viewer' | 'commenter' | 'editor' | 'clubMember', Person>;
let diagramId: string;
let diagnosisId: string;

beforeAll(async () => {
	const [o, viewer, commenter, editor, clubMember] = await Promise.all([
		person('Notes Owner'),
		person('Notes Viewer'),
		person('Notes Commenter'),
		person('Notes Editor'),
		person('Notes Club Member')
	]);
	owner = o;
	others = { viewer, commenter, editor, clubMember };
	const made = await api('POST', '/api/vehicles', owner.cookie, { name: 'Notes car', make: 'Corvell', model: 'Stanway Six', year: '1954', systemVoltage: 12, earthPolarity: 'positive', notes: NOTES });
	expect(made.status).toBe(201);
	const vehicleId = (await made.json()).vehicle.id as string;
	const diagram = await api('POST', '/api/diagrams', owner.cookie, { vehicleId, title: 'Notes harness', document: demoHarness() });
	expect(diagram.status).toBe(201);
	diagramId = (await diagram.json()).diagram.id;
	for (const [who, level] of [[editor, 'edit'], [commenter, 'comment'], [viewer, 'view']] as [Person, string][]) {
		expect((await form(`/diagrams/${diagramId}/share?/person`, { email: who.email, level }, owner.cookie)).status).toBe(200);
	}
	const [club] = await db.insert(clubs).values({ name: `Notes club ${crypto.randomUUID().slice(0, 6)}` }).returning();
	await db.insert(clubMembers).values([
		{ clubId: club.id, userId: owner.id, role: 'organiser' },
		{ clubId: club.id, userId: clubMember.id, role: 'member' }
	]);
	expect((await form(`/diagrams/${diagramId}/share?/club`, { clubId: club.id, level: 'view' }, owner.cookie)).status).toBe(200);
	const started = await api('POST', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie, { revision: 1, marks: [{ part: 'fuel-gauge', mark: 'reads-low' }] });
	expect(started.status).toBe(201);
	diagnosisId = (await started.json()).diagnosis.id;
}, 60_000);

afterAll(async () => {
	await db.$client.end();
});

/** Every place that shows the vehicle of a diagram: the API and the pages' data (SvelteKit's __data.json). */
const places = () => [
	`/api/diagnoses/${diagnosisId}`,
	`/diagnoses/${diagnosisId}/__data.json`,
	`/diagrams/${diagramId}/__data.json`,
	`/diagrams/${diagramId}/draw/__data.json`,
	`/diagrams/${diagramId}/revisions/__data.json`
];

async function read(path: string, cookie: string): Promise<string> {
	const res = path.startsWith('/api/') ? await api('GET', path, cookie) : await get(path, cookie);
	expect(res.status, path).toBe(200);
	return res.text();
}

describe("a vehicle's private notes", () => {
	it('reach its owner on every page and in the API', async () => {
		for (const path of places()) expect(await read(path, owner.cookie), path).toContain(NOTES);
	});

	it.each(['viewer', 'commenter', 'editor', 'clubMember'] as const)('never reach a %s, who still sees the vehicle itself', async (role) => {
		for (const path of places()) {
			const body = await read(path, others[role].cookie);
			expect(body, path).not.toContain(NOTES);
			expect(body, path).not.toContain('Spare key under the seat');
			expect(body, path).toContain('Stanway Six');
		}
		const answer = await (await api('GET', `/api/diagnoses/${diagnosisId}`, others[role].cookie)).json();
		// The shared shape is a whitelist: these fields and no others.
		expect(Object.keys(answer.vehicle).sort()).toEqual(['earthPolarity', 'id', 'make', 'model', 'name', 'systemVoltage', 'year']);
	});
});
