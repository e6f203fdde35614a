import { fail, redirect } from '@sveltejs/kit';
import * as links from '$lib/server/auth/links';
import * as session from '$lib/server/auth/session';
import { formObject } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

// The link from the reset e-mail: choose a new password. Using the link ends every session of
// the account, this browser's included, and sends the person to sign in afresh.
export const load: PageServerLoad = async ({ params }) => {
	const user = await links.peek(params.token, 'reset');
	return { valid: user !== null, email: user?.email ?? null };
};

export const actions: Actions = {
	default: async ({ params, request, cookies }) => {
		const { password = '' } = formObject(await request.formData());
		const result = await links.resetPassword(params.token, password);
		if (!result.ok) return fail(400, { field: result.field, message: result.message });
		// This browser's cookie names an ended session; clear it too.
		await session.end(cookies, null);
		redirect(303, '/signin?reset=1');
	}
};
