import { json } from '@sveltejs/kit';
import { requireDiagram } from '$lib/server/access';
import { BadRequest, endpoint } from '$lib/server/http';
import * as pages from '$lib/server/manual-pages';
import { PAGE_LIMIT_TEXT, PAGE_MAX_BYTES, pageProblem, sniffImage } from '$lib/harness-io/images';
import { findBadField } from '$lib/server/text-guard';
import type { RequestHandler } from './$types';

/** GET /api/diagrams/:id/pages → { pages } in page order */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'view');
	return json({ pages: (await pages.list(diagram.id)).map(pages.toJson), limit: { bytes: PAGE_MAX_BYTES, text: PAGE_LIMIT_TEXT } });
});

/**
 * POST /api/diagrams/:id/pages (multipart/form-data, field "file": a PNG, JPEG or WebP of at most
 * 15 MB, recognised by its content) → 201 { page }
 */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'edit');
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > PAGE_MAX_BYTES + 64 * 1024) throw new BadRequest(`The file is larger than ${PAGE_LIMIT_TEXT}.`, [{ path: 'file', message: `at most ${PAGE_LIMIT_TEXT}` }]);
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		throw new BadRequest('Send the page as multipart/form-data with a "file" field.', [{ path: 'file', message: 'missing' }]);
	}
	const file = form.get('file');
	if (!(file instanceof File)) throw new BadRequest('Choose an image file of the manual page.', [{ path: 'file', message: 'missing' }]);
	const badName = findBadField(form);
	if (badName) throw new BadRequest(badName.message, [badName]);
	const bytes = new Uint8Array(await file.arrayBuffer());
	const problem = pageProblem(bytes);
	if (problem) throw new BadRequest(problem, [{ path: 'file', message: problem }]);
	const page = await pages.add({ diagramId: diagram.id, ownerId: diagram.ownerId, bytes, contentType: sniffImage(bytes)!, originalName: file.name || 'page' });
	return json({ page: pages.toJson(page) }, { status: 201 });
});
