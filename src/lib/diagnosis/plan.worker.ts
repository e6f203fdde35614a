// Planning off the page's thread: diagnose() on a loom of fifty parts takes a few hundred ms,
// during which the reading entry must keep answering. One message in, one out.
import { planDiagnosis, type DiagnosisJson, type ReadingJson } from './session';
import { planView, type PlanView } from './view';
import type { HarnessDocument } from '../circuit/schema';

export type PlanRequest = { id: number; document: HarnessDocument; diagnosis: Pick<DiagnosisJson, 'scenario' | 'marks' | 'meter'>; readings: ReadingJson[] };
export type PlanReply = { id: number; plan: PlanView } | { id: number; error: string };

const scope = self as unknown as { onmessage: ((event: MessageEvent<PlanRequest>) => void) | null; postMessage(message: PlanReply): void };

scope.onmessage = (event) => {
	const { id, document, diagnosis, readings } = event.data;
	try {
		scope.postMessage({ id, plan: planView(planDiagnosis(document, diagnosis, readings)) });
	} catch (e) {
		scope.postMessage({ id, error: e instanceof Error ? e.message : String(e) });
	}
};
