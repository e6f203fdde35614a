// Clubs: their members, the organiser role, invitations by e-mail, and the club library (the
// diagrams shared with the club). Access is decided by access.ts before these are called.
import { and, asc, desc, eq, gt, ilike, or, sql } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { z } from 'zod';
import { normaliseEmail } from './auth/email';
import { hashToken, looksLikeToken, newToken } from './auth/tokens';
import { db } from './db';
import { clubInvitations, clubMembers, clubs, diagramShares, diagrams, users, vehicles, type Club } from './db/schema';
import * as mail from './mail';

export const clubFields = z.object({
	name: z.string({ error: 'Name the club.' }).trim().min(1, 'Name the club.').max(80, 'A club name can be at most 80 characters.'),
	description: z.string().trim().max(2000, 'The description can be at most 2000 characters.').default('')
});

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

export async function create(user: Pick<SessionUser, 'id'>, name: string, description: string): Promise<Club> {
	return db.transaction(async (tx) => {
		const [club] = await tx.insert(clubs).values({ name, description }).returning();
		await tx.insert(clubMembers).values({ clubId: club.id, userId: user.id, role: 'organiser' });
		return club;
	});
}

/**
 * Ends a club: its memberships, invitations and shares go with it (foreign keys cascade); the
 * diagrams shared with it stay in their owners' garages, as they were.
 */
export async function remove(clubId: string): Promise<void> {
	await db.delete(clubs).where(eq(clubs.id, clubId));
}

export async function update(clubId: string, name: string, description: string): Promise<void> {
	await db.update(clubs).set({ name, description }).where(eq(clubs.id, clubId));
}

/** The clubs an account belongs to, with its role and the member count. */
export async function listFor(userId: string) {
	const rows = await db
		.select({
			id: clubs.id,
			name: clubs.name,
			description: clubs.description,
			role: clubMembers.role,
			members: sql<number>`(select count(*)::int from ${clubMembers} m where m.club_id = ${clubs.id})`
		})
		.from(clubs)
		.innerJoin(clubMembers, and(eq(clubMembers.clubId, clubs.id), eq(clubMembers.userId, userId)))
		.orderBy(asc(clubs.name));
	return rows;
}

export async function members(clubId: string) {
	return db
		.select({ userId: users.id, displayName: users.displayName, email: users.email, role: clubMembers.role, joinedAt: clubMembers.joinedAt })
		.from(clubMembers)
		.innerJoin(users, eq(users.id, clubMembers.userId))
		.where(eq(clubMembers.clubId, clubId))
		.orderBy(desc(sql`${clubMembers.role} = 'organiser'`), asc(users.displayName));
}

export async function pendingInvitations(clubId: string) {
	return db
		.select({ id: clubInvitations.id, email: clubInvitations.email, expiresAt: clubInvitations.expiresAt })
		.from(clubInvitations)
		.where(and(eq(clubInvitations.clubId, clubId), eq(clubInvitations.status, 'pending'), gt(clubInvitations.expiresAt, new Date())))
		.orderBy(desc(clubInvitations.createdAt));
}

export type InviteResult = { ok: true } | { ok: false; message: string };

export async function invite(club: Club, inviter: Pick<SessionUser, 'id' | 'displayName'>, emailInput: string): Promise<InviteResult> {
	const email = normaliseEmail(emailInput);
	const [already] = await db
		.select({ id: users.id })
		.from(clubMembers)
		.innerJoin(users, eq(users.id, clubMembers.userId))
		.where(and(eq(clubMembers.clubId, club.id), eq(users.email, email)));
	if (already) return { ok: false, message: `${email} is already a member of ${club.name}.` };
	const token = newToken();
	await db.insert(clubInvitations).values({
		clubId: club.id,
		email,
		tokenHash: hashToken(token),
		invitedBy: inviter.id,
		expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS)
	});
	const sent = await mail.clubInvitation(email, club.name, inviter.displayName, mail.link(`/invitations/${token}`));
	return sent ? { ok: true } : { ok: false, message: 'The invitation was saved but the e-mail could not be sent. Try again later.' };
}

export async function cancelInvitation(clubId: string, invitationId: string): Promise<void> {
	await db.delete(clubInvitations).where(and(eq(clubInvitations.clubId, clubId), eq(clubInvitations.id, invitationId)));
}

/** A pending, unexpired invitation by its link token, with its club; null otherwise. */
export async function invitationByToken(token: string) {
	if (!looksLikeToken(token)) return null;
	const [row] = await db
		.select({ invitation: clubInvitations, club: clubs, inviter: users.displayName })
		.from(clubInvitations)
		.innerJoin(clubs, eq(clubs.id, clubInvitations.clubId))
		.leftJoin(users, eq(users.id, clubInvitations.invitedBy))
		.where(
			and(eq(clubInvitations.tokenHash, hashToken(token)), eq(clubInvitations.status, 'pending'), gt(clubInvitations.expiresAt, new Date()))
		);
	return row ?? null;
}

/**
 * Accepts or declines: the status changes only from pending (one conditional UPDATE), so a link
 * works once even when clicked twice at the same moment.
 */
export async function answer(invitationId: string, userId: string, accept: boolean): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [inv] = await tx
			.update(clubInvitations)
			.set({ status: accept ? 'accepted' : 'declined' })
			.where(and(eq(clubInvitations.id, invitationId), eq(clubInvitations.status, 'pending'), gt(clubInvitations.expiresAt, new Date())))
			.returning();
		if (!inv) return false;
		if (accept) await tx.insert(clubMembers).values({ clubId: inv.clubId, userId, role: 'member' }).onConflictDoNothing();
		return true;
	});
}

/** Removes a member (or the member themselves, leaving). An organiser must hand the role on first. */
export async function removeMember(clubId: string, userId: string): Promise<{ ok: boolean; message?: string }> {
	const [m] = await db.select().from(clubMembers).where(and(eq(clubMembers.clubId, clubId), eq(clubMembers.userId, userId)));
	if (!m) return { ok: false, message: 'That person is not a member.' };
	if (m.role === 'organiser') return { ok: false, message: 'The organiser cannot leave or be removed: hand the organiser role to another member first.' };
	await db.delete(clubMembers).where(and(eq(clubMembers.clubId, clubId), eq(clubMembers.userId, userId)));
	return { ok: true };
}

/** Hands the organiser role to another member; the old organiser stays a member. */
export async function handOver(clubId: string, fromUserId: string, toUserId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [to] = await tx
			.update(clubMembers)
			.set({ role: 'organiser' })
			.where(and(eq(clubMembers.clubId, clubId), eq(clubMembers.userId, toUserId)))
			.returning();
		if (!to || toUserId === fromUserId) return false;
		await tx.update(clubMembers).set({ role: 'member' }).where(and(eq(clubMembers.clubId, clubId), eq(clubMembers.userId, fromUserId)));
		return true;
	});
}

export interface LibraryQuery {
	make?: string;
	model?: string;
	year?: string;
	title?: string;
}

const like = (s: string) => `%${s.replace(/[\\%_]/g, (c) => '\\' + c)}%`;

/** The diagrams shared with the club, filtered by vehicle make, model, year and title. */
export async function library(clubId: string, q: LibraryQuery) {
	const filters = [eq(diagramShares.clubId, clubId)];
	if (q.make) filters.push(ilike(vehicles.make, like(q.make)));
	if (q.model) filters.push(ilike(vehicles.model, like(q.model)));
	if (q.year) filters.push(ilike(vehicles.year, like(q.year)));
	if (q.title) filters.push(or(ilike(diagrams.title, like(q.title)))!);
	return db
		.select({
			id: diagrams.id,
			title: diagrams.title,
			revision: diagrams.revision,
			level: diagramShares.level,
			make: vehicles.make,
			model: vehicles.model,
			year: vehicles.year,
			owner: users.displayName,
			updatedAt: diagrams.updatedAt
		})
		.from(diagramShares)
		.innerJoin(diagrams, eq(diagrams.id, diagramShares.diagramId))
		.innerJoin(vehicles, eq(vehicles.id, diagrams.vehicleId))
		.innerJoin(users, eq(users.id, diagrams.ownerId))
		.where(and(...filters))
		.orderBy(asc(vehicles.make), asc(vehicles.model), asc(diagrams.title));
}
