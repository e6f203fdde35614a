// Diagrams and their revision history. Every accepted save bumps the revision and writes a
// diagram_revisions row in one transaction; a save that names an old revision changes nothing.
import { and, desc, eq, sql } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { visibleDiagrams } from '../access';
import { db } from '../db';
import { diagramRevisions, diagrams, users, type Diagram, type Vehicle } from '../db/schema';
import { newDocument, summarise, type DiagramDocument } from '../documents';
import * as pages from '../manual-pages';

export function toJson(d: Diagram, withDocument = false) {
	return {
		id: d.id,
		vehicleId: d.vehicleId,
		title: d.title,
		revision: d.revision,
		createdAt: d.createdAt.toISOString(),
		updatedAt: d.updatedAt.toISOString(),
		summary: summarise(d.document),
		...(withDocument ? { document: d.document as DiagramDocument } : {})
	};
}
export type DiagramJson = ReturnType<typeof toJson>;

/** Diagrams the account can see, optionally of one vehicle, most recently changed first. */
export async function listFor(user: Pick<SessionUser, 'id'>, vehicleId?: string) {
	const rows = await db
		.select()
		.from(diagrams)
		.where(and(visibleDiagrams(user), vehicleId ? eq(diagrams.vehicleId, vehicleId) : undefined))
		.orderBy(desc(diagrams.updatedAt));
	return rows.map((d) => toJson(d));
}

/** A new diagram at revision 1; the creating document is revision 1 of the history. */
export async function create(
	vehicle: Vehicle,
	authorId: string,
	title: string,
	document: DiagramDocument = newDocument(vehicle)
): Promise<Diagram> {
	return db.transaction(async (tx) => {
		const [diagram] = await tx
			.insert(diagrams)
			.values({ vehicleId: vehicle.id, ownerId: vehicle.ownerId, title, document, revision: 1 })
			.returning();
		await tx.insert(diagramRevisions).values({ diagramId: diagram.id, revision: 1, authorId, document });
		return diagram;
	});
}

export async function rename(id: string, title: string): Promise<Diagram> {
	const [diagram] = await db
		.update(diagrams)
		.set({ title, updatedAt: new Date() })
		.where(eq(diagrams.id, id))
		.returning();
	return diagram;
}

export type SaveResult = { ok: true; diagram: Diagram } | { ok: false; currentRevision: number };

/**
 * Saves a new document over `fromRevision`. The conditional UPDATE (… WHERE revision = n) takes
 * the row lock, so of two concurrent saves of revision n exactly one matches; the other sees the
 * row already at n + 1 and gets `ok: false` with the current revision (PostgreSQL re-checks the
 * WHERE clause on the updated row under READ COMMITTED; PostgreSQL manual §13.2.1).
 */
export async function save(
	id: string,
	fromRevision: number,
	document: DiagramDocument,
	authorId: string,
	title?: string
): Promise<SaveResult> {
	return db.transaction(async (tx) => {
		const [diagram] = await tx
			.update(diagrams)
			.set({
				document,
				revision: sql`${diagrams.revision} + 1`,
				updatedAt: new Date(),
				...(title !== undefined ? { title } : {})
			})
			.where(and(eq(diagrams.id, id), eq(diagrams.revision, fromRevision)))
			.returning();
		if (!diagram) {
			const [current] = await tx.select({ revision: diagrams.revision }).from(diagrams).where(eq(diagrams.id, id));
			return { ok: false, currentRevision: current?.revision ?? 0 };
		}
		await tx.insert(diagramRevisions).values({ diagramId: id, revision: diagram.revision, authorId, document });
		return { ok: true, diagram };
	});
}

export async function remove(id: string): Promise<void> {
	// Manual pages: their rows go by cascade, their stored files are deleted here (manual-pages.ts).
	const files = await pages.storageKeysOf([id]);
	await db.delete(diagrams).where(eq(diagrams.id, id));
	await pages.removeFiles(files);
}

/** The latest revisions of a diagram with who saved them, newest first. */
export async function history(id: string, limit = 20) {
	const rows = await db
		.select({ revision: diagramRevisions.revision, author: users.displayName, createdAt: diagramRevisions.createdAt })
		.from(diagramRevisions)
		.leftJoin(users, eq(users.id, diagramRevisions.authorId))
		.where(eq(diagramRevisions.diagramId, id))
		.orderBy(desc(diagramRevisions.revision))
		.limit(limit);
	return rows.map((r) => ({ revision: r.revision, author: r.author ?? 'a deleted account', savedAt: r.createdAt.toISOString() }));
}
