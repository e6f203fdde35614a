import { error, json } from '@sveltejs/kit';
import { NOT_FOUND, requireDiagram } from '$lib/server/access';
import { endpoint } from '$lib/server/http';
import { one, revisionNumber } from '../revisions.server';
import type { RequestHandler } from './$types';

/** GET /api/diagrams/:id/revisions/:revision → { revision: { revision, author, createdAt, document } } */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'view');
	const n = revisionNumber(params.revision);
	const found = n === null ? null : await one(diagram.id, n);
	if (!found) error(404, NOT_FOUND);
	return json({ revision: found });
});
