import { fail, redirect } from '@sveltejs/kit';
import * as accounts from '$lib/server/auth/accounts';
import * as session from '$lib/server/auth/session';
import { formObject, signInForm } from '$lib/server/forms';
import { fieldErrors, fromZod } from '$lib/server/issues';
import { safeNext } from '$lib/server/redirects';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	const next = safeNext(url.searchParams.get('next'));
	if (locals.user) redirect(303, next);
	return { next, reset: url.searchParams.get('reset') === '1' };
};

export const actions: Actions = {
	default: async ({ request, cookies, getClientAddress }) => {
		const raw = formObject(await request.formData());
		const next = safeNext(raw.next);
		const values = { email: raw.email ?? '' };
		const parsed = signInForm.safeParse(raw);
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(fromZod(parsed.error)), message: null, reason: 'invalid' as const });

		const result = await accounts.signIn(parsed.data.email, parsed.data.password, getClientAddress());
		if (!result.ok) return fail(result.status, { values, errors: {} as Record<string, string>, message: result.message, reason: result.reason });

		await session.start(cookies, result.user.id, request.headers.get('user-agent') ?? '');
		redirect(303, next);
	}
};
