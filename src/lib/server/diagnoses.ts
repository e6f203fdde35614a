// Diagnoses: one fault hunt on a vehicle, planned on its diagram as it stood at one revision.
// Readings are appended (never edited; a later reading of the same probe counts instead, and a
// reading can be struck); each carries a client-made id, so a reading queued offline and sent
// again is stored once. Marks, scenario, what the drawing cannot know (the uncertainty) and the
// conclusion change under a version check.
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { z } from 'zod';
import { DiagnoseError } from '../circuit/diagnose';
import { METER_PROFILES, MeterProfileSchema } from '../circuit/meter';
import type { HarnessDocument } from '../circuit/schema';
import { MARKS } from '../circuit/symptoms';
import { checkUncertainty, UncertaintySchema, type Uncertainty } from '../circuit/uncertainty';
import { readingsForPlan, type DiagnosisJson, type DiagnosisPlan, type PlanInputs, type ReadingJson } from '../diagnosis/session';
import type { DiagnoseResult } from '../circuit/diagnose';
import { db } from './db';
import { diagnoses, diagnosisReadings, diagramRevisions, users, type Diagnosis, type DiagnosisReading, type Diagram } from './db/schema';
import { documentToPlan, scenarioToPlan } from './documents';
import { BadRequest } from './http';
import type { Issue } from './issues';
import * as planning from './planning/pool';
import { PlanCache } from './planning/cache';

export const MarkSchema = z.object({ part: z.string().min(1), mark: z.enum(MARKS) });
const MeterSchema = z.union([z.enum(Object.keys(METER_PROFILES) as [string, ...string[]]), MeterProfileSchema]);

export const StartSchema = z.object({
	/** The revision the person is looking at: the plan is made on exactly that document. */
	revision: z.number().int().positive(),
	title: z.string().trim().max(200).optional(),
	scenario: z.unknown().optional(),
	marks: z.array(MarkSchema).min(1, 'mark at least one part').max(40),
	meter: MeterSchema.default('entry-dmm'),
	/** What the drawing cannot know; absent: the defaults (TRADE.md). */
	uncertainty: UncertaintySchema.optional()
});

export const ReadingInputSchema = z
	.object({
		clientId: z.uuid('clientId must be a UUID made when the reading was typed'),
		probe: z.string().min(1).max(200),
		outcome: z.enum(['value', 'over-range', 'unreachable']),
		value: z.number().finite().nullable().optional(),
		unit: z.string().max(8).default(''),
		note: z.string().max(2000).default(''),
		takenAt: z.iso.datetime({ offset: true })
	})
	.superRefine((r, ctx) => {
		if (r.outcome === 'value' && (r.value === null || r.value === undefined)) ctx.addIssue({ code: 'custom', path: ['value'], message: 'enter the number the meter shows, or choose "over range" or "couldn\u2019t reach"' });
		if (r.outcome !== 'value' && r.value !== null && r.value !== undefined) ctx.addIssue({ code: 'custom', path: ['value'], message: `no value with "${r.outcome}"` });
	});
export const ReadingsSchema = z.object({ readings: z.array(ReadingInputSchema).min(1).max(200) });

export const ConcludeSchema = z.object({
	version: z.number().int().positive(),
	foundSuspect: z.string().min(1).max(200).nullable().default(null),
	conclusion: z.string().trim().max(4000).default(''),
	partsReplaced: z.array(z.string().trim().min(1, 'name the part, or remove the empty line').max(200)).max(50).default([])
});

export const UpdateSchema = z.object({
	version: z.number().int().positive(),
	title: z.string().trim().min(1).max(200).optional(),
	marks: z.array(MarkSchema).min(1, 'mark at least one part').max(40).optional(),
	scenario: z.unknown().optional(),
	meter: MeterSchema.optional(),
	/** New ranges for what the drawing cannot know; null goes back to the defaults. */
	uncertainty: UncertaintySchema.nullable().optional(),
	/** Reopen a concluded hunt (the conclusion is kept until concluded again). */
	status: z.literal('open').optional()
});

export function toJson(d: Diagnosis): DiagnosisJson {
	return {
		id: d.id,
		diagramId: d.diagramId,
		vehicleId: d.vehicleId,
		diagramRevision: d.diagramRevision,
		title: d.title,
		scenario: d.scenario as DiagnosisJson['scenario'],
		marks: d.marks as DiagnosisJson['marks'],
		meter: d.meter as DiagnosisJson['meter'],
		uncertainty: uncertaintyOfRow(d.uncertainty),
		status: d.status,
		foundSuspect: d.foundSuspect,
		foundLabel: d.foundLabel,
		conclusion: d.conclusion,
		partsReplaced: d.partsReplaced as string[],
		version: d.version,
		startedBy: d.startedBy,
		createdAt: d.createdAt.toISOString(),
		updatedAt: d.updatedAt.toISOString(),
		concludedAt: d.concludedAt?.toISOString() ?? null
	};
}

/** A stored uncertainty read back through its schema (a range stored before a default was added gets it); unreadable: the defaults. */
function uncertaintyOfRow(stored: unknown): Uncertainty | null {
	if (stored === null || stored === undefined) return null;
	const parsed = UncertaintySchema.safeParse(stored);
	return parsed.success ? parsed.data : null;
}

/** The uncertainty checked against the document it is for, or a 400 naming each field. */
function checkedUncertainty(doc: HarnessDocument, u: Uncertainty | null | undefined): void {
	if (!u) return;
	const issues = checkUncertainty(doc, u);
	if (issues.length) throw new BadRequest('Some ranges need fixing.', issues.map((i) => ({ path: `uncertainty.${i.path}`, message: i.message })));
}

function readingJson(r: DiagnosisReading & { takenByName?: string | null }): ReadingJson {
	return {
		id: r.id,
		clientId: r.clientId,
		probeId: r.probeId,
		outcome: r.outcome,
		value: r.value,
		unit: r.unit,
		note: r.note,
		takenAt: r.takenAt.toISOString(),
		takenBy: r.takenByName ?? null,
		struck: r.supersededAt !== null
	};
}

/** The diagram's document as it stood at a revision (its history keeps every accepted save). */
export async function documentAt(diagramId: string, revision: number): Promise<HarnessDocument> {
	const [row] = await db
		.select({ document: diagramRevisions.document })
		.from(diagramRevisions)
		.where(and(eq(diagramRevisions.diagramId, diagramId), eq(diagramRevisions.revision, revision)));
	if (!row) throw new BadRequest(`Revision ${revision} of this diagram is not in its history.`, [{ path: 'revision', message: `no revision ${revision}` }]);
	return documentToPlan(row.document);
}

// Plans are pure functions of the diagnosis version and uncertainty (marks, scenario, meter and
// uncertainty change the version; the document is fixed by the diagnosis's revision) and the
// readings in force: both are kept, so re-opening a diagnosis, printing its checklist or checking
// a reading's probe does not plan again. The circuit solves (the plan before readings) run in the
// planning threads (planning/pool.ts), kept in planning/cache.ts.
const bases = new PlanCache<DiagnoseResult>();
const plans = new PlanCache<DiagnosisPlan>();
type Keyed = PlanInputs & { id?: string; version?: number };
const keyOf = (d: Keyed) => (d.id ? `${d.id}:${d.version}:${JSON.stringify(d.uncertainty ?? null)}` : null);

const base = (doc: HarnessDocument, d: Keyed): Promise<DiagnoseResult> => bases.getOrMake(keyOf(d), () => planning.basePlanned(doc, inputsOf(d)));

const inputsOf = (d: Keyed): PlanInputs => ({ scenario: d.scenario, marks: d.marks, meter: d.meter, uncertainty: d.uncertainty ?? null });

/** Plans, turning the planner's field errors into a 400. */
async function plan(doc: HarnessDocument, d: Keyed, readings: ReadingJson[]): Promise<DiagnosisPlan> {
	try {
		const used = readingsForPlan(readings);
		const key = keyOf(d);
		const start = await base(doc, d);
		if (!Object.keys(used).length) return { result: start, used };
		return await plans.getOrMake(key && `${key}|${JSON.stringify(used)}`, () => planning.readingsPlanned(doc, inputsOf(d), readings, start));
	} catch (e) {
		if (e instanceof DiagnoseError) throw new BadRequest('Some fields need fixing.', e.issues);
		throw e;
	}
}

export async function start(user: SessionUser, diagram: Diagram, input: z.output<typeof StartSchema>): Promise<{ diagnosis: DiagnosisJson; plan: DiagnosisPlan }> {
	if (input.revision !== diagram.revision) {
		throw new BadRequest(`The diagram was saved again (now revision ${diagram.revision}); start from the latest drawing.`, [{ path: 'revision', message: `revision ${input.revision} is not the latest (${diagram.revision})` }]);
	}
	const doc = await documentAt(diagram.id, diagram.revision);
	const scenario = scenarioToPlan(doc, input.scenario);
	const names = new Map(doc.parts.map((p) => [p.id, p]));
	const title = input.title || describeMarks(input.marks.map((m) => ({ ...m, key: names.get(m.part)?.key ?? m.part, label: names.get(m.part)?.label ?? '' })));
	checkedUncertainty(doc, input.uncertainty);
	const draft = { scenario, marks: input.marks, meter: input.meter, uncertainty: input.uncertainty ?? null };
	const planned = await plan(doc, draft, []);
	const [row] = await db
		.insert(diagnoses)
		.values({ diagramId: diagram.id, vehicleId: diagram.vehicleId, startedBy: user.id, diagramRevision: diagram.revision, title, ...draft })
		.returning();
	const diagnosis = toJson(row);
	bases.set(keyOf(diagnosis)!, planned.result);
	return { diagnosis, plan: planned };
}

const MARK_WORDS: Record<(typeof MARKS)[number], string> = { 'reads-low': 'reads low', 'reads-high': 'reads high', dead: 'dead', erratic: 'erratic', normal: 'normal' };
/** "20 Fuel gauge and 21 Temperature gauge read low" — the default title. */
export function describeMarks(marks: { key: string; label: string; mark: (typeof MARKS)[number] }[]): string {
	const off = marks.filter((m) => m.mark !== 'normal');
	const list = off.length ? off : marks;
	const groups = new Map<string, string[]>();
	for (const m of list) (groups.get(m.mark) ?? groups.set(m.mark, []).get(m.mark)!).push(`${m.key} ${m.label}`.trim());
	return [...groups].map(([mark, names]) => `${names.join(' and ')}: ${MARK_WORDS[mark as keyof typeof MARK_WORDS]}`).join('; ').slice(0, 200);
}

export async function readingsOf(diagnosisId: string): Promise<ReadingJson[]> {
	const rows = await db
		.select({ r: diagnosisReadings, takenByName: users.displayName })
		.from(diagnosisReadings)
		.leftJoin(users, eq(users.id, diagnosisReadings.takenBy))
		.where(eq(diagnosisReadings.diagnosisId, diagnosisId))
		.orderBy(asc(diagnosisReadings.takenAt), asc(diagnosisReadings.id));
	return rows.map(({ r, takenByName }) => readingJson({ ...r, takenByName }));
}

export interface Loaded {
	diagnosis: DiagnosisJson;
	document: HarnessDocument;
	readings: ReadingJson[];
}

export async function load(d: Diagnosis): Promise<Loaded> {
	const [document, readings] = await Promise.all([documentAt(d.diagramId, d.diagramRevision), readingsOf(d.id)]);
	return { diagnosis: toJson(d), document, readings };
}

export function planOf(loaded: Loaded): Promise<DiagnosisPlan> {
	return plan(loaded.document, loaded.diagnosis, loaded.readings);
}

/**
 * Stores readings; ones already stored (same clientId) are left as they are. Probes and units are
 * checked against the plan's probes; every problem comes back with its index.
 */
export async function addReadings(user: SessionUser, loaded: Loaded, input: z.output<typeof ReadingsSchema>['readings']): Promise<{ stored: number; already: number }> {
	const probes = new Map((await plan(loaded.document, loaded.diagnosis, [])).result.probes.map((p) => [p.id, p]));
	const issues: Issue[] = [];
	input.forEach((r, i) => {
		const p = probes.get(r.probe);
		if (!p) return issues.push({ path: `readings[${i}].probe`, message: `no probe "${r.probe}" in this diagnosis's plan` });
		if (r.unit && r.unit !== p.unit) issues.push({ path: `readings[${i}].unit`, message: `this probe reads in ${p.unit}, not ${r.unit}` });
		if (r.outcome === 'value' && p.unit === 'Ω' && (r.value as number) < 0) issues.push({ path: `readings[${i}].value`, message: 'ohms cannot be negative: check the leads' });
		if (r.outcome === 'value' && p.unit === '%' && ((r.value as number) < 0 || (r.value as number) > 200)) issues.push({ path: `readings[${i}].value`, message: 'test lamp brightness is 0 (dark) to 100 (full); up to 200 if brighter than usual' });
		if (r.outcome === 'value' && p.unit === 'V' && Math.abs(r.value as number) > 100) issues.push({ path: `readings[${i}].value`, message: 'more than 100 V on a vehicle circuit: check the meter range and setting' });
	});
	if (issues.length) throw new BadRequest('Some readings need fixing.', issues);
	const rows = await db
		.insert(diagnosisReadings)
		.values(
			input.map((r) => ({
				diagnosisId: loaded.diagnosis.id,
				clientId: r.clientId,
				probeId: r.probe,
				outcome: r.outcome,
				value: r.outcome === 'value' ? (r.value as number) : null,
				unit: probes.get(r.probe)!.unit,
				note: r.note,
				takenBy: user.id,
				takenAt: new Date(r.takenAt)
			}))
		)
		.onConflictDoNothing({ target: [diagnosisReadings.diagnosisId, diagnosisReadings.clientId] })
		.returning({ id: diagnosisReadings.id });
	await db.update(diagnoses).set({ updatedAt: new Date() }).where(eq(diagnoses.id, loaded.diagnosis.id));
	return { stored: rows.length, already: input.length - rows.length };
}

/** Strikes a reading (a slip of the probe): it stays in the record, the plan ignores it. False when there is no such reading. */
export async function strikeReading(diagnosisId: string, readingId: number): Promise<boolean> {
	const rows = await db
		.update(diagnosisReadings)
		.set({ supersededAt: sql`coalesce(${diagnosisReadings.supersededAt}, now())` })
		.where(and(eq(diagnosisReadings.diagnosisId, diagnosisId), eq(diagnosisReadings.id, readingId)))
		.returning({ id: diagnosisReadings.id });
	return rows.length > 0;
}

export class StaleVersion extends Error {
	constructor(readonly current: number) {
		super('stale');
	}
}

async function writeVersioned(d: DiagnosisJson, version: number, set: Partial<typeof diagnoses.$inferInsert>): Promise<DiagnosisJson> {
	const [row] = await db
		.update(diagnoses)
		.set({ ...set, version: sql`${diagnoses.version} + 1`, updatedAt: new Date() })
		.where(and(eq(diagnoses.id, d.id), eq(diagnoses.version, version)))
		.returning();
	if (!row) {
		const [cur] = await db.select({ version: diagnoses.version }).from(diagnoses).where(eq(diagnoses.id, d.id));
		throw new StaleVersion(cur?.version ?? 0);
	}
	return toJson(row);
}

/**
 * Changes the marks, scenario, meter, uncertainty, title or status in one write under the version
 * check: a stale version changes nothing (StaleVersion). A new plan input is planned first, so a
 * plan that cannot be made is a 400 before anything is stored.
 */
export async function update(loaded: Loaded, input: z.output<typeof UpdateSchema>): Promise<DiagnosisJson> {
	const next = {
		scenario: input.scenario !== undefined ? scenarioToPlan(loaded.document, input.scenario) : loaded.diagnosis.scenario,
		marks: input.marks ?? loaded.diagnosis.marks,
		meter: input.meter ?? loaded.diagnosis.meter,
		uncertainty: input.uncertainty !== undefined ? input.uncertainty : loaded.diagnosis.uncertainty
	};
	checkedUncertainty(loaded.document, next.uncertainty);
	const replanned = input.marks || input.scenario !== undefined || input.meter || input.uncertainty !== undefined ? await plan(loaded.document, next, []) : null;
	const saved = await writeVersioned(loaded.diagnosis, input.version, {
		...next,
		...(input.title ? { title: input.title } : {}),
		...(input.status === 'open' ? { status: 'open' as const, concludedAt: null } : {})
	});
	if (replanned) bases.set(keyOf(saved)!, replanned.result);
	return saved;
}

export async function conclude(loaded: Loaded, input: z.output<typeof ConcludeSchema>): Promise<DiagnosisJson> {
	let foundLabel = '';
	if (input.foundSuspect) {
		const suspect = (await planOf(loaded)).result.suspects.find((s) => s.id === input.foundSuspect);
		if (!suspect) throw new BadRequest('Some fields need fixing.', [{ path: 'foundSuspect', message: `"${input.foundSuspect}" is not one of this diagnosis's suspects` }]);
		foundLabel = suspect.label;
	}
	if (!input.foundSuspect && !input.conclusion) throw new BadRequest('Some fields need fixing.', [{ path: 'conclusion', message: 'say what was found, or choose the suspect it was' }]);
	return writeVersioned(loaded.diagnosis, input.version, {
		status: 'concluded',
		foundSuspect: input.foundSuspect,
		foundLabel,
		conclusion: input.conclusion,
		partsReplaced: input.partsReplaced,
		concludedAt: new Date()
	});
}

export async function remove(id: string): Promise<void> {
	await db.delete(diagnoses).where(eq(diagnoses.id, id));
}

export interface TimelineEntry {
	id: string;
	title: string;
	status: 'open' | 'concluded';
	diagramId: string;
	diagramRevision: number;
	startedBy: string | null;
	createdAt: string;
	concludedAt: string | null;
	foundLabel: string;
	conclusion: string;
	partsReplaced: string[];
	readings: number;
}

/** A vehicle's diagnoses, newest first, with how many readings each took. */
export async function timeline(vehicleId: string): Promise<TimelineEntry[]> {
	const rows = await db
		.select({
			d: diagnoses,
			startedBy: users.displayName,
			readings: sql<number>`(select count(*)::int from ${diagnosisReadings} where ${diagnosisReadings.diagnosisId} = ${diagnoses.id} and ${diagnosisReadings.supersededAt} is null)`
		})
		.from(diagnoses)
		.leftJoin(users, eq(users.id, diagnoses.startedBy))
		.where(eq(diagnoses.vehicleId, vehicleId))
		.orderBy(desc(diagnoses.createdAt));
	return rows.map(({ d, startedBy, readings }) => ({
		id: d.id,
		title: d.title,
		status: d.status,
		diagramId: d.diagramId,
		diagramRevision: d.diagramRevision,
		startedBy,
		createdAt: d.createdAt.toISOString(),
		concludedAt: d.concludedAt?.toISOString() ?? null,
		foundLabel: d.foundLabel,
		conclusion: d.conclusion,
		partsReplaced: d.partsReplaced as string[],
		readings
	}));
}
