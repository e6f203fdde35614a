// Vehicles in a garage: the rows and their JSON form. Access is decided by ../access.ts.
import { count, desc, eq } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { visibleVehicles } from '../access';
import { db } from '../db';
import { diagrams, vehicles, type Vehicle } from '../db/schema';
import type { VehicleInput } from '../forms';
import * as pages from '../manual-pages';

export type VehicleJson = ReturnType<typeof toJson>;
export type SharedVehicleJson = ReturnType<typeof sharedJson>;

/** The whole vehicle, notes included: for its owner only (the garage, the owner's API). */
export function toJson(v: Vehicle) {
	return {
		...sharedJson(v),
		notes: v.notes,
		createdAt: v.createdAt.toISOString(),
		updatedAt: v.updatedAt.toISOString()
	};
}

/**
 * What someone a diagram is shared with (viewer, commenter, editor, club member) sees of its
 * vehicle: the facts the drawing depends on, named field by field so that a column added to the
 * table later stays private until it is listed here. The owner's notes are never in it.
 */
export function sharedJson(v: Vehicle) {
	return {
		id: v.id,
		name: v.name,
		make: v.make,
		model: v.model,
		year: v.year,
		systemVoltage: v.systemVoltage,
		earthPolarity: v.earthPolarity
	};
}

/** The vehicle in the shape its audience may see: everything for its owner, the shared shape for anyone else. */
export function forViewer(v: Vehicle, viewer: { id: string } | null | undefined): (SharedVehicleJson & { notes?: string }) | VehicleJson {
	return viewer && v.ownerId === viewer.id ? toJson(v) : sharedJson(v);
}

/** The account's vehicles, newest first, each with how many diagrams it has. */
export async function listFor(user: Pick<SessionUser, 'id'>) {
	const rows = await db
		.select({ vehicle: vehicles, diagrams: count(diagrams.id) })
		.from(vehicles)
		.leftJoin(diagrams, eq(diagrams.vehicleId, vehicles.id))
		.where(visibleVehicles(user))
		.groupBy(vehicles.id)
		.orderBy(desc(vehicles.createdAt));
	return rows.map((r) => ({ ...toJson(r.vehicle), diagramCount: r.diagrams }));
}

export async function create(ownerId: string, input: VehicleInput): Promise<Vehicle> {
	const [vehicle] = await db.insert(vehicles).values({ ...input, ownerId }).returning();
	return vehicle;
}

export async function update(id: string, input: Partial<VehicleInput>): Promise<Vehicle> {
	const [vehicle] = await db
		.update(vehicles)
		.set({ ...input, updatedAt: new Date() })
		.where(eq(vehicles.id, id))
		.returning();
	return vehicle;
}

/** Deletes the vehicle and, through the foreign keys, its diagrams and their revisions. */
export async function remove(id: string): Promise<void> {
	// The vehicle's diagrams go by cascade; their manual pages' stored files are deleted here.
	const files = await pages.storageKeysOf((await db.select({ id: diagrams.id }).from(diagrams).where(eq(diagrams.vehicleId, id))).map((d) => d.id));
	await db.delete(vehicles).where(eq(vehicles.id, id));
	await pages.removeFiles(files);
}
