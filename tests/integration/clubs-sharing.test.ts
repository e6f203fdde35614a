// Clubs, invitations, shares, read-only links, copies and comments through the built server.
// The rules are the product's own (issue: invitations are a single-use link for seven days;
// levels view < comment < edit; a revoked or expired link is 404; something one may not see is
// 404 as if it did not exist, OWASP ASVS 4.0.3 §4.2.1).
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { clubInvitations, diagrams as diagramTable } from '../../src/lib/server/db/schema';
import { demoHarness } from '../../src/lib/circuit/demo';
import { api, form, get, mailCount, mailTo, pathOf, person, type Person } from './people';

afterAll(async () => {
	await db.$client.end();
});

async function vehicleAndDiagram(owner: Person, make = 'Corvell', model = 'Stanway Six', year = '1954', title = 'Lighting') {
	const v = await api('POST', '/api/vehicles', owner.cookie, { name: `${model} ${year}`, make, model, year, systemVoltage: 12, earthPolarity: 'positive' });
	expect(v.status).toBe(201);
	const vehicle = (await v.json()).vehicle;
	const d = await api('POST', '/api/diagrams', owner.cookie, { vehicleId: vehicle.id, title, document: demoHarness() });
	expect(d.status).toBe(201);
	return { vehicle, diagram: (await d.json()).diagram as { id: string; revision: number; document: { parts: { id: string }[]; wires: { id: string }[] } } };
}

async function makeClub(organiser: Person, name: string): Promise<string> {
	const res = await form('/clubs?/create', { name, description: 'Owners of invented tourers.' }, organiser.cookie);
	expect(res.status).toBe(303);
	return res.headers.get('location')!.split('/').pop()!;
}

async function inviteAndAccept(clubId: string, organiser: Person, member: Person) {
	expect((await form(`/clubs/${clubId}?/invite`, { email: member.email }, organiser.cookie)).status).toBe(200);
	const link = pathOf((await mailTo(member.email, /invites you to/)).links[0]);
	expect((await form(`${link}?/accept`, {}, member.cookie)).status).toBe(303);
	return link;
}

describe('clubs and invitations', () => {
	it('invites by e-mail; the link works once, only for its address; accept joins, decline does not', async () => {
		const org = await person('Olive Organiser');
		const ann = await person('Ann Member');
		const bob = await person('Bob Decliner');
		const clubId = await makeClub(org, 'Stanway Register');

		expect((await form(`/clubs/${clubId}?/invite`, { email: 'not-an-address' }, org.cookie)).status).toBe(400);
		expect((await form(`/clubs/${clubId}?/invite`, { email: ann.email }, org.cookie)).status).toBe(200);
		const mail = await mailTo(ann.email, /Olive Organiser invites you to Stanway Register/);
		const link = pathOf(mail.links[0]);
		expect(link).toMatch(/^\/invitations\/[A-Za-z0-9_-]{43}$/);
		const [inv] = await db.select().from(clubInvitations).where(eq(clubInvitations.email, ann.email));
		const days = (inv.expiresAt.getTime() - Date.now()) / 86_400_000;
		expect(days).toBeGreaterThan(6.99);
		expect(days).toBeLessThanOrEqual(7);

		// Another account cannot use Ann's link.
		expect((await form(`${link}?/accept`, {}, bob.cookie)).status).toBe(403);
		expect((await get(`/clubs/${clubId}`, ann.cookie)).status).toBe(404);
		expect((await form(`${link}?/accept`, {}, ann.cookie)).status).toBe(303);
		expect((await get(`/clubs/${clubId}`, ann.cookie)).status).toBe(200);
		// Spent.
		expect((await get(link, ann.cookie)).status).toBe(404);

		await form(`/clubs/${clubId}?/invite`, { email: bob.email }, org.cookie);
		const bobLink = pathOf((await mailTo(bob.email, /invites you to/)).links[0]);
		expect((await form(`${bobLink}?/decline`, {}, bob.cookie)).status).toBe(303);
		expect((await get(`/clubs/${clubId}`, bob.cookie)).status).toBe(404);
		expect((await form(`${bobLink}?/accept`, {}, bob.cookie)).status).toBe(404);

		const members = await (await get(`/clubs/${clubId}`, org.cookie)).text();
		expect(members).toContain('Members (2)');
	});

	it('an invitation older than seven days is dead', async () => {
		const org = await person('Old Organiser');
		const late = await person('Late Member');
		const clubId = await makeClub(org, 'Late Club');
		await form(`/clubs/${clubId}?/invite`, { email: late.email }, org.cookie);
		const link = pathOf((await mailTo(late.email, /invites you to/)).links[0]);
		await db.update(clubInvitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(clubInvitations.email, late.email));
		expect((await get(link, late.cookie)).status).toBe(404);
	});

	it('removes a member, lets a member leave, and hands the organiser role on', async () => {
		const org = await person('Hand Organiser');
		const m1 = await person('First Member');
		const m2 = await person('Second Member');
		const clubId = await makeClub(org, 'Handover Club');
		await inviteAndAccept(clubId, org, m1);
		await inviteAndAccept(clubId, org, m2);

		// Members cannot remove anyone; the organiser cannot leave without handing on.
		expect((await form(`/clubs/${clubId}?/remove`, { userId: m2.id }, m1.cookie)).status).toBe(403);
		expect((await form(`/clubs/${clubId}?/leave`, {}, org.cookie)).status).toBe(400);

		expect((await form(`/clubs/${clubId}?/remove`, { userId: m2.id }, org.cookie)).status).toBe(200);
		expect((await get(`/clubs/${clubId}`, m2.cookie)).status).toBe(404);

		expect((await form(`/clubs/${clubId}?/handOver`, { userId: m1.id }, org.cookie)).status).toBe(200);
		expect((await form(`/clubs/${clubId}?/invite`, { email: m2.email }, org.cookie)).status).toBe(403);
		expect((await form(`/clubs/${clubId}?/leave`, {}, org.cookie)).status).toBe(303);
		expect((await get(`/clubs/${clubId}`, org.cookie)).status).toBe(404);
		expect(await (await get(`/clubs/${clubId}`, m1.cookie)).text()).toContain('You are the organiser');
	});

	it('the organiser deletes a club by typing its name; members lose it, the shared diagrams stay with their owners', async () => {
		const org = await person('Closing Organiser');
		const member = await person('Closing Member');
		const clubId = await makeClub(org, 'Closing Club');
		await inviteAndAccept(clubId, org, member);
		const { diagram } = await vehicleAndDiagram(member, 'Ombrith', 'Ostrimmel Tourer', '1962', 'Shared before closing');
		expect((await form(`/diagrams/${diagram.id}/share?/club`, { clubId, level: 'view' }, member.cookie)).status).toBe(200);
		expect((await api('GET', `/api/diagrams/${diagram.id}`, org.cookie)).status).toBe(200);

		// A member may not; the organiser must type the name (a near miss changes nothing).
		expect((await form(`/clubs/${clubId}?/delete`, { confirmName: 'Closing Club' }, member.cookie)).status).toBe(403);
		const wrong = await form(`/clubs/${clubId}?/delete`, { confirmName: 'Closing' }, org.cookie);
		expect(wrong.status).toBe(400);
		expect(await wrong.text()).toContain('Type the club’s name');
		expect((await get(`/clubs/${clubId}`, member.cookie)).status).toBe(200);

		const done = await form(`/clubs/${clubId}?/delete`, { confirmName: ' Closing Club ' }, org.cookie);
		expect(done.status).toBe(303);
		expect(done.headers.get('location')).toBe('/clubs');
		expect((await get(`/clubs/${clubId}`, org.cookie)).status).toBe(404);
		expect((await get(`/clubs/${clubId}`, member.cookie)).status).toBe(404);
		// The share went with the club; the diagram is still its owner's.
		expect((await api('GET', `/api/diagrams/${diagram.id}`, org.cookie)).status).toBe(404);
		expect((await api('GET', `/api/diagrams/${diagram.id}`, member.cookie)).status).toBe(200);
	});
});

describe('shares, the club library and read-only links', () => {
	it('a club share opens the diagram to members at its level and the library finds it', async () => {
		const owner = await person('Library Owner');
		const member = await person('Library Member');
		const outsider = await person('Library Outsider');
		const clubId = await makeClub(owner, 'Library Club');
		await inviteAndAccept(clubId, owner, member);
		const { diagram } = await vehicleAndDiagram(owner, 'Ombrith', 'Ostrimmel Tourer', '1962', 'Instrument feeds');
		await vehicleAndDiagram(owner, 'Corvell', 'Stanway Six', '1954', 'Not shared');

		expect((await api('GET', `/api/diagrams/${diagram.id}`, member.cookie)).status).toBe(404);
		expect((await form(`/diagrams/${diagram.id}/share?/club`, { clubId, level: 'view' }, owner.cookie)).status).toBe(200);
		expect((await api('GET', `/api/diagrams/${diagram.id}`, member.cookie)).status).toBe(200);
		expect((await api('GET', `/api/diagrams/${diagram.id}`, outsider.cookie)).status).toBe(404);
		// View only: saving is 403 (member can see it), deleting too; the original is untouched.
		const put = await api('PUT', `/api/diagrams/${diagram.id}`, member.cookie, { revision: 1, document: diagram.document });
		expect(put.status).toBe(403);
		expect((await api('DELETE', `/api/diagrams/${diagram.id}`, member.cookie)).status).toBe(403);

		// Library search by make, model, year and title (case-insensitive, parts of words).
		const search = async (q: string) => (await (await get(`/clubs/${clubId}?${q}`, member.cookie)).text()).includes('Instrument feeds');
		expect(await search('make=ombr')).toBe(true);
		expect(await search('model=ostrimmel&year=1962')).toBe(true);
		expect(await search('title=INSTRUMENT')).toBe(true);
		expect(await search('year=1954')).toBe(false);
		expect(await search('make=Corvell')).toBe(false);
		expect(await (await get(`/clubs/${clubId}`, member.cookie)).text()).not.toContain('Not shared');

		// Raise to edit: the member may now save.
		await form(`/diagrams/${diagram.id}/share?/club`, { clubId, level: 'edit' }, owner.cookie);
		expect((await api('PUT', `/api/diagrams/${diagram.id}`, member.cookie, { revision: 1, document: diagram.document })).status).toBe(200);
		// Still only the owner manages shares.
		expect((await get(`/diagrams/${diagram.id}/share`, member.cookie)).status).toBe(403);
	});

	it('shares with a person by e-mail at a level, tells them, and revokes', async () => {
		const owner = await person('Person Owner');
		const friend = await person('Person Friend');
		const { diagram } = await vehicleAndDiagram(owner);
		const bad = await form(`/diagrams/${diagram.id}/share?/person`, { email: 'nobody-here@example.test', level: 'view' }, owner.cookie);
		expect(bad.status).toBe(400);
		expect(await bad.text()).toContain('No Loomwright account uses');

		expect((await form(`/diagrams/${diagram.id}/share?/person`, { email: friend.email, level: 'comment' }, owner.cookie)).status).toBe(200);
		await mailTo(friend.email, /shared “Lighting” with you/);
		expect((await api('GET', `/api/diagrams/${diagram.id}/comments`, friend.cookie)).status).toBe(200);
		expect((await api('PUT', `/api/diagrams/${diagram.id}`, friend.cookie, { revision: 1, document: diagram.document })).status).toBe(403);

		const shared = await (await get('/shared', friend.cookie)).text();
		expect(shared).toContain('Lighting');
		const page = await (await get(`/diagrams/${diagram.id}/share`, owner.cookie)).text();
		const shareId = page.match(/name="shareId" value="([0-9a-f-]{36})"/)![1];
		expect((await form(`/diagrams/${diagram.id}/share?/revoke`, { shareId }, owner.cookie)).status).toBe(200);
		expect((await api('GET', `/api/diagrams/${diagram.id}`, friend.cookie)).status).toBe(404);
	});

	it('a read-only link shows the diagram to anyone, changes nothing, and dies when revoked or expired', async () => {
		const owner = await person('Link Owner');
		const { diagram } = await vehicleAndDiagram(owner);
		const made = await form(`/diagrams/${diagram.id}/share?/link`, { label: 'Club forum', days: '' }, owner.cookie);
		expect(made.status).toBe(200);
		const url = (await made.text()).match(/http:\/\/[^"<\s]+\/s\/([A-Za-z0-9_-]{43})/)!;
		const token = url[1];

		const page = await get(`/s/${token}`);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain('Read-only link');
		expect(html).toContain('Lighting');
		// API reads with the token; writes never.
		expect((await api('GET', `/api/diagrams/${diagram.id}?link=${token}`)).status).toBe(200);
		expect((await api('GET', `/api/diagrams/${diagram.id}/revisions?link=${token}`)).status).toBe(200);
		expect((await api('PUT', `/api/diagrams/${diagram.id}?link=${token}`, undefined, { revision: 1, document: diagram.document })).status).toBe(401);
		// The token opens only its own diagram.
		const { diagram: other } = await vehicleAndDiagram(owner, 'X', 'Y', '1950', 'Other');
		expect((await api('GET', `/api/diagrams/${other.id}?link=${token}`)).status).toBe(401);

		const sharePage = await (await get(`/diagrams/${diagram.id}/share`, owner.cookie)).text();
		const linkId = sharePage.match(/name="linkId" value="([0-9a-f-]{36})"/)![1];
		expect((await form(`/diagrams/${diagram.id}/share?/revokeLink`, { linkId }, owner.cookie)).status).toBe(200);
		expect((await get(`/s/${token}`)).status).toBe(404);
		expect((await api('GET', `/api/diagrams/${diagram.id}?link=${token}`)).status).toBe(401);

		const timed = await form(`/diagrams/${diagram.id}/share?/link`, { label: 'one day', days: '1' }, owner.cookie);
		const t2 = (await timed.text()).match(/\/s\/([A-Za-z0-9_-]{43})/)![1];
		expect((await get(`/s/${t2}`)).status).toBe(200);
		const { shareLinks } = await import('../../src/lib/server/db/schema');
		await db.update(shareLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(shareLinks.label, 'one day'));
		expect((await get(`/s/${t2}`)).status).toBe(404);
		expect((await form(`/diagrams/${diagram.id}/share?/link`, { days: '0' }, owner.cookie)).status).toBe(400);
	});

	it('copies to my garage with "based on … by …, revision N"; the copy is mine to edit and the original is unchanged', async () => {
		const owner = await person('Copy Owner');
		const reader = await person('Copy Reader');
		const { diagram } = await vehicleAndDiagram(owner);
		await form(`/diagrams/${diagram.id}/share?/person`, { email: reader.email, level: 'view' }, owner.cookie);
		// A viewer is not offered what the server would refuse them (loading a document answers 403).
		expect(await (await get(`/diagrams/${diagram.id}`, owner.cookie)).text()).toContain('Load a document file');
		expect(await (await get(`/diagrams/${diagram.id}`, reader.cookie)).text()).not.toContain('Load a document file');
		// Bring the original to revision 2 so the copy names it.
		expect((await api('PUT', `/api/diagrams/${diagram.id}`, owner.cookie, { revision: 1, document: diagram.document })).status).toBe(200);

		const res = await api('POST', `/api/diagrams/${diagram.id}/copy`, reader.cookie, { newVehicleName: 'My Stanway' });
		expect(res.status).toBe(201);
		const copy = (await res.json()).diagram;
		expect(copy.basedOn).toBe('Based on “Lighting” by Copy Owner, revision 2');
		expect(copy.revision).toBe(1);

		const edited = structuredClone(diagram.document);
		edited.wires = edited.wires.slice(1);
		expect((await api('PUT', `/api/diagrams/${copy.id}`, reader.cookie, { revision: 1, document: edited })).status).toBe(200);
		const [original] = await db.select().from(diagramTable).where(eq(diagramTable.id, diagram.id));
		expect(original.revision).toBe(2);
		expect((original.document as { wires: unknown[] }).wires).toHaveLength(diagram.document.wires.length);
		expect((await api('GET', `/api/diagrams/${copy.id}`, owner.cookie)).status).toBe(404);
		expect(await (await get(`/diagrams/${copy.id}`, reader.cookie)).text()).toContain('Based on “Lighting” by Copy Owner, revision 2');
	});
});

describe('comments', () => {
	it('threads comments on the diagram, a part and a wire; commenters only; the owner is told unless they turned it off', async () => {
		const owner = await person('Comment Owner');
		const commenter = await person('Comment Writer');
		const viewer = await person('Comment Viewer');
		const { diagram } = await vehicleAndDiagram(owner);
		await form(`/diagrams/${diagram.id}/share?/person`, { email: commenter.email, level: 'comment' }, owner.cookie);
		await form(`/diagrams/${diagram.id}/share?/person`, { email: viewer.email, level: 'view' }, owner.cookie);
		const part = diagram.document.parts[0].id;
		const wire = diagram.document.wires[0].id;

		const c1 = await api('POST', `/api/diagrams/${diagram.id}/comments`, commenter.cookie, { body: 'The panel lamp earth is on the other side on mine.' });
		expect(c1.status).toBe(201);
		const first = (await c1.json()).comment;
		const notice = await mailTo(owner.email, /Comment Writer commented on “Lighting”/);
		expect(notice.text).toContain('The panel lamp earth is on the other side on mine.');
		expect(notice.text).toContain('the whole diagram');

		expect((await api('POST', `/api/diagrams/${diagram.id}/comments`, commenter.cookie, { body: 'Fuse rating?', target: 'part', targetId: part })).status).toBe(201);
		expect((await api('POST', `/api/diagrams/${diagram.id}/comments`, commenter.cookie, { body: 'Tracer looks black.', target: 'wire', targetId: wire })).status).toBe(201);
		const missing = await api('POST', `/api/diagrams/${diagram.id}/comments`, commenter.cookie, { body: 'x', target: 'wire', targetId: 'no-such-wire' });
		expect(missing.status).toBe(400);
		expect((await missing.json()).issues[0]).toMatchObject({ path: 'targetId' });

		// The owner replies (no mail to themselves).
		const before = await mailCount(owner.email);
		const reply = await api('POST', `/api/diagrams/${diagram.id}/comments`, owner.cookie, { body: 'Thanks, I will check.', parentId: first.id });
		expect(reply.status).toBe(201);
		expect((await reply.json()).comment).toMatchObject({ parentId: first.id, target: 'diagram' });

		const list = (await (await api('GET', `/api/diagrams/${diagram.id}/comments`, owner.cookie)).json()).comments;
		expect(list.map((c: { target: string }) => c.target)).toEqual(['diagram', 'part', 'wire', 'diagram']);

		expect((await api('GET', `/api/diagrams/${diagram.id}/comments`, viewer.cookie)).status).toBe(403);
		expect((await api('POST', `/api/diagrams/${diagram.id}/comments`, viewer.cookie, { body: 'hi' })).status).toBe(403);

		// Turned off: no more mail.
		await form('/account?/notifications', {}, owner.cookie);
		await api('POST', `/api/diagrams/${diagram.id}/comments`, commenter.cookie, { body: 'One more thing.' });
		await new Promise((r) => setTimeout(r, 400));
		expect(await mailCount(owner.email)).toBe(before);
	});
});
