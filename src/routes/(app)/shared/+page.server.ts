import { requireUser } from '$lib/server/access';
import * as shares from '$lib/server/shares';
import type { PageServerLoad } from './$types';

// Diagrams other people shared with this account, directly or through a club.
export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	return { diagrams: await shares.sharedWith(user.id) };
};
