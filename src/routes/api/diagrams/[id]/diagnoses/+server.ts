import { json } from '@sveltejs/kit';
import { desc, eq } from 'drizzle-orm';
import { requireDiagram } from '$lib/server/access';
import { db } from '$lib/server/db';
import { diagnoses } from '$lib/server/db/schema';
import * as diagnosisStore from '$lib/server/diagnoses';
import { planView } from '$lib/diagnosis/view';
import { endpoint, readBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** GET /api/diagrams/:id/diagnoses → { diagnoses } of this diagram, newest first. */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const { diagram } = await requireDiagram({ ...locals, linkToken: null }, params.id, 'view');
	const rows = await db.select().from(diagnoses).where(eq(diagnoses.diagramId, diagram.id)).orderBy(desc(diagnoses.createdAt));
	return json({ diagnoses: rows.map(diagnosisStore.toJson) });
});

/**
 * POST /api/diagrams/:id/diagnoses { revision, marks, scenario?, meter?, uncertainty?, title? }
 * → 201 { diagnosis, plan }. Planned on the document at `revision`, which must be the latest;
 * `uncertainty` (circuit/uncertainty.ts) says what the drawing cannot know, defaults when absent.
 */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram({ ...locals, linkToken: null }, params.id, 'edit');
	const input = await readBody(request, diagnosisStore.StartSchema);
	const { diagnosis, plan } = await diagnosisStore.start(locals.user!, diagram, input);
	return json({ diagnosis, plan: planView(plan) }, { status: 201 });
});
