import { sql } from 'drizzle-orm';
import { BUILT_IN_PALETTES, PaletteSchema, type Palette } from '$lib/circuit/colours';
import { requireUser, visibleDiagrams } from '$lib/server/access';
import { db } from '$lib/server/db';
import { diagrams } from '$lib/server/db/schema';
import type { PageServerLoad } from './$types';

// Colour palettes: the built-in ones, and each palette of the person's own kept inside one of
// their diagrams (a diagram's document carries either a built-in palette's id or a palette).
export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const rows = await db
		.select({ id: diagrams.id, title: diagrams.title, revision: diagrams.revision, palette: sql<unknown>`${diagrams.document}->'palette'` })
		.from(diagrams)
		.where(visibleDiagrams(user))
		.orderBy(diagrams.title);
	const own: { palette: Palette; diagrams: { id: string; title: string }[] }[] = [];
	const usage = new Map<string, { id: string; title: string }[]>();
	for (const r of rows) {
		if (typeof r.palette === 'string' || r.palette == null) {
			const id = typeof r.palette === 'string' ? r.palette : 'trade-letters';
			usage.set(id, [...(usage.get(id) ?? []), { id: r.id, title: r.title }]);
			continue;
		}
		const parsed = PaletteSchema.safeParse(r.palette);
		if (parsed.success) own.push({ palette: parsed.data, diagrams: [{ id: r.id, title: r.title }] });
	}
	return {
		builtIn: Object.values(BUILT_IN_PALETTES).map((p) => ({ palette: p, diagrams: usage.get(p.id) ?? [] })),
		own,
		diagrams: rows.map((r) => ({ id: r.id, title: r.title }))
	};
};
