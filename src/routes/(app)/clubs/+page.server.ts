import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/access';
import * as clubs from '$lib/server/clubs';
import { clubFields } from '$lib/server/clubs';
import { formObject } from '$lib/server/forms';
import { fieldErrors, fromZod } from '$lib/server/issues';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	return { clubs: await clubs.listFor(user.id) };
};

export const actions: Actions = {
	create: async ({ locals, request }) => {
		const user = requireUser(locals);
		const values = formObject(await request.formData());
		const parsed = clubFields.safeParse(values);
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(fromZod(parsed.error)) });
		const club = await clubs.create(user, parsed.data.name, parsed.data.description);
		redirect(303, `/clubs/${club.id}`);
	}
};
