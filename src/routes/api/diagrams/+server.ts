import { json } from '@sveltejs/kit';
import { requireUser, requireVehicle } from '$lib/server/access';
import { validateDocument } from '$lib/server/documents';
import { under } from '$lib/server/issues';
import { diagramCreate } from '$lib/server/forms';
import { BadRequest, endpoint, readBody } from '$lib/server/http';
import * as diagrams from '$lib/server/garage/diagrams';
import type { RequestHandler } from './$types';

/** GET /api/diagrams[?vehicleId=…] → { diagrams } (no documents; fetch one for that) */
export const GET: RequestHandler = endpoint(async ({ locals, url }) => {
	const user = requireUser(locals);
	const vehicleId = url.searchParams.get('vehicleId');
	if (vehicleId !== null) await requireVehicle(locals, vehicleId, 'view');
	return json({ diagrams: await diagrams.listFor(user, vehicleId ?? undefined) });
});

/** POST /api/diagrams { vehicleId, title, document? } → 201 { diagram } (empty document if none) */
export const POST: RequestHandler = endpoint(async ({ locals, request }) => {
	const user = requireUser(locals);
	const input = await readBody(request, diagramCreate);
	const vehicle = await requireVehicle(locals, input.vehicleId, 'edit');
	let document;
	if (input.document !== undefined) {
		const checked = validateDocument(input.document);
		if (!checked.ok) throw new BadRequest('The document has problems.', prefixed(checked.errors));
		document = checked.doc;
	}
	const diagram = await diagrams.create(vehicle, user.id, input.title, document);
	return json({ diagram: diagrams.toJson(diagram, true) }, { status: 201 });
});

function prefixed(errors: { path: string; message: string }[]) {
	return errors.map((e) => ({ path: under('document', e.path), message: e.message }));
}
