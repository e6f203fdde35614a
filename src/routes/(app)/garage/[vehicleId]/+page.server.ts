import { fail, redirect } from '@sveltejs/kit';
import { requireVehicle } from '$lib/server/access';
import { diagramTitle, formObject, vehicleFields } from '$lib/server/forms';
import * as diagnoses from '$lib/server/diagnoses';
import * as diagrams from '$lib/server/garage/diagrams';
import * as vehicles from '$lib/server/garage/vehicles';
import { fieldErrors, fromZod } from '$lib/server/issues';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const vehicle = await requireVehicle(locals, params.vehicleId, 'view');
	const [list, timeline] = await Promise.all([diagrams.listFor(locals.user!, vehicle.id), diagnoses.timeline(vehicle.id)]);
	return { vehicle: vehicles.toJson(vehicle), diagrams: list, timeline };
};

export const actions: Actions = {
	update: async ({ locals, params, request }) => {
		const vehicle = await requireVehicle(locals, params.vehicleId, 'edit');
		const values = formObject(await request.formData());
		const parsed = vehicleFields.safeParse(values);
		if (!parsed.success) return fail(400, { action: 'update', values, errors: fieldErrors(fromZod(parsed.error)) });
		await vehicles.update(vehicle.id, parsed.data);
		return { action: 'update', saved: true };
	},
	delete: async ({ locals, params }) => {
		const vehicle = await requireVehicle(locals, params.vehicleId, 'edit');
		await vehicles.remove(vehicle.id);
		redirect(303, '/garage');
	},
	createDiagram: async ({ locals, params, request }) => {
		const vehicle = await requireVehicle(locals, params.vehicleId, 'edit');
		const values = formObject(await request.formData());
		const parsed = diagramTitle.safeParse(values.title);
		if (!parsed.success) {
			return fail(400, { action: 'createDiagram', values, errors: { title: parsed.error.issues[0].message } });
		}
		const diagram = await diagrams.create(vehicle, locals.user!.id, parsed.data);
		redirect(303, `/diagrams/${diagram.id}`);
	}
};
