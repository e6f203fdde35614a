import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireDiagram, requireUser } from '$lib/server/access';
import { diagramTitle } from '$lib/server/forms';
import { BadRequest, endpoint, readBody } from '$lib/server/http';
import * as diagrams from '$lib/server/garage/diagrams';
import * as shares from '$lib/server/shares';
import type { RequestHandler } from './$types';

const copyBody = z
	.object({
		title: diagramTitle.optional(),
		vehicleId: z.uuid('Choose one of your vehicles.').optional(),
		newVehicleName: z.string().trim().min(1).max(80).optional()
	})
	.refine((b) => (b.vehicleId === undefined) !== (b.newVehicleName === undefined), {
		message: 'Send vehicleId (one of yours) or newVehicleName, one of the two.',
		path: ['vehicleId']
	});

/** POST /api/diagrams/:id/copy { vehicleId | newVehicleName, title? } → 201 { diagram } in your garage */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	requireUser(locals);
	const { diagram, vehicle } = await requireDiagram(locals, params.id, 'view');
	const body = await readBody(request, copyBody);
	const target = body.vehicleId ? { vehicleId: body.vehicleId } : { newVehicleName: body.newVehicleName! };
	const r = await shares.copyToGarage(diagram, vehicle, locals.user!, target, body.title ?? diagram.title);
	if (!r.ok) throw new BadRequest(r.message, [{ path: 'vehicleId', message: r.message }]);
	return json({ diagram: { ...diagrams.toJson(r.diagram), basedOn: shares.basedOn(r.diagram) } }, { status: 201 });
});
