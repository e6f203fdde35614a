import { json } from '@sveltejs/kit';
import { requireVehicle } from '$lib/server/access';
import { vehiclePatch } from '$lib/server/forms';
import { endpoint, readBody } from '$lib/server/http';
import * as diagrams from '$lib/server/garage/diagrams';
import * as vehicles from '$lib/server/garage/vehicles';
import type { RequestHandler } from './$types';

/** GET /api/vehicles/:id → { vehicle, diagrams } */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const vehicle = await requireVehicle(locals, params.id, 'view');
	return json({ vehicle: vehicles.toJson(vehicle), diagrams: await diagrams.listFor(locals.user!, vehicle.id) });
});

/** PATCH /api/vehicles/:id { any vehicle fields } → { vehicle } */
export const PATCH: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const vehicle = await requireVehicle(locals, params.id, 'edit');
	const input = await readBody(request, vehiclePatch);
	return json({ vehicle: vehicles.toJson(await vehicles.update(vehicle.id, input)) });
});

/** DELETE /api/vehicles/:id → 204; its diagrams go with it. */
export const DELETE: RequestHandler = endpoint(async ({ locals, params }) => {
	const vehicle = await requireVehicle(locals, params.id, 'edit');
	await vehicles.remove(vehicle.id);
	return new Response(null, { status: 204 });
});
