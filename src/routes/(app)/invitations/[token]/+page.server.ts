import { error, fail, redirect } from '@sveltejs/kit';
import { NOT_FOUND, requireUser } from '$lib/server/access';
import * as clubs from '$lib/server/clubs';
import type { Actions, PageServerLoad } from './$types';

// The link in an invitation e-mail. It is for the address it was sent to: the signed-in
// account must use that address. Spent, withdrawn or week-old links are 404.
async function open(locals: App.Locals, token: string) {
	const user = requireUser(locals);
	const found = await clubs.invitationByToken(token);
	if (!found) error(404, NOT_FOUND);
	return { user, ...found, mine: found.invitation.email === user.email };
}

export const load: PageServerLoad = async ({ locals, params }) => {
	const { club, invitation, inviter, mine } = await open(locals, params.token);
	return {
		club: { name: club.name, description: club.description },
		email: invitation.email,
		inviter: inviter ?? 'A former member',
		expiresAt: invitation.expiresAt.toISOString(),
		mine
	};
};

async function answer(locals: App.Locals, token: string, accept: boolean) {
	const { user, club, invitation, mine } = await open(locals, token);
	if (!mine) return fail(403, { message: `This invitation was sent to ${invitation.email}; you are signed in as ${user.email}.` });
	if (!(await clubs.answer(invitation.id, user.id, accept))) error(404, NOT_FOUND);
	redirect(303, accept ? `/clubs/${club.id}` : '/clubs');
}

export const actions: Actions = {
	accept: ({ locals, params }) => answer(locals, params.token, true),
	decline: ({ locals, params }) => answer(locals, params.token, false)
};
