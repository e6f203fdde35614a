// The probe-plan API's answer, shared by the route and the end-to-end benchmark. A whole
// harness's plan carries every candidate probe's prediction for every suspect (megabytes at a few
// hundred parts); the answer carries what a client acts on: the suspects, the plan's steps, the
// minimal set and the probes those name. `detail: 'full'` returns every probe.
import type { DiagnoseResult } from '../../circuit/diagnose';

export const DETAILS = ['steps', 'full'] as const;
export type Detail = (typeof DETAILS)[number];

export type ProbePlanAnswer = ReturnType<typeof probePlanAnswer>;

export function probePlanAnswer(r: DiagnoseResult, revision: number, detail: Detail = 'steps') {
	const named = new Set([...r.plan.steps.map((s) => s.probe), ...r.minimalSet.probes]);
	const probes = detail === 'full' ? r.probes : r.probes.filter((p) => named.has(p.id));
	return {
		revision,
		explainedBy: r.explainedBy,
		suspects: r.suspects,
		probes,
		probeCount: r.probes.length,
		minimalSet: r.minimalSet,
		ambiguityGroups: r.ambiguityGroups,
		plan: r.plan,
		...(r.readings ? { readings: r.readings } : {}),
		notes: r.notes
	};
}
