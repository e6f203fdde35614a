// Reading a diagram's revision history and restoring an old revision. Restoring never rewrites
// history: it saves the old document as a new revision, through the same revision check as any
// save (garage/diagrams.save), so a restore over someone else's newer save is refused with 409.
import { and, desc, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { diagramRevisions, users, type Diagram } from '$lib/server/db/schema';
import * as diagrams from '$lib/server/garage/diagrams';
import { parseDocument } from '$lib/circuit/schema';
import { changeSummary, documentChanges } from '$lib/editor/changes';

/** `summary`: what the revision changed against the one before, in one line (changes.ts). */
export type RevisionListing = { revision: number; author: string | null; createdAt: string; summary: string };

export async function list(diagramId: string): Promise<RevisionListing[]> {
	const rows = await db
		.select({ revision: diagramRevisions.revision, author: users.displayName, createdAt: diagramRevisions.createdAt, document: diagramRevisions.document })
		.from(diagramRevisions)
		.leftJoin(users, eq(users.id, diagramRevisions.authorId))
		.where(eq(diagramRevisions.diagramId, diagramId))
		.orderBy(desc(diagramRevisions.revision));
	// Newest first: each row's "before" is the next row (the revision numbered one less).
	const parsed = rows.map((r) => parseDocument(r.document));
	return rows.map((r, i) => {
		const after = parsed[i];
		const before = rows[i + 1]?.revision === r.revision - 1 ? parsed[i + 1] : null;
		const summary = !before ? changeSummary(null) : before.ok && after.ok ? changeSummary(documentChanges(before.document, after.document)) : 'A document that no longer opens';
		return { revision: r.revision, author: r.author, createdAt: r.createdAt.toISOString(), summary };
	});
}

export async function one(diagramId: string, revision: number) {
	const [row] = await db
		.select({ revision: diagramRevisions.revision, author: users.displayName, createdAt: diagramRevisions.createdAt, document: diagramRevisions.document })
		.from(diagramRevisions)
		.leftJoin(users, eq(users.id, diagramRevisions.authorId))
		.where(and(eq(diagramRevisions.diagramId, diagramId), eq(diagramRevisions.revision, revision)));
	return row ? { revision: row.revision, author: row.author, createdAt: row.createdAt.toISOString(), document: row.document } : null;
}

/** Parses the revision number from the path; null for anything that is not a whole number from 1. */
export function revisionNumber(raw: string): number | null {
	return /^[1-9]\d{0,8}$/.test(raw) ? Number(raw) : null;
}

export type RestoreResult =
	| { ok: true; diagram: Diagram }
	| { ok: false; reason: 'missing' }
	| { ok: false; reason: 'stale'; currentRevision: number };

/** Saves revision `revision`'s document as the new current revision, if `fromRevision` is still current. */
export async function restore(diagramId: string, revision: number, fromRevision: number, authorId: string): Promise<RestoreResult> {
	const old = await one(diagramId, revision);
	if (!old) return { ok: false, reason: 'missing' };
	const saved = await diagrams.save(diagramId, fromRevision, old.document as Record<string, unknown>, authorId);
	if (!saved.ok) return { ok: false, reason: 'stale', currentRevision: saved.currentRevision };
	return { ok: true, diagram: saved.diagram };
}
