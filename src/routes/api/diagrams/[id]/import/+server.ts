import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireDiagram } from '$lib/server/access';
import { validateDocument } from '$lib/server/documents';
import { apiError, BadRequest, endpoint, readBody } from '$lib/server/http';
import * as diagrams from '$lib/server/garage/diagrams';
import { findBadLine } from '$lib/server/text-guard';
import { decodeBytes, readWireList } from '$lib/harness-io/csv';
import { planImport } from '$lib/harness-io/wire-list';
import type { RequestHandler } from './$types';
import { counted } from '$lib/words';

/** A wire list of 10 000 rows is well under this; anything bigger is not a wire list. */
const MAX_BYTES = 2 * 1024 * 1024;

const importBody = z
	.object({
		/** The file as text (already decoded), or … */
		text: z.string().max(MAX_BYTES, 'The file is larger than 2 MB.').optional(),
		/** … its bytes in base64, so the server decodes it (UTF-8, UTF-16 or Windows-1252). */
		base64: z.string().max(Math.ceil((MAX_BYTES * 4) / 3) + 4, 'The file is larger than 2 MB.').optional(),
		/** Apply it. Without this the answer is a preview and nothing changes. */
		confirm: z.boolean().default(false),
		/** With problems in the file, import the good rows only (otherwise a file with problems is refused). */
		validOnly: z.boolean().default(false),
		/** The revision the import is applied to (required with confirm; a stale one gets 409). */
		revision: z.number().int().positive().optional()
	})
	.refine((b) => (b.text === undefined) !== (b.base64 === undefined), { message: 'Send the file as text or as base64, one of the two.', path: ['text'] })
	.refine((b) => !b.confirm || b.revision !== undefined, { message: 'Send the revision number the import applies to.', path: ['revision'] });

/**
 * POST /api/diagrams/:id/import { text | base64, confirm?, validOnly?, revision? }
 * → preview { preview: { issues, goodRows, badRows, summary, … }, revision }, nothing saved; or,
 * with confirm, the good rows applied as one new revision → { diagram, preview }.
 * A file with problems and no validOnly → 400 with the problems; a stale revision → 409.
 */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'edit');
	const body = await readBody(request, importBody, { fileFields: ['text'] });
	const current = validateDocument(diagram.document);
	if (!current.ok) throw new BadRequest('This diagram’s document has problems; fix them before importing into it.', current.errors);

	let input: string | Uint8Array;
	if (body.base64 !== undefined) {
		const bytes = Buffer.from(body.base64, 'base64');
		if (bytes.byteLength > MAX_BYTES) throw new BadRequest('The file is larger than 2 MB.');
		input = new Uint8Array(bytes);
	} else input = body.text!;

	// The decoded file, before any row is read into the document: a NUL or a lone surrogate is
	// named by its row (the database could not keep the document that holds it).
	const badLine = findBadLine(typeof input === 'string' ? input : decodeBytes(input).text);
	if (badLine) throw new BadRequest(badLine.message, [{ path: `row ${badLine.row}`, message: badLine.message }]);
	const table = readWireList(input);
	const plan = planImport(current.doc, table);
	const preview = {
		encoding: table.encoding,
		separator: table.separator,
		header: table.header,
		dataRows: table.dataRows,
		goodRows: plan.goodRows,
		badRows: plan.badRows,
		issues: plan.issues,
		summary: plan.summary
	};
	if (!body.confirm) return json({ preview, revision: diagram.revision });

	if (plan.issues.length && !body.validOnly) {
		return apiError(400, {
			error: `The file has ${counted(plan.issues.length, 'problem')} in ${counted(plan.badRows.length, 'row')}; nothing was imported. Fix them, or import the good rows only.`,
			issues: plan.issues.map((i) => ({ path: `row ${i.row}${i.column ? `, ${i.column}` : ''}`, message: `${i.message} (expected ${i.expected})` }))
		});
	}
	const stale = () =>
		apiError(409, {
			error: `This diagram was saved elsewhere and is now at revision ${diagram.revision}; the import was for revision ${body.revision}. Preview it again, then import.`,
			revision: diagram.revision
		});
	// Checked here for a clear answer; the conditional save below is what guarantees it.
	if (body.revision !== diagram.revision) return stale();
	if (plan.document === current.doc) throw new BadRequest('The file has no rows to import that would change the diagram.');
	const saved = await diagrams.save(diagram.id, body.revision!, plan.document, locals.user!.id);
	if (!saved.ok) {
		return apiError(409, {
			error: `This diagram was saved elsewhere and is now at revision ${saved.currentRevision}; the import was for revision ${body.revision}. Preview it again, then import.`,
			revision: saved.currentRevision
		});
	}
	return json({ diagram: diagrams.toJson(saved.diagram, true), preview });
});
