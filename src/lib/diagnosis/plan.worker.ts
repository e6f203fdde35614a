// Planning off the page's thread: diagnose() on a loom of fifty parts takes a few hundred ms,
// during which the reading entry must keep answering. One message in, one out.
import { basePlan, planDiagnosis, type PlanInputs, type ReadingJson } from './session';
import type { DiagnoseResult } from '../circuit/diagnose';
import { planView, type PlanView } from './view';
import type { HarnessDocument } from '../circuit/schema';

export type PlanRequest = { id: number; document: HarnessDocument; diagnosis: PlanInputs; readings: ReadingJson[] };
export type PlanReply = { id: number; plan: PlanView } | { id: number; error: string };

const scope = self as unknown as { onmessage: ((event: MessageEvent<PlanRequest>) => void) | null; postMessage(message: PlanReply): void };

// The plan before readings, kept while the diagnosis (marks, scenario, meter, uncertainty) stays the same:
// each reading then re-plans from the prediction table without solving the circuit again.
let kept: { key: string; base: DiagnoseResult } | null = null;

scope.onmessage = (event) => {
	const { id, document, diagnosis, readings } = event.data;
	try {
		const key = JSON.stringify([document.parts.length, document.wires.length, diagnosis]);
		if (kept?.key !== key) kept = { key, base: basePlan(document, diagnosis) };
		scope.postMessage({ id, plan: planView(planDiagnosis(document, diagnosis, readings, kept.base), 'all') });
	} catch (e) {
		scope.postMessage({ id, error: e instanceof Error ? e.message : String(e) });
	}
};
