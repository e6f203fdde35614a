import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { NOT_FOUND, requireDiagram } from '$lib/server/access';
import { endpoint, readBody } from '$lib/server/http';
import * as pages from '$lib/server/manual-pages';
import type { RequestHandler } from './$types';

const uuid = z.uuid();

async function pageOf(locals: App.Locals, diagramId: string, pageId: string, level: 'view' | 'edit') {
	const { diagram } = await requireDiagram(locals, diagramId, level);
	if (!uuid.safeParse(pageId).success) error(404, NOT_FOUND);
	const page = await pages.find(diagram.id, pageId);
	if (!page) error(404, NOT_FOUND);
	return page;
}

/** GET /api/diagrams/:id/pages/:pageId → the image bytes (for those who may view the diagram). */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const page = await pageOf(locals, params.id, params.pageId, 'view');
	const bytes = await pages.bytesOf(page);
	if (!bytes) error(404, 'The page’s image file is missing from storage.');
	return new Response(bytes as BodyInit, {
		headers: {
			'content-type': page.contentType,
			'content-length': String(bytes.byteLength),
			// Private: never kept by shared caches; the browser may keep it briefly.
			'cache-control': 'private, max-age=300',
			'x-content-type-options': 'nosniff',
			'content-disposition': 'inline'
		}
	});
});

const tracingPatch = z
	.object({
		opacity: z.number().min(0, 'Opacity is from 0 to 1.').max(1, 'Opacity is from 0 to 1.'),
		scale: z.number().min(0.05, 'Scale is from 0.05 to 20.').max(20, 'Scale is from 0.05 to 20.'),
		offsetX: z.number().min(-100_000).max(100_000),
		offsetY: z.number().min(-100_000).max(100_000),
		locked: z.boolean(),
		pageOrder: z.number().int().min(0).max(10_000)
	})
	.partial()
	.strict()
	.refine((v) => Object.keys(v).length > 0, { message: 'Send at least one setting to change.' });

/** PATCH /api/diagrams/:id/pages/:pageId { opacity?, scale?, offsetX?, offsetY?, locked?, pageOrder? } → { page } */
export const PATCH: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const page = await pageOf(locals, params.id, params.pageId, 'edit');
	const patch = await readBody(request, tracingPatch);
	return json({ page: pages.toJson(await pages.update(page.id, patch)) });
});

/** DELETE /api/diagrams/:id/pages/:pageId → 204, the file with it. */
export const DELETE: RequestHandler = endpoint(async ({ locals, params }) => {
	const page = await pageOf(locals, params.id, params.pageId, 'edit');
	await pages.remove(page);
	return new Response(null, { status: 204 });
});
