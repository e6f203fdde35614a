import { fail, redirect } from '@sveltejs/kit';
import * as accounts from '$lib/server/auth/accounts';
import * as links from '$lib/server/auth/links';
import * as session from '$lib/server/auth/session';
import { formObject, signUpForm } from '$lib/server/forms';
import { fieldErrors, fromZod } from '$lib/server/issues';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (locals.user) redirect(303, '/garage');
};

export const actions: Actions = {
	default: async ({ request, cookies }) => {
		const raw = formObject(await request.formData());
		const values = { displayName: raw.displayName ?? '', email: raw.email ?? '' };
		const parsed = signUpForm.safeParse(raw);
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(fromZod(parsed.error)) });

		const result = await accounts.createAccount(parsed.data);
		if (!result.ok) return fail(400, { values, errors: { [result.field]: result.message } });

		await links.sendVerification(result.user);
		await session.start(cookies, result.user.id, request.headers.get('user-agent') ?? '');
		redirect(303, '/garage');
	}
};
