import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { NOT_FOUND, requireDiagram } from '$lib/server/access';
import { apiError, endpoint, readBody } from '$lib/server/http';
import * as diagrams from '$lib/server/garage/diagrams';
import { restore, revisionNumber } from '../../revisions.server';
import type { RequestHandler } from './$types';

const body = z.object({
	revision: z.number({ error: 'Send the current revision number (the one you are replacing).' }).int().positive()
});

/**
 * POST /api/diagrams/:id/revisions/:revision/restore { revision: current } → { diagram } at
 * current + 1 holding the old document. A stale current revision → 409 { error, revision }.
 */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'edit');
	const n = revisionNumber(params.revision);
	if (n === null) error(404, NOT_FOUND);
	const input = await readBody(request, body);
	const r = await restore(diagram.id, n, input.revision, locals.user!.id);
	if (!r.ok) {
		if (r.reason === 'missing') error(404, NOT_FOUND);
		return apiError(409, {
			error: `This diagram was saved elsewhere and is now at revision ${r.currentRevision}; you asked to replace revision ${input.revision}. Look at the newest revision first.`,
			revision: r.currentRevision
		});
	}
	return json({ diagram: diagrams.toJson(r.diagram, true) });
});
