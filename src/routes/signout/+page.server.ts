import { redirect } from '@sveltejs/kit';
import * as session from '$lib/server/auth/session';
import type { Actions } from './$types';

// Sign-out is a POST (a form action) so a link or an image on another page cannot sign anyone out;
// the session ends on the server, not just in the browser (OWASP ASVS 4.0.3 §3.3.1).
export const actions: Actions = {
	default: async ({ cookies, locals }) => {
		await session.end(cookies, locals.session?.id);
		redirect(303, '/');
	}
};
