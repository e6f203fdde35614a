import { fail } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { requireUser } from '$lib/server/access';
import * as accounts from '$lib/server/auth/accounts';
import * as links from '$lib/server/auth/links';
import * as session from '$lib/server/auth/session';
import { db } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { formObject } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';
import { counted } from '$lib/words';

// The signed-in person's own account: password, sessions, and which e-mails they want.
export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const [row] = await db
		.select({ emailVerifiedAt: users.emailVerifiedAt, notifyComments: users.notifyComments })
		.from(users)
		.where(eq(users.id, user.id));
	return {
		verified: row?.emailVerifiedAt != null,
		notifyComments: row?.notifyComments ?? true,
		sessions: await session.listFor(user.id, locals.session?.id)
	};
};

export const actions: Actions = {
	password: async ({ locals, request }) => {
		const user = requireUser(locals);
		const values = formObject(await request.formData());
		const result = await accounts.changePassword(user.id, values.current ?? '', values.password ?? '');
		if (!result.ok) return fail(400, { action: 'password', errors: { [result.field]: result.message } as Record<string, string> });
		// A new password ends every other session unless the person asks to keep them (OWASP
		// Session Management Cheat Sheet: renew or end sessions when the password changes).
		const ended = values.keepOthers !== 'on' && locals.session ? await session.endOthers(user.id, locals.session.id) : 0;
		return {
			action: 'password',
			message: ended ? `Password changed; ${counted(ended, 'other session')} ended.` : 'Password changed.'
		};
	},
	endSession: async ({ locals, request }) => {
		const user = requireUser(locals);
		const { handle = '' } = formObject(await request.formData());
		const ended = await session.endByHandle(user.id, handle);
		if (!ended) return fail(404, { action: 'sessions', message: 'That session has already ended.' });
		return { action: 'sessions', message: 'Session ended.' };
	},
	endOthers: async ({ locals }) => {
		const user = requireUser(locals);
		const n = locals.session ? await session.endOthers(user.id, locals.session.id) : 0;
		return { action: 'sessions', message: n ? `${counted(n, 'other session')} ended.` : 'There were no other sessions.' };
	},
	confirm: async ({ locals }) => {
		const user = requireUser(locals);
		await links.sendVerification(user);
		return { action: 'confirm', message: `A confirmation link is on its way to ${user.email}.` };
	},
	notifications: async ({ locals, request }) => {
		const user = requireUser(locals);
		const { notifyComments } = formObject(await request.formData());
		await accounts.setNotifyComments(user.id, notifyComments === 'on');
		return { action: 'notifications', message: notifyComments === 'on' ? 'Comment e-mails are on.' : 'Comment e-mails are off.' };
	}
};
