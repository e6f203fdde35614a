import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/access';
import { vehicleFields } from '$lib/server/forms';
import { endpoint, readBody } from '$lib/server/http';
import * as vehicles from '$lib/server/garage/vehicles';
import type { RequestHandler } from './$types';

/** GET /api/vehicles → { vehicles: [...] } (each with diagramCount) */
export const GET: RequestHandler = endpoint(async ({ locals }) => {
	const user = requireUser(locals);
	return json({ vehicles: await vehicles.listFor(user) });
});

/** POST /api/vehicles { name, make?, model?, year?, systemVoltage, earthPolarity, notes? } → 201 { vehicle } */
export const POST: RequestHandler = endpoint(async ({ locals, request }) => {
	const user = requireUser(locals);
	const input = await readBody(request, vehicleFields);
	const vehicle = await vehicles.create(user.id, input);
	return json({ vehicle: vehicles.toJson(vehicle) }, { status: 201 });
});
