// Scanned manual pages of a diagram: the image in storage, the row in manual_pages. Access is
// decided by the routes (requireDiagram); this module only stores, lists, changes and deletes.
import { and, asc, eq, inArray, lt, sql } from 'drizzle-orm';
import { db } from './db';
import { manualPages, storageOrphans, type ManualPage } from './db/schema';
import * as storage from './storage';
import type { PageImageType } from '../harness-io/images';

export function toJson(p: ManualPage) {
	return {
		id: p.id,
		diagramId: p.diagramId,
		contentType: p.contentType,
		byteSize: p.byteSize,
		originalName: p.originalName,
		pageOrder: p.pageOrder,
		tracing: { opacity: p.opacity, scale: p.scale, offsetX: p.offsetX, offsetY: p.offsetY, locked: p.locked },
		createdAt: p.createdAt.toISOString(),
		/** Served only through the authorised route. */
		url: `/api/diagrams/${p.diagramId}/pages/${p.id}`
	};
}
export type ManualPageJson = ReturnType<typeof toJson>;

export async function list(diagramId: string): Promise<ManualPage[]> {
	return db.select().from(manualPages).where(eq(manualPages.diagramId, diagramId)).orderBy(asc(manualPages.pageOrder), asc(manualPages.createdAt));
}

export async function find(diagramId: string, pageId: string): Promise<ManualPage | null> {
	const [row] = await db.select().from(manualPages).where(and(eq(manualPages.diagramId, diagramId), eq(manualPages.id, pageId)));
	return row ?? null;
}

/**
 * Stores the file first, then the row. If the store fails or stalls (the upload may still land
 * later), or the row cannot be written, the file is removed again or, failing that, recorded as
 * an orphan for the clean-up: nothing is left behind unrecorded.
 */
export async function add(input: { diagramId: string; ownerId: string; bytes: Uint8Array; contentType: PageImageType; originalName: string }): Promise<ManualPage> {
	const key = `diagrams/${input.diagramId}/pages/${crypto.randomUUID()}`;
	try {
		await storage.put(key, input.bytes, input.contentType);
	} catch (e) {
		// The store did not answer in time: asking it to delete would wait as long again.
		await record(key);
		throw e;
	}
	try {
		const [{ next }] = await db
			.select({ next: sql<number>`coalesce(max(${manualPages.pageOrder}) + 1, 0)::int` })
			.from(manualPages)
			.where(eq(manualPages.diagramId, input.diagramId));
		const [row] = await db
			.insert(manualPages)
			.values({
				diagramId: input.diagramId,
				ownerId: input.ownerId,
				storageKey: key,
				contentType: input.contentType,
				byteSize: input.bytes.byteLength,
				originalName: input.originalName.slice(0, 200),
				pageOrder: next
			})
			.returning();
		void sweepOrphans();
		return row;
	} catch (e) {
		await removeFiles([key]);
		throw e;
	}
}

export type TracingPatch = Partial<{ opacity: number; scale: number; offsetX: number; offsetY: number; locked: boolean; pageOrder: number }>;

export async function update(pageId: string, patch: TracingPatch): Promise<ManualPage> {
	const [row] = await db.update(manualPages).set(patch).where(eq(manualPages.id, pageId)).returning();
	return row;
}

/** The image bytes of a page, or null if the file has gone. */
export async function bytesOf(page: ManualPage): Promise<Uint8Array | null> {
	return storage.get(page.storageKey);
}

/** The file first, then the row: with the store away the answer is a 503 and nothing has changed. */
export async function remove(page: ManualPage): Promise<void> {
	await storage.remove([page.storageKey]);
	await db.delete(manualPages).where(eq(manualPages.id, page.id));
}

/**
 * The storage keys of every page of some diagrams, read before the diagrams are deleted (the
 * rows go with them by ON DELETE CASCADE; the files must be removed by hand).
 */
export async function storageKeysOf(diagramIds: readonly string[]): Promise<string[]> {
	if (!diagramIds.length) return [];
	const rows = await db.select({ key: manualPages.storageKey }).from(manualPages).where(inArray(manualPages.diagramId, [...diagramIds]));
	return rows.map((r) => r.key);
}

/** Removes files no row points to (any more); those the store does not take now are recorded as orphans, never undoing a delete. */
export async function removeFiles(keys: readonly string[]): Promise<void> {
	let away = false;
	for (const key of keys) {
		// Once the store has not answered, the rest are recorded without waiting on it again.
		if (away) {
			await record(key);
			continue;
		}
		try {
			await storage.remove([key]);
		} catch (e) {
			console.error('[pages] stored file kept for the clean-up', key, e instanceof Error ? e.message : e);
			away = true;
			await record(key);
		}
	}
}

/** Records a file no row points to, for the clean-up. */
async function record(key: string): Promise<void> {
	await db
		.insert(storageOrphans)
		.values({ storageKey: key })
		.onConflictDoNothing()
		.catch((dbError) => console.error('[pages] could not record an orphaned file', key, dbError));
}

/** How old an orphan's record must be before the clean-up removes it: a stalled upload may still land meanwhile (invented: 10 min). */
export const ORPHAN_AGE_MS = 10 * 60_000;

/**
 * The clean-up: removes recorded orphans older than ORPHAN_AGE_MS (again, so a stalled upload
 * that landed late goes too) and their records; run after a page is stored, when the store has
 * just answered. Returns how many were removed.
 */
export async function sweepOrphans(olderThanMs = ORPHAN_AGE_MS): Promise<number> {
	try {
		const due = await db
			.select({ key: storageOrphans.storageKey })
			.from(storageOrphans)
			.where(lt(storageOrphans.recordedAt, new Date(Date.now() - olderThanMs)))
			.limit(100);
		let removed = 0;
		for (const { key } of due) {
			await storage.remove([key]);
			await db.delete(storageOrphans).where(eq(storageOrphans.storageKey, key));
			removed++;
		}
		return removed;
	} catch (e) {
		console.error('[pages] clean-up of orphaned files stopped', e instanceof Error ? e.message : e);
		return 0;
	}
}
