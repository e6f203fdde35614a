import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireDiagram } from '$lib/server/access';
import { documentToPlan, scenarioToPlan } from '$lib/server/documents';
import { BadRequest, endpoint, readBody } from '$lib/server/http';
import { buildCircuit } from '$lib/circuit/circuit';
import { ENTRY_DMM, meterFor, setupScenario, shownReading, unitOf } from '$lib/circuit/meter';
import { Base, predictReadings } from '$lib/circuit/predict';
import type { HarnessDocument } from '$lib/circuit/schema';
import { DiagnoseError } from '$lib/circuit/diagnose';
import type { Change } from '$lib/circuit/faults';
import type { Scenario } from '$lib/circuit/scenario';
import { faultChanges, noFault, readingsIf } from '$lib/circuit/what-if';
import type { RequestHandler } from './$types';

const Point = z.union([z.literal('earth'), z.literal('chassis'), z.object({ part: z.string().min(1), terminal: z.string().min(1) })]);
const Probe = z.object({
	id: z.string().min(1).max(120),
	kind: z.enum(['volts', 'drop', 'lamp', 'ohms']),
	at: Point,
	to: Point.default('earth')
});
const Body = z
	.object({
		scenario: z.unknown().optional(),
		probes: z.array(Probe).max(2000).default([]),
		// Probe ids as the probe plan names them (joints, drops, part-out readings included).
		planProbes: z.array(z.string().min(1).max(200)).max(2000).default([]),
		// A fault id as the probe plan's suspects name them: readings as if it were there.
		fault: z.string().min(1).max(200).optional()
	})
	.refine((b) => b.probes.length + b.planProbes.length > 0, { path: ['probes'], message: 'name at least one probe (probes or planProbes)' });

function checkPoint(doc: HarnessDocument, p: z.output<typeof Point>, path: string) {
	if (typeof p === 'string') return [];
	const part = doc.parts.find((x) => x.id === p.part);
	if (!part) return [{ path: `${path}.part`, message: `no part "${p.part}" in this diagram` }];
	if (!part.terminals.includes(p.terminal)) return [{ path: `${path}.terminal`, message: `part ${part.key} has no terminal "${p.terminal}"; it has ${part.terminals.join(', ')}` }];
	return [];
}

/**
 * POST /api/diagrams/:id/predict { scenario?, probes?: [{ id, kind, at, to? }], planProbes?: [id], fault? }
 * → { revision, readings: [{ id, reading, unit }] } for the healthy circuit, or with `fault` as if
 * that fault were there (entry-level DMM, 5 W test lamp; ohms with the battery disconnected).
 */
export const POST: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'view');
	const input = await readBody(request, Body);
	const doc = documentToPlan(diagram.document);
	const scenario = scenarioToPlan(doc, input.scenario);
	const issues: { path: string; message: string }[] = [];
	let changes: Change[] = [];
	if (input.fault) {
		const c = buildCircuit(doc, scenario);
		const found = faultChanges(c, new Base(c), input.fault);
		if (found) changes = found;
		else issues.push({ path: 'fault', message: noFault(input.fault) });
	}
	issues.push(...input.probes.flatMap((p, i) => [...checkPoint(doc, p.at, `probes[${i}].at`), ...checkPoint(doc, p.to, `probes[${i}].to`)]));
	if (issues.length) throw new BadRequest('Some probes name points that are not in the diagram.', issues);
	const powered = input.probes.map((p, i) => [p, i] as const).filter(([p]) => p.kind !== 'ohms');
	const ohms = input.probes.map((p, i) => [p, i] as const).filter(([p]) => p.kind === 'ohms');
	const out: { id: string; reading: number | 'OL'; unit: string }[] = input.probes.map((p) => ({ id: p.id, reading: 0, unit: unitOf(p.kind) }));
	const run = (setup: Scenario, list: typeof powered) => {
		if (!list.length) return;
		const rows = predictReadings(new Base(buildCircuit(doc, setup)), [{ changes }], list.map(([p]) => meterFor(p.kind, p.at, p.to, ENTRY_DMM, doc.vehicle.systemVoltage)));
		list.forEach(([p, i], r) => (out[i].reading = shownReading(p.kind, rows[r][0], ENTRY_DMM)));
	};
	run(scenario, powered);
	run(setupScenario(doc, scenario, 'power-off'), ohms);
	let planned: { id: string; reading: number; unit: string }[] = [];
	if (input.planProbes.length) {
		try {
			planned = readingsIf({ doc, scenario, probes: input.planProbes, fault: input.fault }).map((r) => ({ id: r.id, reading: r.reading, unit: r.unit }));
		} catch (e) {
			if (e instanceof DiagnoseError) throw new BadRequest('Some probes name points that are not in the diagram.', e.issues.map((i) => ({ ...i, path: i.path.replace(/^probes/, 'planProbes') })));
			throw e;
		}
	}
	return json({ revision: diagram.revision, readings: [...out, ...planned] });
});
