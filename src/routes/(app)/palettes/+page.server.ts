import { sql } from 'drizzle-orm';
import { BUILT_IN_PALETTES, PaletteSchema, type Palette } from '$lib/circuit/colours';
import { libraryPaletteId } from '$lib/editor/palette-input';
import { requireUser, visibleDiagrams } from '$lib/server/access';
import { db } from '$lib/server/db';
import { diagrams } from '$lib/server/db/schema';
import * as palettes from '$lib/server/palettes';
import type { PageServerLoad } from './$types';

// Colour palettes: the built-in ones (read-only), the account's own library, and palettes kept
// only inside one of their diagrams (made before the library, or imported with a document).
// Each says which of the person's diagrams use it: a diagram carries a built-in id or a copy.
export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const [rows, library] = await Promise.all([
		db
			.select({ id: diagrams.id, title: diagrams.title, palette: sql<unknown>`${diagrams.document}->'palette'` })
			.from(diagrams)
			.where(visibleDiagrams(user))
			.orderBy(diagrams.title),
		palettes.listFor(user)
	]);
	const usage = new Map<string, { id: string; title: string }[]>();
	const inDiagrams: { palette: Palette; diagram: { id: string; title: string } }[] = [];
	const libraryIds = new Set(library.map((p) => libraryPaletteId(p.id)));
	for (const r of rows) {
		const diagram = { id: r.id, title: r.title };
		let id: string;
		if (typeof r.palette === 'string' || r.palette == null) id = typeof r.palette === 'string' ? r.palette : 'trade-letters';
		else {
			const parsed = PaletteSchema.safeParse(r.palette);
			if (!parsed.success) continue;
			id = parsed.data.id;
			if (!libraryIds.has(id)) inDiagrams.push({ palette: parsed.data, diagram });
		}
		usage.set(id, [...(usage.get(id) ?? []), diagram]);
	}
	return {
		builtIn: Object.values(BUILT_IN_PALETTES).map((p) => ({ palette: p, diagrams: usage.get(p.id) ?? [] })),
		library: library.map((p) => ({ ...p, diagrams: usage.get(libraryPaletteId(p.id)) ?? [] })),
		inDiagrams
	};
};
