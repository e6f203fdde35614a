import { publicUser } from '$lib/server/auth/accounts';
import type { LayoutServerLoad } from './$types';

// A whitelisted subset of the account for every page; never the row.
export const load: LayoutServerLoad = ({ locals }) => ({ user: publicUser(locals.user) });
