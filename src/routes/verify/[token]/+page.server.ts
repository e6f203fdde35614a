import * as links from '$lib/server/auth/links';
import type { PageServerLoad } from './$types';

// The link in the sign-up e-mail. Confirming an address changes nothing else, so it is done on
// opening the link; a spent or old link says so.
export const load: PageServerLoad = async ({ params }) => {
	const user = await links.verify(params.token);
	return { verified: user !== null, email: user?.email ?? null };
};
