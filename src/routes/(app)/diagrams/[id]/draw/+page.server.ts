import { requireDiagram, canComment, canEdit } from '$lib/server/access';
import * as comments from '$lib/server/comments';
import * as diagrams from '$lib/server/garage/diagrams';
import * as palettes from '$lib/server/palettes';
import * as vehicles from '$lib/server/garage/vehicles';
import type { PageServerLoad } from './$types';

// The drawing board loads the diagram with its document; editing is offered only to those who
// may edit (others see the drawing read-only), and to an editor their own palettes to choose from.
export const load: PageServerLoad = async ({ locals, params }) => {
	const { diagram, vehicle } = await requireDiagram(locals, params.id, 'view');
	const editable = canEdit(locals.user, diagram);
	return {
		diagram: diagrams.toJson(diagram, true),
		vehicle: vehicles.forViewer(vehicle, locals.user),
		editable,
		palettes: editable && locals.user ? await palettes.listFor(locals.user) : [],
		// Comment counts per part and wire, for those who may read and write comments.
		comments: canComment(locals.user, diagram) ? await comments.countsByTarget(diagram.id) : null
	};
};
