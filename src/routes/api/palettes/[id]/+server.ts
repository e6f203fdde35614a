import { json } from '@sveltejs/kit';
import { requirePalette } from '$lib/server/access';
import { apiError, endpoint, readBody } from '$lib/server/http';
import * as palettes from '$lib/server/palettes';
import type { RequestHandler } from './$types';

/** GET /api/palettes/:id → { palette } (404 for another account's) */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const palette = await requirePalette(locals, params.id);
	return json({ palette: palettes.toJson(palette) });
});

/** PUT /api/palettes/:id { name, colours } → { palette }: a full replace; 409 when the name is taken */
export const PUT: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const palette = await requirePalette(locals, params.id);
	const input = await readBody(request, palettes.PaletteInputSchema);
	try {
		return json({ palette: palettes.toJson(await palettes.replace(palette.id, input)) });
	} catch (e) {
		if (e instanceof palettes.NameTaken) return apiError(409, { error: e.message, issues: [{ path: 'name', message: e.message }] });
		throw e;
	}
});

/** DELETE /api/palettes/:id → 204. Diagrams that chose it keep their own copy. */
export const DELETE: RequestHandler = endpoint(async ({ locals, params }) => {
	const palette = await requirePalette(locals, params.id);
	await palettes.remove(palette.id);
	return new Response(null, { status: 204 });
});
