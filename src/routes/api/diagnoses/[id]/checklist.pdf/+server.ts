import { checklistPdf, type Paper } from '$lib/diagnosis/checklist-pdf';
import { checklistFor } from '$lib/server/checklist';
import { endpoint } from '$lib/server/http';
import type { RequestHandler } from './$types';

/**
 * GET /api/diagnoses/:id/checklist.pdf[?paper=a4|letter] → the probe checklist as a PDF download
 * (the same model as the print page). Content-Disposition per RFC 6266, with an ASCII file name.
 */
export const GET: RequestHandler = endpoint(async ({ locals, params, url }) => {
	const { model } = await checklistFor(locals, params.id);
	const paper: Paper = url.searchParams.get('paper') === 'letter' ? 'letter' : 'a4';
	const bytes = await checklistPdf(model, { paper });
	return new Response(bytes as BodyInit, {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `attachment; filename="${model.fileName}"`,
			'content-length': String(bytes.byteLength),
			// The checklist changes as readings come in, and it is the owner's: never kept by shared caches.
			'cache-control': 'private, no-store'
		}
	});
});
