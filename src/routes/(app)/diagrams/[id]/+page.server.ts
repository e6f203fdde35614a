import { fail, redirect } from '@sveltejs/kit';
import { requireDiagram } from '$lib/server/access';
import { diagramTitle, formObject } from '$lib/server/forms';
import * as diagrams from '$lib/server/garage/diagrams';
import * as vehicles from '$lib/server/garage/vehicles';
import * as shares from '$lib/server/shares';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const { diagram, vehicle, level } = await requireDiagram(locals, params.id, 'view');
	return {
		diagram: diagrams.toJson(diagram),
		level,
		basedOn: shares.basedOn(diagram),
		vehicle: vehicles.forViewer(vehicle, locals.user),
		history: await diagrams.history(diagram.id)
	};
};

export const actions: Actions = {
	rename: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'edit');
		const values = formObject(await request.formData());
		const parsed = diagramTitle.safeParse(values.title);
		if (!parsed.success) return fail(400, { action: 'rename', values, errors: { title: parsed.error.issues[0].message } });
		await diagrams.rename(diagram.id, parsed.data);
		return { action: 'rename', saved: true };
	},
	delete: async ({ locals, params }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'owner');
		await diagrams.remove(diagram.id);
		redirect(303, `/garage/${diagram.vehicleId}`);
	}
};
