import { orUnavailable } from '$lib/server/http';
import { regionSvg, svgDataUrl } from '$lib/diagnosis/region-svg';
import { checklistFor } from '$lib/server/checklist';
import type { PageServerLoad } from './$types';

// Everything the print page shows, made on the server: the page needs no request after it loads
// (the region drawing comes as a data: URL), so it prints from the cache when offline.
export const load: PageServerLoad = async ({ locals, params }) => {
	const { model, loaded } = await orUnavailable(checklistFor(locals, params.id));
	const svg = regionSvg(
		loaded.document,
		model.region,
		model.steps.map((s) => ({ number: s.number, part: s.place.partId, terminal: s.place.terminal })),
		`Region of the diagnosis: ${loaded.diagnosis.title}`
	);
	return { id: loaded.diagnosis.id, model, drawing: svgDataUrl(svg) };
};
