// Diagnosis plans run in a pool of worker threads (piscina), so one restorer's plan never holds up
// another's page: the server's own thread only reads, writes and answers. Each plan has a time
// budget and each thread a heap limit; past either the request gets a clear 503, not a server that
// grows or stalls. Where no built thread is found (vite dev, tests) the TypeScript source runs in
// the threads through tsx (thread-source.js).
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import type { DiagnoseInput, DiagnoseResult } from '../../circuit/diagnose';
import { DiagnoseError } from '../../circuit/diagnose';
import type { HarnessDocument } from '../../circuit/schema';
import type { DiagnosisPlan, PlanInputs, ReadingJson } from '../../diagnosis/session';
import { ServiceUnavailable } from '../http';
import type { PlanAnswer, PlanTask } from './thread';
import type { Detail, ProbePlanAnswer } from './probe-plan';

/** Longest a plan may run (ms); LOOM_PLAN_BUDGET_MS overrides. Invented: a restorer waits a minute at most. */
const budgetMs = () => Number(process.env.LOOM_PLAN_BUDGET_MS) || 60_000;
/** Heap per planning thread (MB); LOOM_PLAN_HEAP_MB overrides. Keeps any one case under 1 GB. */
const heapMb = () => Number(process.env.LOOM_PLAN_HEAP_MB) || 768;
/** Plans waiting for a thread before new ones are turned away (invented: 20 restorers, a few each). */
const queueLimit = () => Number(process.env.LOOM_PLAN_QUEUE) || 64;

/** Threads: every core but one, which the server's own thread keeps for pages; at least one. */
export function threadCount(): number {
	const set = Number(process.env.LOOM_PLAN_THREADS);
	return set > 0 ? Math.floor(set) : Math.max(1, availableParallelism() - 1);
}

/** The built thread (scripts/build-plan-thread.ts puts it beside the server's entry), else the source. */
function threadFile(): string {
	let dir = dirname(fileURLToPath(import.meta.url));
	for (let i = 0; i < 5; i++, dir = dirname(dir)) {
		const built = join(dir, 'plan-thread.js');
		if (existsSync(built)) return built;
	}
	return join(dirname(fileURLToPath(import.meta.url)), 'thread-source.js');
}

let pool: Piscina | null = null;

function threads(): Piscina {
	if (pool) return pool;
	const count = threadCount();
	pool = new Piscina({
		filename: threadFile(),
		minThreads: 0,
		maxThreads: count,
		// A thread stays a while after a plan: the next reading of the same hunt comes within minutes.
		idleTimeout: 5 * 60_000,
		maxQueue: queueLimit(),
		resourceLimits: { maxOldGenerationSizeMb: heapMb() }
	});
	// A thread that dies between plans (its heap spent, say) is replaced; the server carries on.
	pool.on('error', (e) => console.error('[planning]', e));
	return pool;
}

async function run<T>(task: PlanTask): Promise<T> {
	const p = threads();
	if (p.queueSize >= queueLimit()) throw new ServiceUnavailable('Every planning thread is busy. Try again in a few seconds.', 5);
	let answer: PlanAnswer<T>;
	try {
		answer = await p.run(task, { signal: AbortSignal.timeout(budgetMs()) });
	} catch (e) {
		throw unavailableFor(e) ?? e;
	}
	if (!answer.ok) throw new DiagnoseError(answer.issues);
	return answer.value;
}

function unavailableFor(e: unknown): ServiceUnavailable | null {
	const text = e instanceof Error ? `${e.name} ${e.message} ${(e as { code?: string }).code ?? ''}` : String(e);
	if (/abort/i.test(text))
		return new ServiceUnavailable(`The plan took longer than ${Math.round(budgetMs() / 1000)} s and was stopped. Mark fewer parts, or split the drawing into the circuits that matter, and try again.`, 30);
	if (/OUT_OF_MEMORY|out of memory/i.test(text))
		return new ServiceUnavailable(`The region of the drawing these marks reach is too large to reason about at once (it needed more than ${heapMb()} MB). Mark fewer parts, or split the drawing into the circuits that matter.`, 30);
	if (/queue/i.test(text)) return new ServiceUnavailable('Every planning thread is busy. Try again in a few seconds.', 5);
	return null;
}

/** The plan before readings (the circuit solves). */
export function basePlanned(doc: HarnessDocument, inputs: PlanInputs): Promise<DiagnoseResult> {
	return run({ kind: 'base', doc, inputs });
}

/** The plan with readings, from a kept base plan. */
export function readingsPlanned(doc: HarnessDocument, inputs: PlanInputs, readings: ReadingJson[], base: DiagnoseResult): Promise<DiagnosisPlan> {
	return run({ kind: 'readings', doc, inputs, readings, base });
}

/** A whole diagnosis as the probe-plan API asks it, in the API's answer (probe-plan.ts). */
export function probePlanned(input: DiagnoseInput, revision: number, detail?: Detail): Promise<ProbePlanAnswer> {
	return run({ kind: 'probe-plan', input, revision, detail });
}

/** Stops the threads (server shutdown, tests). */
export async function closePlanning(): Promise<void> {
	const p = pool;
	pool = null;
	await p?.destroy();
}
