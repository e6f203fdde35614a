import { fail, redirect } from '@sveltejs/kit';
import { requireDiagram, requireUser } from '$lib/server/access';
import { diagramTitle, formObject } from '$lib/server/forms';
import * as shares from '$lib/server/shares';
import * as vehicles from '$lib/server/garage/vehicles';
import type { Actions, PageServerLoad } from './$types';

// Copy a diagram one may look at into one's own garage, to correct it for one's own vehicle.
export const load: PageServerLoad = async ({ locals, params }) => {
	const { diagram, vehicle } = await requireDiagram(locals, params.id, 'view');
	const user = requireUser(locals);
	return {
		diagram: { id: diagram.id, title: diagram.title, revision: diagram.revision },
		source: { make: vehicle.make, model: vehicle.model, year: vehicle.year, name: vehicle.name },
		vehicles: (await vehicles.listFor(user)).map((v) => ({ id: v.id, name: v.name, make: v.make, model: v.model, year: v.year }))
	};
};

export const actions: Actions = {
	default: async ({ locals, params, request }) => {
		const { diagram, vehicle } = await requireDiagram(locals, params.id, 'view');
		const user = requireUser(locals);
		const values = formObject(await request.formData());
		const title = diagramTitle.safeParse(values.title);
		if (!title.success) return fail(400, { values, errors: { title: title.error.issues[0].message } as Record<string, string> });
		let target: { vehicleId: string } | { newVehicleName: string };
		if (values.vehicleId && values.vehicleId !== 'new') target = { vehicleId: values.vehicleId };
		else {
			const name = (values.newVehicleName ?? '').trim();
			if (!name || name.length > 80) return fail(400, { values, errors: { newVehicleName: 'Name the vehicle the copy is for (up to 80 characters).' } as Record<string, string> });
			target = { newVehicleName: name };
		}
		const r = await shares.copyToGarage(diagram, vehicle, user, target, title.data);
		if (!r.ok) return fail(400, { values, errors: { vehicleId: r.message } as Record<string, string> });
		redirect(303, `/diagrams/${r.diagram.id}`);
	}
};
