import { publicUser } from '$lib/server/auth/accounts';
import { config } from '$lib/server/config';
import type { LayoutServerLoad } from './$types';

// A whitelisted subset of the account for every page; never the row.
export const load: LayoutServerLoad = ({ locals, depends }) => {
	depends('loom:dates');
	return {
		user: publicUser(locals.user),
		// Whether to offer the caught-mail page (development, admins only; the page checks again).
		devMail: config.devMail && locals.user?.role === 'admin',
		// How dates are written on every page (dates.ts); the browser sends its time zone once.
		dates: locals.dates
	};
};
