import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import * as accounts from '$lib/server/auth/accounts';
import * as links from '$lib/server/auth/links';
import { email, formObject } from '$lib/server/forms';
import type { Actions } from './$types';

// Asking for a reset link. The answer is the same whether or not the address has an account
// (OWASP Forgot Password Cheat Sheet: "return a consistent message").
export const actions: Actions = {
	default: async ({ request }) => {
		const values = formObject(await request.formData());
		const parsed = z.object({ email }).safeParse(values);
		if (!parsed.success) return fail(400, { email: values.email ?? '', error: parsed.error.issues[0].message, sent: false });
		await links.requestReset(await accounts.findByEmail(parsed.data.email));
		return { email: parsed.data.email, error: null, sent: true };
	}
};
