import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { requireDiagram, requireUser } from '$lib/server/access';
import * as clubs from '$lib/server/clubs';
import { email, formObject } from '$lib/server/forms';
import * as mail from '$lib/server/mail';
import * as shares from '$lib/server/shares';
import type { Actions, PageServerLoad } from './$types';

// Who else may use a diagram, and its read-only links. Only the owner manages these.
type Errors = Record<string, string | undefined>;
const level = z.enum(['view', 'comment', 'edit'], { error: 'Choose view, comment or edit.' });

export const load: PageServerLoad = async ({ locals, params }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'owner');
	const user = requireUser(locals);
	return {
		diagram: { id: diagram.id, title: diagram.title },
		shares: await shares.list(diagram.id),
		links: (await shares.links(diagram.id)).map((l) => ({ ...l, expiresAt: l.expiresAt?.toISOString() ?? null, createdAt: l.createdAt.toISOString() })),
		clubs: (await clubs.listFor(user.id)).map((c) => ({ id: c.id, name: c.name }))
	};
};

export const actions: Actions = {
	person: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'owner');
		const values = formObject(await request.formData());
		const e = email.safeParse(values.email);
		const l = level.safeParse(values.level);
		if (!e.success || !l.success) {
			return fail(400, { action: 'person', values, errors: { email: e.error?.issues[0].message, level: l.error?.issues[0].message } as Errors });
		}
		const r = await shares.withPerson(diagram, locals.user!, e.data, l.data);
		if (!r.ok) return fail(400, { action: 'person', values, errors: { [r.field]: r.message } as Errors });
		return { action: 'person', message: r.message };
	},
	club: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'owner');
		const values = formObject(await request.formData());
		const l = level.safeParse(values.level);
		if (!l.success) return fail(400, { action: 'club', values, errors: { level: l.error.issues[0].message } as Errors });
		const r = await shares.withClub(diagram, locals.user!.id, values.clubId ?? '', l.data);
		if (!r.ok) return fail(400, { action: 'club', values, errors: { [r.field]: r.message } as Errors });
		return { action: 'club', message: r.message };
	},
	revoke: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'owner');
		const { shareId = '' } = formObject(await request.formData());
		if (!z.uuid().safeParse(shareId).success || !(await shares.revoke(diagram.id, shareId))) {
			return fail(404, { action: 'revoke', message: 'That share has already been removed.' });
		}
		return { action: 'revoke', message: 'Share removed.' };
	},
	link: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'owner');
		const values = formObject(await request.formData());
		const days = values.days ? Number(values.days) : null;
		if (days !== null && !(Number.isInteger(days) && days >= 1 && days <= 365)) {
			return fail(400, { action: 'link', values, errors: { days: 'Enter whole days from 1 to 365, or leave it empty for a link that does not expire.' } as Errors });
		}
		const label = (values.label ?? '').trim().slice(0, 80);
		const token = await shares.createLink(diagram.id, label, days ? new Date(Date.now() + days * 86_400_000) : null);
		return { action: 'link', message: 'Read-only link made. Copy it now: it is shown only this once.', url: mail.link(`/s/${token}`) };
	},
	revokeLink: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'owner');
		const { linkId = '' } = formObject(await request.formData());
		if (!z.uuid().safeParse(linkId).success || !(await shares.revokeLink(diagram.id, linkId))) {
			return fail(404, { action: 'revokeLink', message: 'That link has already been turned off.' });
		}
		return { action: 'revokeLink', message: 'Link turned off: it now leads nowhere.' };
	}
};
