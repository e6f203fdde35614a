import { redirect } from '@sveltejs/kit';
import { publicUser } from '$lib/server/auth/accounts';
import type { LayoutServerLoad } from './$types';

// Every page in (app) needs an account: the user is loaded once here for all of them.
export const load: LayoutServerLoad = ({ locals, url }) => {
	if (!locals.user) redirect(303, `/signin?next=${encodeURIComponent(url.pathname + url.search)}`);
	return { user: publicUser(locals.user)! };
};
