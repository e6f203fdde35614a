// A stored diagnosis as the planner sees it: the marks, scenario and meter it was started with,
// and the readings taken so far (the latest of each probe counts; struck ones do not). Runs the
// same in the server (API, checklist, PDF) and in the browser (the diagnosis page, offline too).
import { diagnose, explainPairs, withReadings, type DiagnoseResult } from '../circuit/diagnose';
import { ENTRY_DMM, METER_PROFILES, MeterProfileSchema, type MeterProfile } from '../circuit/meter';
import type { Scenario } from '../circuit/scenario';
import type { HarnessDocument } from '../circuit/schema';
import type { PartMark } from '../circuit/symptoms';
import type { Uncertainty, UncertaintyInput } from '../circuit/uncertainty';

export type ReadingOutcome = 'value' | 'over-range' | 'unreachable';

export interface ReadingJson {
	id?: number;
	clientId: string;
	probeId: string;
	outcome: ReadingOutcome;
	value: number | null;
	unit: string;
	note: string;
	takenAt: string;
	takenBy?: string | null;
	struck?: boolean;
	/** Not yet on the server (typed offline). */
	queued?: boolean;
}

export interface DiagnosisJson {
	id: string;
	diagramId: string;
	vehicleId: string;
	diagramRevision: number;
	title: string;
	scenario: Scenario;
	marks: PartMark[];
	meter: string | MeterProfile;
	/** What the drawing cannot know, as ranges; null: the defaults (TRADE.md). */
	uncertainty: Uncertainty | null;
	status: 'open' | 'concluded';
	foundSuspect: string | null;
	foundLabel: string;
	conclusion: string;
	partsReplaced: string[];
	version: number;
	startedBy: string | null;
	createdAt: string;
	updatedAt: string;
	concludedAt: string | null;
}

export function meterOf(meter: DiagnosisJson['meter']): MeterProfile {
	if (typeof meter === 'string') return METER_PROFILES[meter] ?? ENTRY_DMM;
	const parsed = MeterProfileSchema.safeParse(meter);
	return parsed.success ? parsed.data : ENTRY_DMM;
}

/** Probe → what the planner is told: the latest reading of each probe that is not struck. */
export function readingsForPlan(readings: readonly ReadingJson[]): Record<string, number | 'OL' | 'unreachable'> {
	const latest = new Map<string, ReadingJson>();
	for (const r of readings) {
		if (r.struck) continue;
		const prev = latest.get(r.probeId);
		if (!prev || r.takenAt > prev.takenAt || (r.takenAt === prev.takenAt && (r.id ?? Infinity) > (prev.id ?? Infinity))) latest.set(r.probeId, r);
	}
	const out: Record<string, number | 'OL' | 'unreachable'> = {};
	for (const [probe, r] of latest) out[probe] = r.outcome === 'value' ? (r.value as number) : r.outcome === 'over-range' ? 'OL' : 'unreachable';
	return out;
}

export interface DiagnosisPlan {
	result: DiagnoseResult;
	/** The readings the plan used (probe → value). */
	used: Record<string, number | 'OL' | 'unreachable'>;
}

/** What a plan is made from, besides the document and the readings. */
export type PlanInputs = Pick<DiagnosisJson, 'scenario' | 'marks' | 'meter'> & { uncertainty?: UncertaintyInput | null };

/** The plan before any reading: the expensive part (circuit solves for every suspect), worth keeping. */
export function basePlan(doc: HarnessDocument, d: PlanInputs): DiagnoseResult {
	return diagnose({ doc, scenario: d.scenario, marks: d.marks, meter: meterOf(d.meter), uncertainty: d.uncertainty ?? undefined });
}

/** The plan with the readings taken; `base` (basePlan of the same document and diagnosis) saves the solves. */
export function planDiagnosis(doc: HarnessDocument, d: PlanInputs, readings: readonly ReadingJson[], base?: DiagnoseResult): DiagnosisPlan {
	const used = readingsForPlan(readings);
	const start = base ?? basePlan(doc, d);
	const meter = meterOf(d.meter);
	return { result: Object.keys(used).length ? explainPairs({ doc, scenario: d.scenario, meter }, withReadings(start, used, meter), used) : start, used };
}

/** Where the hunt stands, in words for the page's heading. */
export function standing(plan: DiagnoseResult): { kind: 'none' | 'narrowing' | 'one' | 'group'; remaining: number } {
	const remaining = plan.readings ? plan.readings.remaining.length : plan.suspects.length;
	if (remaining === 0) return { kind: 'none', remaining };
	if (remaining === 1) return { kind: 'one', remaining };
	if (!plan.plan.steps.length) return { kind: 'group', remaining };
	return { kind: 'narrowing', remaining };
}
