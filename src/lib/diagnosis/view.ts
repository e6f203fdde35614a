// What the pages and the API show of a plan: the planner's result without its internal table.
import type { DiagnosisPlan } from './session';

export function planView({ result }: DiagnosisPlan) {
	return {
		explainedBy: result.explainedBy,
		suspects: result.suspects,
		probes: result.probes,
		minimalSet: result.minimalSet,
		ambiguityGroups: result.ambiguityGroups,
		groups: result.groups,
		battery: result.battery,
		plan: result.plan,
		...(result.readings ? { readings: result.readings } : {}),
		notes: result.notes
	};
}
export type PlanView = ReturnType<typeof planView>;
