// Who may see and change what. Every route asks here; nothing else decides access.
//
// Today a vehicle and its diagrams belong to one owner. Clubs and shares will widen `canView` /
// `canEdit` (and the `visible*` filters) without the routes changing. Something a person may not
// see answers 404, exactly like something that does not exist (OWASP ASVS 4.0.3 §4.2.1, insecure
// direct object references; never reveal that it exists).
import { error } from '@sveltejs/kit';
import { and, eq, type SQL } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { z } from 'zod';
import { db } from './db';
import { diagrams, vehicles, type Diagram, type Vehicle } from './db/schema';

export type Level = 'view' | 'edit';
type Viewer = Pick<SessionUser, 'id' | 'role'> | null;
type Owned = { ownerId: string };

export function canView(user: Viewer, item: Owned): boolean {
	return user !== null && item.ownerId === user.id;
}

export function canEdit(user: Viewer, item: Owned): boolean {
	return user !== null && item.ownerId === user.id;
}

export function allows(user: Viewer, item: Owned, level: Level): boolean {
	return level === 'edit' ? canEdit(user, item) : canView(user, item);
}

/** Row filters for lists, matching canView. */
export function visibleVehicles(user: Pick<SessionUser, 'id'>): SQL {
	return eq(vehicles.ownerId, user.id);
}
export function visibleDiagrams(user: Pick<SessionUser, 'id'>): SQL {
	return eq(diagrams.ownerId, user.id);
}

export const NOT_FOUND = 'Nothing here: it may have been deleted, or it belongs to another account.';
export const SIGN_IN_FIRST = 'Sign in to do that.';

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

export async function requireVehicle(locals: App.Locals, vehicleId: string, level: Level): Promise<Vehicle> {
	const user = requireUser(locals);
	// A malformed id cannot name anything: same 404 as a missing one, and no query error.
	if (!id.safeParse(vehicleId).success) error(404, NOT_FOUND);
	const [vehicle] = await db.select().from(vehicles).where(eq(vehicles.id, vehicleId));
	if (!vehicle || !allows(user, vehicle, level)) error(404, NOT_FOUND);
	return vehicle;
}

export async function requireDiagram(
	locals: App.Locals,
	diagramId: string,
	level: Level
): Promise<{ diagram: Diagram; vehicle: Vehicle }> {
	const user = requireUser(locals);
	if (!id.safeParse(diagramId).success) error(404, NOT_FOUND);
	const [row] = await db
		.select({ diagram: diagrams, vehicle: vehicles })
		.from(diagrams)
		.innerJoin(vehicles, eq(vehicles.id, diagrams.vehicleId))
		.where(and(eq(diagrams.id, diagramId)));
	if (!row || !allows(user, row.diagram, level)) error(404, NOT_FOUND);
	return row;
}
