import { json } from '@sveltejs/kit';
import { requireDiagram } from '$lib/server/access';
import { validateDocument } from '$lib/server/documents';
import { under } from '$lib/server/issues';
import { diagramSave } from '$lib/server/forms';
import { apiError, BadRequest, endpoint, readBody } from '$lib/server/http';
import * as diagrams from '$lib/server/garage/diagrams';
import type { RequestHandler } from './$types';

/** GET /api/diagrams/:id → { diagram } with its document */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'view');
	return json({ diagram: diagrams.toJson(diagram, true) });
});

/**
 * PUT /api/diagrams/:id { revision, document, title? } → { diagram } at revision + 1.
 * A save of an old revision → 409 { error, revision: current } and nothing changes.
 */
export const PUT: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'edit');
	const input = await readBody(request, diagramSave);
	const checked = validateDocument(input.document);
	if (!checked.ok) {
		throw new BadRequest(
			'The document has problems.',
			checked.errors.map((e) => ({ path: under('document', e.path), message: e.message }))
		);
	}
	const result = await diagrams.save(diagram.id, input.revision, checked.doc, locals.user!.id, input.title);
	if (!result.ok) {
		return apiError(409, {
			error: `This diagram was saved elsewhere and is now at revision ${result.currentRevision}; you edited revision ${input.revision}. Reload it, then make your change again.`,
			revision: result.currentRevision
		});
	}
	return json({ diagram: diagrams.toJson(result.diagram, true) });
});

/** DELETE /api/diagrams/:id → 204, with its revision history. Its owner only. */
export const DELETE: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'owner');
	await diagrams.remove(diagram.id);
	return new Response(null, { status: 204 });
});
