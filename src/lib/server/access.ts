// Who may see and change what. Every page and API route asks here; nothing else decides access.
//
// A diagram's owner may do anything with it. Others get a level from shares: to their account,
// or to a club they belong to (the highest share wins): view < comment < edit. A read-only link
// (a token in `?link=` or the `x-loomwright-link` header, or the /s/[token] page) lets anyone
// look at one diagram, never change it. Site admins manage accounts; they get no reach into
// other people's diagrams. Vehicles are never shared: they stay in their owner's garage.
//
// Something a person may not see answers 404, exactly like something that does not exist
// (OWASP ASVS 4.0.3 §4.2.1, insecure direct object references; never reveal that it exists).
// Something they may see but not change at the level asked answers 403.
import { error } from '@sveltejs/kit';
import { and, eq, gt, inArray, isNull, or, type SQL } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { z } from 'zod';
import { hashToken, looksLikeToken } from './auth/tokens';
import { db } from './db';
import {
	clubMembers,
	clubs,
	diagnoses,
	diagramShares,
	diagrams,
	palettes,
	shareLinks,
	vehicles,
	type Club,
	type ClubMember,
	type Diagnosis,
	type Diagram,
	type Palette,
	type ShareLink,
	type Vehicle
} from './db/schema';

/** What a route asks for. 'owner' is for managing shares and deleting. */
export type Level = 'view' | 'comment' | 'edit' | 'owner';
const RANK: Record<Level, number> = { view: 1, comment: 2, edit: 3, owner: 4 };
export function atLeast(have: Level | null | undefined, want: Level): boolean {
	return have != null && RANK[have] >= RANK[want];
}

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;
type Owned = { ownerId: string };

// The level requireDiagram found for a diagram row, so the synchronous checks below (used by
// pages to decide what to offer) agree with it without asking the database again.
const found = new WeakMap<object, { userId: string | null; level: Level }>();

function knownLevel(user: Viewer, item: Owned): Level | null {
	if (user && item.ownerId === user.id) return 'owner';
	const seen = found.get(item);
	if (seen && seen.userId === (user?.id ?? null)) return seen.level;
	return null;
}

export function canView(user: Viewer, item: Owned): boolean {
	return atLeast(knownLevel(user, item), 'view');
}
export function canComment(user: Viewer, item: Owned): boolean {
	return atLeast(knownLevel(user, item), 'comment');
}
export function canEdit(user: Viewer, item: Owned): boolean {
	return atLeast(knownLevel(user, item), 'edit');
}
export function isOwner(user: Viewer, item: Owned): boolean {
	return user !== null && item.ownerId === user.id;
}
export function allows(user: Viewer, item: Owned, level: Level): boolean {
	return atLeast(knownLevel(user, item), level);
}

/** Row filters for lists. A garage lists its owner's own things; shared ones are listed apart. */
export function visibleVehicles(user: Pick<SessionUser, 'id'>): SQL {
	return eq(vehicles.ownerId, user.id);
}
export function visibleDiagrams(user: Pick<SessionUser, 'id'>): SQL {
	return eq(diagrams.ownerId, user.id);
}

/** The clubs an account belongs to, as a subquery. */
function clubsOf(userId: string) {
	return db.select({ id: clubMembers.clubId }).from(clubMembers).where(eq(clubMembers.userId, userId));
}

/** Shares that reach an account: to it directly, or to one of its clubs. */
export function sharesReaching(userId: string): SQL {
	return or(eq(diagramShares.userId, userId), inArray(diagramShares.clubId, clubsOf(userId)))!;
}

/** The account's level on a diagram: owner, the highest share reaching it, or none. */
export async function levelFor(user: Viewer, diagram: Diagram): Promise<Level | null> {
	if (!user) return null;
	if (diagram.ownerId === user.id) return 'owner';
	const rows = await db
		.select({ level: diagramShares.level })
		.from(diagramShares)
		.where(and(eq(diagramShares.diagramId, diagram.id), sharesReaching(user.id)));
	let best: Level | null = null;
	for (const r of rows) if (!best || RANK[r.level] > RANK[best]) best = r.level;
	return best;
}

export const NOT_FOUND = 'Nothing here: it may have been deleted, or it belongs to another account.';
export const SIGN_IN_FIRST = 'Sign in to do that.';
const LEVEL_WORDS: Record<Level, string> = {
	view: 'look at it',
	comment: 'comment on it',
	edit: 'change it',
	owner: 'manage it (only its owner can)'
};

/** The signed-in account, or 401. */
export function requireUser(locals: App.Locals): SessionUser {
	if (!locals.user) error(401, SIGN_IN_FIRST);
	return locals.user;
}

/** Site admins only; everyone else gets 404 so the page's existence stays private. */
export function requireAdmin(locals: App.Locals): SessionUser {
	if (!locals.user || locals.user.role !== 'admin') error(404, NOT_FOUND);
	return locals.user;
}

const id = z.uuid();
const isId = (raw: string) => id.safeParse(raw).success;

export async function requireVehicle(locals: App.Locals, vehicleId: string, level: 'view' | 'edit'): Promise<Vehicle> {
	const user = requireUser(locals);
	// A malformed id cannot name anything: same 404 as a missing one, and no query error.
	if (!isId(vehicleId)) error(404, NOT_FOUND);
	const [vehicle] = await db.select().from(vehicles).where(eq(vehicles.id, vehicleId));
	if (!vehicle || vehicle.ownerId !== user.id) error(404, NOT_FOUND);
	void level;
	return vehicle;
}

/** A palette in the account's own library. Palettes are never shared: another account's is 404. */
export async function requirePalette(locals: App.Locals, paletteId: string): Promise<Palette> {
	const user = requireUser(locals);
	if (!isId(paletteId)) error(404, NOT_FOUND);
	const [palette] = await db.select().from(palettes).where(eq(palettes.id, paletteId));
	if (!palette || palette.ownerId !== user.id) error(404, NOT_FOUND);
	return palette;
}

/** A live read-only link (not revoked, not expired) by its token, or null. */
export async function liveLink(token: string | null | undefined): Promise<ShareLink | null> {
	if (!token || !looksLikeToken(token)) return null;
	const [link] = await db
		.select()
		.from(shareLinks)
		.where(
			and(
				eq(shareLinks.tokenHash, hashToken(token)),
				isNull(shareLinks.revokedAt),
				or(isNull(shareLinks.expiresAt), gt(shareLinks.expiresAt, new Date()))
			)
		);
	return link ?? null;
}

async function diagramRow(diagramId: string) {
	const [row] = await db
		.select({ diagram: diagrams, vehicle: vehicles })
		.from(diagrams)
		.innerJoin(vehicles, eq(vehicles.id, diagrams.vehicleId))
		.where(eq(diagrams.id, diagramId));
	return row;
}

/**
 * The diagram, when the request may use it at `level`; otherwise 401 (no account and no link),
 * 404 (cannot see it) or 403 (can see it, but not at this level).
 */
export async function requireDiagram(
	locals: App.Locals,
	diagramId: string,
	level: Level
): Promise<{ diagram: Diagram; vehicle: Vehicle; level: Level }> {
	const user = locals.user;
	const token = locals.linkToken ?? null;
	if (!user && !token) error(401, SIGN_IN_FIRST);
	if (!isId(diagramId)) error(404, NOT_FOUND);
	const row = await diagramRow(diagramId);
	if (!row) error(404, NOT_FOUND);
	let have = await levelFor(user, row.diagram);
	if (!atLeast(have, 'view') && token) {
		const link = await liveLink(token);
		if (link && link.diagramId === row.diagram.id) have = 'view';
	}
	if (!have) error(user ? 404 : 401, user ? NOT_FOUND : SIGN_IN_FIRST);
	if (!atLeast(have, level)) {
		if (!user) error(401, SIGN_IN_FIRST);
		error(403, `You may look at this diagram but not ${LEVEL_WORDS[level]}.`);
	}
	found.set(row.diagram, { userId: user?.id ?? null, level: have });
	return { ...row, level: have };
}

/**
 * A diagnosis, reached through its diagram: looking at it needs view on the diagram, taking
 * readings or concluding needs edit, deleting it (the vehicle's record) is the owner's. Read-only links do not reach diagnoses (they show one
 * drawing, not the owner's fault hunts), so a signed-in account is required.
 */
export async function requireDiagnosis(
	locals: App.Locals,
	diagnosisId: string,
	level: 'view' | 'edit' | 'owner'
): Promise<{ diagnosis: Diagnosis; diagram: Diagram; vehicle: Vehicle; level: Level }> {
	requireUser(locals);
	if (!isId(diagnosisId)) error(404, NOT_FOUND);
	const [diagnosis] = await db.select().from(diagnoses).where(eq(diagnoses.id, diagnosisId));
	if (!diagnosis) error(404, NOT_FOUND);
	const { diagram, vehicle, level: have } = await requireDiagram({ ...locals, linkToken: null }, diagnosis.diagramId, level);
	return { diagnosis, diagram, vehicle, level: have };
}

/** The diagram behind a read-only link, for the /s/[token] page and its API; 404 when dead. */
export async function requireLink(token: string): Promise<{ diagram: Diagram; vehicle: Vehicle; link: ShareLink }> {
	const link = await liveLink(token);
	if (!link) error(404, NOT_FOUND);
	const row = await diagramRow(link.diagramId);
	if (!row) error(404, NOT_FOUND);
	found.set(row.diagram, { userId: null, level: 'view' });
	return { ...row, link };
}

export type ClubLevel = 'member' | 'organiser';

/** The club, when the account belongs to it (and organises it, if asked); 404 to outsiders. */
export async function requireClub(
	locals: App.Locals,
	clubId: string,
	level: ClubLevel
): Promise<{ club: Club; membership: ClubMember }> {
	const user = requireUser(locals);
	if (!isId(clubId)) error(404, NOT_FOUND);
	const [row] = await db
		.select({ club: clubs, membership: clubMembers })
		.from(clubs)
		.innerJoin(clubMembers, and(eq(clubMembers.clubId, clubs.id), eq(clubMembers.userId, user.id)))
		.where(eq(clubs.id, clubId));
	if (!row) error(404, NOT_FOUND);
	if (level === 'organiser' && row.membership.role !== 'organiser') error(403, 'Only the club’s organiser can do that.');
	return row;
}
