import { json } from '@sveltejs/kit';
import { requireDiagnosis } from '$lib/server/access';
import * as diagnosisStore from '$lib/server/diagnoses';
import { planView } from '$lib/diagnosis/view';
import { endpoint, readBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** GET /api/diagnoses/:id/readings → { readings } in the order they were taken. */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagnosis } = await requireDiagnosis(locals, params.id, 'view');
	return json({ readings: await diagnosisStore.readingsOf(diagnosis.id) });
});

/**
 * POST /api/diagnoses/:id/readings { readings: [{ clientId, probe, outcome, value?, unit?, note?, takenAt }] }
 * → { stored, already, readings, plan }. A clientId already stored is not stored again, so a
 * queue sent twice (offline, then a retry) leaves one row per reading.
 */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagnosis } = await requireDiagnosis(locals, params.id, 'edit');
	const input = await readBody(request, diagnosisStore.ReadingsSchema);
	const loaded = await diagnosisStore.load(diagnosis);
	const counts = await diagnosisStore.addReadings(locals.user!, loaded, input.readings);
	const readings = await diagnosisStore.readingsOf(diagnosis.id);
	return json({ ...counts, readings, plan: planView(await diagnosisStore.planOf({ ...loaded, readings })) });
});
