import { json } from '@sveltejs/kit';
import { requireDiagnosis, NOT_FOUND } from '$lib/server/access';
import * as diagnosisStore from '$lib/server/diagnoses';
import { apiError, endpoint } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** DELETE /api/diagnoses/:id/readings/:readingId → { readings }: the reading is struck (kept in the record, not planned on). */
export const DELETE: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagnosis } = await requireDiagnosis(locals, params.id, 'edit');
	const id = Number(params.readingId);
	if (!Number.isSafeInteger(id) || !(await diagnosisStore.strikeReading(diagnosis.id, id))) return apiError(404, { error: NOT_FOUND });
	return json({ readings: await diagnosisStore.readingsOf(diagnosis.id) });
});
