import { json } from '@sveltejs/kit';
import { requireDiagnosis } from '$lib/server/access';
import * as diagnosisStore from '$lib/server/diagnoses';
import { apiError, endpoint, readBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** POST /api/diagnoses/:id/conclude { version, foundSuspect?, conclusion, partsReplaced } → { diagnosis }; 409 when stale. */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagnosis } = await requireDiagnosis(locals, params.id, 'edit');
	const input = await readBody(request, diagnosisStore.ConcludeSchema);
	try {
		return json({ diagnosis: await diagnosisStore.conclude(await diagnosisStore.load(diagnosis), input) });
	} catch (e) {
		if (e instanceof diagnosisStore.StaleVersion) return apiError(409, { error: `This diagnosis was changed elsewhere (now version ${e.current}). Reload it, then conclude again.` });
		throw e;
	}
});
