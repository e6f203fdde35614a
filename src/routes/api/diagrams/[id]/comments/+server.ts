import { json } from '@sveltejs/kit';
import { requireDiagram } from '$lib/server/access';
import * as comments from '$lib/server/comments';
import { BadRequest, endpoint, readBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** GET /api/diagrams/:id/comments → { comments } (oldest first; parentId threads them). Comment level. */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'comment');
	return json({ comments: await comments.list(diagram.id) });
});

/** POST /api/diagrams/:id/comments { body, parentId?, target?, targetId? } → 201 { comment } */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'comment');
	const input = await readBody(request, comments.commentBody);
	const r = await comments.add(diagram, locals.user!, input);
	if (!r.ok) throw new BadRequest('Some fields need fixing.', [{ path: r.field, message: r.message }]);
	return json({ comment: r.comment }, { status: 201 });
});
