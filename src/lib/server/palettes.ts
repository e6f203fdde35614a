// The account's own palette library: rows in `palettes`, their JSON form, and the checks on a
// name or a list of colours. Access (whose palette it is) is decided by ./access.ts.
import { asc, eq } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { PaletteInputSchema, type PaletteInput } from '$lib/editor/palette-input';
import { db } from './db';
import { palettes, type Palette } from './db/schema';

export { PaletteInputSchema };

/** Thrown when the account already has a palette of that name (the unique (owner, name) index). */
export class NameTaken extends Error {
	constructor(readonly name: string) {
		super(`You already have a palette named “${name}”. Choose another name.`);
	}
}

export function toJson(p: Palette) {
	// The column is written only through PaletteInputSchema, so its shape is known.
	const colours = p.colours as PaletteInput['colours'];
	return {
		id: p.id,
		name: p.name,
		colours,
		createdAt: p.createdAt.toISOString(),
		updatedAt: p.updatedAt.toISOString()
	};
}
export type PaletteJson = ReturnType<typeof toJson>;

/** The account's palettes, by name. */
export async function listFor(user: Pick<SessionUser, 'id'>): Promise<PaletteJson[]> {
	const rows = await db.select().from(palettes).where(eq(palettes.ownerId, user.id)).orderBy(asc(palettes.name));
	return rows.map(toJson);
}

const isNameClash = (e: unknown) => {
	const code = (x: unknown) => (x && typeof x === 'object' && 'code' in x ? (x as { code: unknown }).code : undefined);
	return code(e) === '23505' || code((e as { cause?: unknown })?.cause) === '23505';
};

export async function create(ownerId: string, input: PaletteInput): Promise<Palette> {
	try {
		const [row] = await db.insert(palettes).values({ ownerId, name: input.name, colours: input.colours }).returning();
		return row;
	} catch (e) {
		if (isNameClash(e)) throw new NameTaken(input.name);
		throw e;
	}
}

/** Replaces the name and every colour (PUT is a full replace). */
export async function replace(id: string, input: PaletteInput): Promise<Palette> {
	try {
		const [row] = await db.update(palettes).set({ name: input.name, colours: input.colours, updatedAt: new Date() }).where(eq(palettes.id, id)).returning();
		return row;
	} catch (e) {
		if (isNameClash(e)) throw new NameTaken(input.name);
		throw e;
	}
}

/** Deletes a palette. Diagrams that use it keep their own copy (it was copied in when chosen). */
export async function remove(id: string): Promise<void> {
	await db.delete(palettes).where(eq(palettes.id, id));
}
