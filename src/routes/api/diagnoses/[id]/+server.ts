import { json } from '@sveltejs/kit';
import { requireDiagnosis } from '$lib/server/access';
import * as diagnosisStore from '$lib/server/diagnoses';
import { planView } from '$lib/diagnosis/view';
import { apiError, endpoint, readBody } from '$lib/server/http';
import * as vehicles from '$lib/server/garage/vehicles';
import type { RequestHandler } from './$types';

/**
 * GET /api/diagnoses/:id → { diagnosis, vehicle, document, readings, plan, canEdit }: everything the
 * diagnosis page needs to plan on its own (in the browser, offline too).
 */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagnosis, vehicle, level } = await requireDiagnosis(locals, params.id, 'view');
	const loaded = await diagnosisStore.load(diagnosis);
	return json({ ...loaded, vehicle: vehicles.forViewer(vehicle, locals.user), plan: planView(await diagnosisStore.planOf(loaded)), canEdit: level !== 'view' && level !== 'comment' });
});

/**
 * PATCH /api/diagnoses/:id { version, title?, marks?, scenario?, meter?, uncertainty?, status?: "open" }
 * → { diagnosis, plan }; 409 when stale (nothing changed). `uncertainty: null` goes back to the defaults.
 */
export const PATCH: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagnosis } = await requireDiagnosis(locals, params.id, 'edit');
	const input = await readBody(request, diagnosisStore.UpdateSchema);
	const loaded = await diagnosisStore.load(diagnosis);
	try {
		const next = await diagnosisStore.update(loaded, input);
		return json({ diagnosis: next, plan: planView(await diagnosisStore.planOf({ ...loaded, diagnosis: next })) });
	} catch (e) {
		if (e instanceof diagnosisStore.StaleVersion) return apiError(409, { error: `This diagnosis was changed elsewhere (now version ${e.current}). Reload it, then make your change again.` });
		throw e;
	}
});

/** DELETE /api/diagnoses/:id → 204, with its readings. The diagram's owner only: it is their vehicle's record. */
export const DELETE: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagnosis } = await requireDiagnosis(locals, params.id, 'owner');
	await diagnosisStore.remove(diagnosis.id);
	return new Response(null, { status: 204 });
});
