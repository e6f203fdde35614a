import { fail } from '@sveltejs/kit';
import { asc, count, eq } from 'drizzle-orm';
import { requireAdmin } from '$lib/server/access';
import * as accounts from '$lib/server/auth/accounts';
import { db } from '$lib/server/db';
import { users, vehicles } from '$lib/server/db/schema';
import { formObject } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

// Site admins only; to anyone else this page does not exist (404, see access.ts).
export const load: PageServerLoad = async ({ locals }) => {
	requireAdmin(locals);
	const rows = await db
		.select({
			id: users.id,
			email: users.email,
			displayName: users.displayName,
			role: users.role,
			disabled: users.disabled,
			createdAt: users.createdAt,
			vehicles: count(vehicles.id)
		})
		.from(users)
		.leftJoin(vehicles, eq(vehicles.ownerId, users.id))
		.groupBy(users.id)
		.orderBy(asc(users.createdAt));
	return { accounts: rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() })) };
};

async function setDisabled(locals: App.Locals, request: Request, disabled: boolean) {
	const admin = requireAdmin(locals);
	const { userId } = formObject(await request.formData());
	if (!userId) return fail(400, { message: 'Choose an account.' });
	if (userId === admin.id) return fail(400, { message: 'You cannot disable your own account.' });
	const user = await accounts.setDisabled(userId, disabled);
	if (!user) return fail(404, { message: 'That account no longer exists.' });
	return {
		message: disabled
			? `${user.displayName} (${user.email}) is disabled and has been signed out everywhere.`
			: `${user.displayName} (${user.email}) can sign in again.`
	};
}

export const actions: Actions = {
	disable: ({ locals, request }) => setDisabled(locals, request, true),
	enable: ({ locals, request }) => setDisabled(locals, request, false)
};
