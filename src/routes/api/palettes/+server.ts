import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/access';
import { apiError, endpoint, readBody } from '$lib/server/http';
import * as palettes from '$lib/server/palettes';
import type { RequestHandler } from './$types';

/** GET /api/palettes → { palettes: [{ id, name, colours, createdAt, updatedAt }] } (the account's own, by name) */
export const GET: RequestHandler = endpoint(async ({ locals }) => {
	const user = requireUser(locals);
	return json({ palettes: await palettes.listFor(user) });
});

/** POST /api/palettes { name, colours: [{ code, name, display }] } → 201 { palette }; 409 when the name is taken */
export const POST: RequestHandler = endpoint(async ({ locals, request }) => {
	const user = requireUser(locals);
	const input = await readBody(request, palettes.PaletteInputSchema);
	try {
		return json({ palette: palettes.toJson(await palettes.create(user.id, input)) }, { status: 201 });
	} catch (e) {
		if (e instanceof palettes.NameTaken) return apiError(409, { error: e.message, issues: [{ path: 'name', message: e.message }] });
		throw e;
	}
});
