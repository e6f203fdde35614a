import { fail, redirect } from '@sveltejs/kit';
import { requireClub } from '$lib/server/access';
import * as clubs from '$lib/server/clubs';
import { clubFields } from '$lib/server/clubs';
import { email, formObject } from '$lib/server/forms';
import { fieldErrors, fromZod } from '$lib/server/issues';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const { club, membership } = await requireClub(locals, params.id, 'member');
	const query = {
		make: url.searchParams.get('make')?.trim() ?? '',
		model: url.searchParams.get('model')?.trim() ?? '',
		year: url.searchParams.get('year')?.trim() ?? '',
		title: url.searchParams.get('title')?.trim() ?? ''
	};
	const organiser = membership.role === 'organiser';
	return {
		club: { id: club.id, name: club.name, description: club.description },
		role: membership.role,
		members: (await clubs.members(club.id)).map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() })),
		invitations: organiser ? (await clubs.pendingInvitations(club.id)).map((i) => ({ ...i, expiresAt: i.expiresAt.toISOString() })) : [],
		query,
		library: (await clubs.library(club.id, query)).map((d) => ({ ...d, updatedAt: d.updatedAt.toISOString() }))
	};
};

export const actions: Actions = {
	invite: async ({ locals, params, request }) => {
		const { club } = await requireClub(locals, params.id, 'organiser');
		const values = formObject(await request.formData());
		const parsed = email.safeParse(values.email);
		if (!parsed.success) return fail(400, { action: 'invite', values, errors: { email: parsed.error.issues[0].message } as Record<string, string> });
		const result = await clubs.invite(club, locals.user!, parsed.data);
		if (!result.ok) return fail(400, { action: 'invite', values, errors: { email: result.message } as Record<string, string> });
		return { action: 'invite', message: `Invitation sent to ${parsed.data}. The link works for seven days.` };
	},
	cancelInvitation: async ({ locals, params, request }) => {
		const { club } = await requireClub(locals, params.id, 'organiser');
		const { invitationId = '' } = formObject(await request.formData());
		await clubs.cancelInvitation(club.id, invitationId);
		return { action: 'members', message: 'Invitation withdrawn.' };
	},
	remove: async ({ locals, params, request }) => {
		const { club } = await requireClub(locals, params.id, 'organiser');
		const { userId = '' } = formObject(await request.formData());
		const r = await clubs.removeMember(club.id, userId);
		if (!r.ok) return fail(400, { action: 'members', message: r.message });
		return { action: 'members', message: 'Member removed. Diagrams shared with the club are no longer open to them.' };
	},
	handOver: async ({ locals, params, request }) => {
		const { club } = await requireClub(locals, params.id, 'organiser');
		const { userId = '' } = formObject(await request.formData());
		const ok = await clubs.handOver(club.id, locals.user!.id, userId);
		if (!ok) return fail(400, { action: 'members', message: 'Choose another member of the club.' });
		return { action: 'members', message: 'The organiser role is handed on; you stay a member.' };
	},
	leave: async ({ locals, params }) => {
		const { club } = await requireClub(locals, params.id, 'member');
		const r = await clubs.removeMember(club.id, locals.user!.id);
		if (!r.ok) return fail(400, { action: 'members', message: r.message });
		redirect(303, '/clubs');
	},
	delete: async ({ locals, params, request }) => {
		const { club } = await requireClub(locals, params.id, 'organiser');
		// Other people lose the club too: the organiser types its name to be sure.
		const typed = String((await request.formData()).get('confirmName') ?? '').trim();
		if (typed !== club.name.trim()) {
			const errors: Record<string, string> = { confirmName: `Type the club’s name, “${club.name}”, to delete it.` };
			return fail(400, { action: 'delete', errors });
		}
		await clubs.remove(club.id);
		redirect(303, '/clubs');
	},
	update: async ({ locals, params, request }) => {
		const { club } = await requireClub(locals, params.id, 'organiser');
		const values = formObject(await request.formData());
		const parsed = clubFields.safeParse(values);
		if (!parsed.success) return fail(400, { action: 'update', values, errors: fieldErrors(fromZod(parsed.error)) });
		await clubs.update(club.id, parsed.data.name, parsed.data.description);
		return { action: 'update', message: 'Club details saved.' };
	}
};
