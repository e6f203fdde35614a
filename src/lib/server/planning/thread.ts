// One planning thread (run by pool.ts): the circuit solves of a diagnosis take from a few hundred
// ms to seconds, and must not hold up the server's other requests meanwhile. Imports the circuit
// core only (no database, no SvelteKit), so it bundles on its own (scripts/build-plan-thread.ts).
import { diagnose, DiagnoseError, type DiagnoseInput, type DiagnoseResult } from '../../circuit/diagnose';
import { basePlan, planDiagnosis, type DiagnosisPlan, type PlanInputs, type ReadingJson } from '../../diagnosis/session';
import type { HarnessDocument } from '../../circuit/schema';
import { probePlanAnswer, type Detail, type ProbePlanAnswer } from './probe-plan';

export type PlanTask =
	| { kind: 'base'; doc: HarnessDocument; inputs: PlanInputs }
	| { kind: 'readings'; doc: HarnessDocument; inputs: PlanInputs; readings: ReadingJson[]; base: DiagnoseResult }
	| { kind: 'probe-plan'; input: DiagnoseInput; revision: number; detail?: Detail };

/** Errors cross the thread as plain data: a DiagnoseError keeps its field issues. */
export type PlanAnswer<T> = { ok: true; value: T } | { ok: false; issues: { path: string; message: string }[] };

export function runTask(task: PlanTask): PlanAnswer<DiagnoseResult | DiagnosisPlan | ProbePlanAnswer> {
	try {
		switch (task.kind) {
			case 'base':
				return { ok: true, value: basePlan(task.doc, task.inputs) };
			case 'readings':
				return { ok: true, value: planDiagnosis(task.doc, task.inputs, task.readings, task.base) };
			case 'probe-plan':
				// Made small here: the whole table never crosses to the server's thread.
				return { ok: true, value: probePlanAnswer(diagnose(task.input), task.revision, task.detail) };
		}
	} catch (e) {
		if (e instanceof DiagnoseError) return { ok: false, issues: e.issues };
		throw e;
	}
}

export default runTask;
