// Scanned manual pages of a diagram: the image in storage, the row in manual_pages. Access is
// decided by the routes (requireDiagram); this module only stores, lists, changes and deletes.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { db } from './db';
import { manualPages, type ManualPage } from './db/schema';
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

/** Stores the file first, then the row; if the row fails the file is removed again. */
export async function add(input: { diagramId: string; ownerId: string; bytes: Uint8Array; contentType: PageImageType; originalName: string }): Promise<ManualPage> {
	const key = `diagrams/${input.diagramId}/pages/${crypto.randomUUID()}`;
	await storage.put(key, input.bytes, input.contentType);
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
		return row;
	} catch (e) {
		await storage.remove([key]).catch(() => undefined);
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

export async function remove(page: ManualPage): Promise<void> {
	await db.delete(manualPages).where(eq(manualPages.id, page.id));
	await storage.remove([page.storageKey]);
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

/** Removes files after their rows are gone; a storage hiccup is logged, never undoes the delete. */
export async function removeFiles(keys: readonly string[]): Promise<void> {
	try {
		await storage.remove(keys);
	} catch (e) {
		console.error('[pages] could not delete stored files', keys.length, e);
	}
}
