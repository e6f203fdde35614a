import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/access';
import { formObject, vehicleFields } from '$lib/server/forms';
import * as vehicles from '$lib/server/garage/vehicles';
import { fieldErrors, fromZod } from '$lib/server/issues';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	return { vehicles: await vehicles.listFor(user) };
};

export const actions: Actions = {
	create: async ({ locals, request }) => {
		const user = requireUser(locals);
		const values = formObject(await request.formData());
		const parsed = vehicleFields.safeParse(values);
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(fromZod(parsed.error)) });
		const vehicle = await vehicles.create(user.id, parsed.data);
		redirect(303, `/garage/${vehicle.id}`);
	}
};
