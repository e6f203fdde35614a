import { orUnavailable } from '$lib/server/http';
import { requireDiagnosis } from '$lib/server/access';
import * as diagnosisStore from '$lib/server/diagnoses';
import * as vehicles from '$lib/server/garage/vehicles';
import { planView } from '$lib/diagnosis/view';
import type { PageServerLoad } from './$types';

// Everything the page needs to plan on its own in the browser: the document at the diagnosis's
// revision, the readings, and the plan as the server made it for the first paint.
export const load: PageServerLoad = async ({ locals, params }) => {
	const { diagnosis, diagram, vehicle, level } = await requireDiagnosis(locals, params.id, 'view');
	const loaded = await diagnosisStore.load(diagnosis);
	return {
		...loaded,
		plan: planView(await orUnavailable(diagnosisStore.planOf(loaded))),
		vehicle: vehicles.forViewer(vehicle, locals.user),
		diagram: { id: diagram.id, title: diagram.title, revision: diagram.revision },
		canEdit: level === 'edit' || level === 'owner'
	};
};
