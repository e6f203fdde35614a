import { error, fail } from '@sveltejs/kit';
import { parseDocument } from '$lib/circuit/schema';
import { documentChanges, type Changes } from '$lib/editor/changes';
import { canEdit, NOT_FOUND, requireDiagram } from '$lib/server/access';
import * as vehicles from '$lib/server/garage/vehicles';
import { list, one, restore, revisionNumber } from '../../../../api/diagrams/[id]/revisions/revisions.server';
import type { Actions, PageServerLoad } from './$types';

// The revision history of a diagram: every accepted save, newest first; one can be viewed and
// restored (which saves it again as the newest revision; nothing is ever removed).
export const load: PageServerLoad = async ({ locals, params, url }) => {
	const { diagram, vehicle } = await requireDiagram(locals, params.id, 'view');
	const wanted = url.searchParams.get('view');
	let viewing = null;
	// What the viewed revision changed against the one before it (none for the first).
	let changes: Changes | null = null;
	if (wanted !== null) {
		const n = revisionNumber(wanted);
		viewing = n === null ? null : await one(diagram.id, n);
		if (!viewing) error(404, NOT_FOUND);
		const before = viewing.revision > 1 ? await one(diagram.id, viewing.revision - 1) : null;
		const a = before && parseDocument(before.document);
		const b = parseDocument(viewing.document);
		if (a?.ok && b.ok) changes = documentChanges(a.document, b.document);
	}
	return {
		diagram: { id: diagram.id, title: diagram.title, revision: diagram.revision },
		vehicle: vehicles.forViewer(vehicle, locals.user),
		revisions: await list(diagram.id),
		viewing,
		changes,
		editable: canEdit(locals.user, diagram)
	};
};

export const actions: Actions = {
	restore: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'edit');
		const form = await request.formData();
		const n = revisionNumber(String(form.get('revision') ?? ''));
		const current = revisionNumber(String(form.get('current') ?? ''));
		if (n === null || current === null) return fail(400, { message: 'Choose a revision to restore.' });
		const r = await restore(diagram.id, n, current, locals.user!.id);
		if (!r.ok) {
			if (r.reason === 'missing') return fail(404, { message: `There is no revision ${n}.` });
			return fail(409, {
				message: `Not restored: someone saved revision ${r.currentRevision} since this page was opened. Look at the newest revision, then restore again if you still want revision ${n}.`
			});
		}
		return { restored: n, revision: r.diagram.revision };
	}
};
