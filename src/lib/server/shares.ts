// Shares of a diagram with people and clubs, read-only links, and copies into one's own garage.
// Access is decided by access.ts before these are called.
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { sharesReaching } from './access';
import { normaliseEmail } from './auth/email';
import { hashToken, newToken } from './auth/tokens';
import { db } from './db';
import { clubMembers, clubs, diagramShares, diagrams, shareLinks, users, vehicles, type Diagram, type Vehicle } from './db/schema';
import * as store from './garage/diagrams';
import * as mail from './mail';

export type ShareLevel = 'view' | 'comment' | 'edit';
export const LEVEL_NAMES: Record<ShareLevel, string> = { view: 'view', comment: 'comment on', edit: 'edit' };

export async function list(diagramId: string) {
	const rows = await db
		.select({
			id: diagramShares.id,
			level: diagramShares.level,
			userName: users.displayName,
			userEmail: users.email,
			clubId: clubs.id,
			clubName: clubs.name
		})
		.from(diagramShares)
		.leftJoin(users, eq(users.id, diagramShares.userId))
		.leftJoin(clubs, eq(clubs.id, diagramShares.clubId))
		.where(eq(diagramShares.diagramId, diagramId))
		.orderBy(diagramShares.createdAt);
	return rows;
}

export type ShareResult = { ok: true; message: string } | { ok: false; field: string; message: string };

/** Shares with the account that has this e-mail address (creating or changing the level). */
export async function withPerson(diagram: Diagram, owner: Pick<SessionUser, 'id' | 'displayName'>, emailInput: string, level: ShareLevel): Promise<ShareResult> {
	const email = normaliseEmail(emailInput);
	const [person] = await db.select().from(users).where(eq(users.email, email));
	if (!person) {
		return { ok: false, field: 'email', message: `No Loomwright account uses ${email}. Ask them to make one first, or invite them to your club.` };
	}
	if (person.id === diagram.ownerId) return { ok: false, field: 'email', message: 'That is the diagram’s owner.' };
	await db
		.insert(diagramShares)
		.values({ diagramId: diagram.id, userId: person.id, level })
		.onConflictDoUpdate({ target: [diagramShares.diagramId, diagramShares.userId], set: { level } });
	await mail.diagramShared(person.email, owner.displayName, diagram.title, LEVEL_NAMES[level], mail.link(`/diagrams/${diagram.id}`));
	return { ok: true, message: `Shared with ${person.displayName} (${email}): they may ${LEVEL_NAMES[level]} it.` };
}

/** Shares with a club the owner belongs to. */
export async function withClub(diagram: Diagram, ownerId: string, clubId: string, level: ShareLevel): Promise<ShareResult> {
	const [club] = await db
		.select({ id: clubs.id, name: clubs.name })
		.from(clubs)
		.innerJoin(clubMembers, and(eq(clubMembers.clubId, clubs.id), eq(clubMembers.userId, ownerId)))
		.where(eq(clubs.id, clubId));
	if (!club) return { ok: false, field: 'clubId', message: 'Choose one of your clubs.' };
	await db
		.insert(diagramShares)
		.values({ diagramId: diagram.id, clubId: club.id, level })
		.onConflictDoUpdate({ target: [diagramShares.diagramId, diagramShares.clubId], set: { level } });
	return { ok: true, message: `Shared with the club ${club.name}: its members may ${LEVEL_NAMES[level]} it.` };
}

export async function revoke(diagramId: string, shareId: string): Promise<boolean> {
	const gone = await db
		.delete(diagramShares)
		.where(and(eq(diagramShares.diagramId, diagramId), eq(diagramShares.id, shareId)))
		.returning({ id: diagramShares.id });
	return gone.length > 0;
}

/** Diagrams shared with the account, directly or through its clubs (highest level first). */
export async function sharedWith(userId: string) {
	const rows = await db
		.select({
			id: diagrams.id,
			title: diagrams.title,
			revision: diagrams.revision,
			level: diagramShares.level,
			clubName: clubs.name,
			owner: users.displayName,
			make: vehicles.make,
			model: vehicles.model,
			year: vehicles.year
		})
		.from(diagramShares)
		.innerJoin(diagrams, eq(diagrams.id, diagramShares.diagramId))
		.innerJoin(vehicles, eq(vehicles.id, diagrams.vehicleId))
		.innerJoin(users, eq(users.id, diagrams.ownerId))
		.leftJoin(clubs, eq(clubs.id, diagramShares.clubId))
		.where(and(sharesReaching(userId), sql`${diagrams.ownerId} <> ${userId}`))
		.orderBy(desc(diagrams.updatedAt));
	// One line per diagram, at the highest level that reaches the account.
	const rank = { view: 1, comment: 2, edit: 3 } as const;
	const best = new Map<string, (typeof rows)[number]>();
	for (const r of rows) {
		const seen = best.get(r.id);
		if (!seen || rank[r.level] > rank[seen.level]) best.set(r.id, r);
	}
	return [...best.values()];
}

export async function links(diagramId: string) {
	return db
		.select({ id: shareLinks.id, label: shareLinks.label, expiresAt: shareLinks.expiresAt, createdAt: shareLinks.createdAt })
		.from(shareLinks)
		.where(and(eq(shareLinks.diagramId, diagramId), isNull(shareLinks.revokedAt)))
		.orderBy(desc(shareLinks.createdAt));
}

/** A new read-only link; the token is returned once and only its hash is kept. */
export async function createLink(diagramId: string, label: string, expiresAt: Date | null): Promise<string> {
	const token = newToken();
	await db.insert(shareLinks).values({ diagramId, tokenHash: hashToken(token), label, expiresAt });
	return token;
}

export async function revokeLink(diagramId: string, linkId: string): Promise<boolean> {
	const done = await db
		.update(shareLinks)
		.set({ revokedAt: new Date() })
		.where(and(eq(shareLinks.diagramId, diagramId), eq(shareLinks.id, linkId), isNull(shareLinks.revokedAt)))
		.returning({ id: shareLinks.id });
	return done.length > 0;
}

/**
 * Copies a diagram into one of the account's own vehicles (or a new vehicle with the source's
 * make, model, year, voltage and earth). The copy starts at revision 1 and remembers
 * "based on <title> by <owner>, revision N".
 */
export async function copyToGarage(
	source: Diagram,
	sourceVehicle: Vehicle,
	user: Pick<SessionUser, 'id'>,
	target: { vehicleId: string } | { newVehicleName: string },
	title: string
): Promise<{ ok: true; diagram: Diagram } | { ok: false; message: string }> {
	let vehicle: Vehicle | undefined;
	if ('vehicleId' in target) {
		[vehicle] = await db.select().from(vehicles).where(and(eq(vehicles.id, target.vehicleId), eq(vehicles.ownerId, user.id)));
		if (!vehicle) return { ok: false, message: 'Choose one of your own vehicles.' };
	} else {
		[vehicle] = await db
			.insert(vehicles)
			.values({
				ownerId: user.id,
				name: target.newVehicleName,
				make: sourceVehicle.make,
				model: sourceVehicle.model,
				year: sourceVehicle.year,
				systemVoltage: sourceVehicle.systemVoltage,
				earthPolarity: sourceVehicle.earthPolarity
			})
			.returning();
	}
	const [owner] = await db.select({ name: users.displayName }).from(users).where(eq(users.id, source.ownerId));
	const copy = await store.create(vehicle, user.id, title, source.document as Record<string, unknown>);
	const [marked] = await db
		.update(diagrams)
		.set({ basedOnId: source.id, basedOnTitle: source.title, basedOnOwner: owner?.name ?? 'a deleted account', basedOnRevision: source.revision })
		.where(eq(diagrams.id, copy.id))
		.returning();
	return { ok: true, diagram: marked };
}

export function basedOn(d: Diagram): string | null {
	if (!d.basedOnTitle) return null;
	return `Based on “${d.basedOnTitle}” by ${d.basedOnOwner}, revision ${d.basedOnRevision}`;
}
