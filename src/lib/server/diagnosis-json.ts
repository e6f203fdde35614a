// What the API and the pages send of a plan: the planner's result without its internal table.
import type { DiagnosisPlan } from '$lib/diagnosis/session';

export function planJson({ result }: DiagnosisPlan) {
	return {
		explainedBy: result.explainedBy,
		suspects: result.suspects,
		probes: result.probes,
		minimalSet: result.minimalSet,
		ambiguityGroups: result.ambiguityGroups,
		plan: result.plan,
		...(result.readings ? { readings: result.readings } : {}),
		notes: result.notes
	};
}
