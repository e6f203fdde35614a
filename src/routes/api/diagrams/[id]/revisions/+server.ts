import { json } from '@sveltejs/kit';
import { requireDiagram } from '$lib/server/access';
import { endpoint } from '$lib/server/http';
import { list } from './revisions.server';
import type { RequestHandler } from './$types';

/** GET /api/diagrams/:id/revisions → { revisions: [{ revision, author, createdAt }] }, newest first */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'view');
	return json({ current: diagram.revision, revisions: await list(diagram.id) });
});
