import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireDiagram } from '$lib/server/access';
import { documentToPlan, scenarioToPlan } from '$lib/server/documents';
import { BadRequest, endpoint, readBody } from '$lib/server/http';
import { DiagnoseError, FAULT_KINDS } from '$lib/circuit/diagnose';
import { probePlanned } from '$lib/server/planning/pool';
import { DETAILS, type ProbePlanAnswer } from '$lib/server/planning/probe-plan';
import { PlanCache } from '$lib/server/planning/cache';
import { MARKS } from '$lib/circuit/symptoms';
import { METER_PROFILES, MeterProfileSchema, PROBE_KINDS } from '$lib/circuit/meter';
import { LOCATIONS } from '$lib/circuit/parts';
import type { RequestHandler } from './$types';

const Body = z.object({
	scenario: z.unknown().optional(),
	marks: z.array(z.object({ part: z.string().min(1), mark: z.enum(MARKS) })).min(1, 'mark at least one part'),
	meter: z.union([z.enum(Object.keys(METER_PROFILES) as [string, ...string[]]), MeterProfileSchema]).optional(),
	readings: z.record(z.string(), z.union([z.number().finite(), z.literal('OL'), z.literal('unreachable')])).optional(),
	weights: z.partialRecord(z.enum(FAULT_KINDS), z.number().nonnegative()).optional(),
	reach: z.partialRecord(z.enum(LOCATIONS), z.number().positive()).optional(),
	tools: z.array(z.enum(PROBE_KINDS)).min(1).optional(),
	detail: z.enum(DETAILS).optional()
});

/** Answers kept per drawing revision and question: asking again does not plan again. */
const answers = new PlanCache<ProbePlanAnswer>();

/**
 * POST /api/diagrams/:id/probe-plan { scenario?, marks, meter?, readings?, weights?, reach?, tools?, detail? }
 * → { revision, explainedBy, suspects, probes, probeCount, minimalSet, ambiguityGroups, plan, readings?, notes }:
 * `probes` are those the plan's steps and the minimal set name, every candidate with detail "full".
 */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'view');
	const input = await readBody(request, Body);
	const doc = documentToPlan(diagram.document);
	const scenario = scenarioToPlan(doc, input.scenario);
	const meter = typeof input.meter === 'string' ? METER_PROFILES[input.meter] : input.meter;
	try {
		const asked = { doc, scenario, marks: input.marks, meter, readings: input.readings, weights: input.weights, reach: input.reach, tools: input.tools };
		// The drawing is fixed by its revision; the rest of the key is what was asked. Whole tables
		// (detail "full", megabytes on a large harness) are not kept.
		const key = input.detail === 'full' ? null : `${diagram.id}:${diagram.revision}:${JSON.stringify({ ...asked, doc: undefined })}`;
		return json(await answers.getOrMake(key, () => probePlanned(asked, diagram.revision, input.detail)));
	} catch (e) {
		if (e instanceof DiagnoseError) throw new BadRequest('Some fields need fixing.', e.issues);
		throw e;
	}
});
