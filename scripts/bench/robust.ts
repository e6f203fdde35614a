/**
 * Benchmark of the diagnosis against vehicles as they really are (not a test).
 *
 * Each case plants one fault in a "true world" (src/lib/circuit/testing/worlds.ts): the drawn
 * harness with its battery, bulbs, gauges, loads, wire lengths, stabilizer and senders somewhere
 * in their tolerance (TRADE.md, "Tolerances for the uncertainty model"), and the fault at a true
 * size anywhere in its mode's span. The marks a person would make come from that true world; the
 * engine is given the drawn document, the restorer's scenario (senders where the document puts
 * them) and those marks, and is driven to its end with the readings a 3½-digit meter would show
 * in the true world. The same cases run twice: once in the nominal world (every value as drawn,
 * the fault at its own sweep value, no meter error but the display's rounding) and once robust.
 *
 * Cases: the invented demo harness with the ignition on, and with the lights on (side, tail,
 * panel and dipped head lamps draw), half of the cases; generated harnesses of 40–80 parts
 * (testing/generate.ts, six seeds) the other half. A fault is drawn by its site's prior
 * (faults.ts DEFAULT_WEIGHTS: the faults a restorer meets, as the engine assumes), then one of
 * the site's sweep values for the nominal run; the no-fault hypothesis is never planted.
 *
 * Marks: each observable part (symptoms.ts) that draws current in the true world without the
 * fault is judged by its quantity with the fault against without (markOf); every abnormal one is
 * marked, and the first two normal ones beside them (testing/worlds.ts marksSeen). A fuse the fault
 * overloads blows first (diagnose.ts settleFuses, on the true circuit). A fault that leaves every
 * part normal in either world is not noticed: another case is drawn, and the count printed.
 * Readings: each probe the plan asks for is read on the true world with the fault (candidate
 * probes of the true document over the whole harness, diagnose.ts probeReadings, the same solver
 * that agrees with ngspice), then the meter's error is drawn uniformly within ±(rel·|x| + abs) of
 * the probe's tolerance (its pulsing band left out) and the display rounds it, staying within that
 * spec as a meter's stated accuracy does (worlds.ts meterShows: 0.01 V, 0.1 Ω on 200 Ω, whole
 * points of lamp brightness, "OL" over range). The
 * hunt ends when the plan has no next probe, asks again for one already taken, or after 40.
 *
 * Outcomes are judged by site (a joint at 20 Ω and at 35 Ω is one site): correct when the true
 * site is in the final group (the suspects left, or all of them when nothing was read), exact
 * when it is the only site left; wrong when it is not there at the end ("never a suspect" counts
 * those it was never among, wrong or stuck); stuck when a true reading was refused (reported as
 * unexplained), diagnose or withReadings threw, or no suspect was left. Yardsticks on the
 * robust run: the walk a skilled restorer makes without a plan (volts along the marked parts'
 * feeds from the battery, then drops across the stretch where the volts first go wrong) with
 * the same true readings; the plan against the Huffman bound of its starting table. Timings:
 * starting the demo's open hunt, and planning again after one reading.
 *
 * Targets (printed beside the figures): correct ≥ 99 %, wrong ≤ 1 %, stuck 0 %, mean probes
 * ≤ 1.3× the nominal run; plan ≤ 0.7× the walk; starting a diagnosis ≤ 150 ms (median).
 *
 * Run: `npm run bench -- robust`; BENCH_ROBUST_CASES (default 500) sets the number of cases,
 * BENCH_ROBUST_SEED (default 7243) the seed, BENCH_ROBUST_TIMED (default and least 20; 0 leaves
 * the timings out) the timed runs, BENCH_ROBUST_WORKERS (default: the cores) how many child
 * processes run the cases. The cases are drawn in order in this process and handed out in groups
 * that share a starting diagnosis, so the figures do not depend on the number of workers.
 */
import { fork } from 'node:child_process';
import { availableParallelism, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { buildCircuit, type Circuit } from '../../src/lib/circuit/circuit';
import { demoHarness } from '../../src/lib/circuit/demo';
import { diagnose, fuseCurrents, probeReadings, settleFuses, withReadings, type DiagnoseResult } from '../../src/lib/circuit/diagnose';
import { generateHypotheses, type Change, type Hypothesis, type Region } from '../../src/lib/circuit/faults';
import { ENTRY_DMM } from '../../src/lib/circuit/meter';
import { probeNode } from '../../src/lib/circuit/meters';
import { nodeOfTerminal } from '../../src/lib/circuit/nets';
import { huffmanLowerBound } from '../../src/lib/circuit/plan';
import { Base } from '../../src/lib/circuit/predict';
import { candidateProbes, feedWalkOrder, type ProbeSpec } from '../../src/lib/circuit/probes';
import { defaultScenario, type Scenario } from '../../src/lib/circuit/scenario';
import type { HarnessDocument } from '../../src/lib/circuit/schema';
import type { PartMark } from '../../src/lib/circuit/symptoms';
import { generateHarness, prng, type Prng } from '../../src/lib/circuit/testing/generate';
import { drawFault, drawWorld, marksSeen, meterShows, nominalWorld, restorerScenario, type ShownKind, type TrueWorld } from '../../src/lib/circuit/testing/worlds';
import { prepareTrace, type TracePoint, type Tracer } from '../../src/lib/circuit/trace';
import { OPEN_HUNT } from '../../src/lib/diagnosis/demo';
import { readingsIf } from '../../src/lib/circuit/what-if';

const profile = ENTRY_DMM;
const now = () => performance.now();
/** Most probes a hunt may take before it counts as going nowhere. */
const MAX_STEPS = 40;
/** The walk's judgement of a volts reading: off the healthy one by more than 0.5 V or 5 %, whichever is larger (common practice). */
const WALK_VOLTS = { abs: 0.5, rel: 0.05 };
/** The walk's judgement of a drop across a joint or along a wire under load: above 0.2 V (TRADE.md, "Voltage drop under load"). */
const WALK_DROP = 0.2;

type Reading = number | 'OL';

/** A harness and scenario the cases are drawn over, with what every case of it shares. */
interface Setting {
	name: string;
	group: 'demo' | 'generated';
	doc: HarnessDocument;
	/** The restorer's scenario: switches as given, senders where the document puts them. */
	scenario: Scenario;
	c: Circuit;
	tracer: Tracer;
	sites: { site: string; prior: number; hyps: Hypothesis[] }[];
	totalPrior: number;
	/** Every candidate probe over the whole harness (nominal), for the walk's order and its healthy readings. */
	specs: ProbeSpec[];
	healthy: Map<string, number>;
	/** Lamps, motors and loads: the parts a probe may take out. */
	partOut: string[];
	/** Starting diagnoses by marks: the engine sees only the drawn document and the marks, so equal marks start alike. */
	started: Map<string, DiagnoseResult | Error>;
	/** Wall-clock time of each starting diagnosis made (ms). */
	startMs: number[];
	/** Wall-clock time spent planning again after readings (ms), summed. */
	replanMs: number;
}

function wholeHarness(doc: HarnessDocument): Region {
	const nodes = new Set<string>();
	for (const p of doc.parts) for (const t of p.terminals) nodes.add(nodeOfTerminal(p, t));
	return { parts: new Set(doc.parts.map((p) => p.id)), wires: new Set(doc.wires.map((w) => w.id)), nodes };
}

function makeSetting(name: string, group: Setting['group'], doc: HarnessDocument, given: Scenario): Setting {
	const scenario = restorerScenario(doc, given);
	const c = buildCircuit(doc, scenario);
	const base = new Base(c);
	const bySite = new Map<string, { site: string; prior: number; hyps: Hypothesis[] }>();
	for (const h of generateHypotheses(c)) {
		if (h.kind === 'none') continue;
		const s = bySite.get(h.site) ?? bySite.set(h.site, { site: h.site, prior: h.prior, hyps: [] }).get(h.site)!;
		s.hyps.push(h);
	}
	const sites = [...bySite.values()];
	const partOut = doc.parts.filter((p) => ['lamp', 'motor', 'load'].includes(p.kind)).map((p) => p.id);
	const specs = candidateProbes(doc, scenario, c, base.solution, wholeHarness(doc), { profile });
	const { healthy } = probeReadings(doc, scenario, c, base, [], specs, profile);
	return {
		name,
		group,
		doc,
		scenario,
		c,
		tracer: prepareTrace(doc, scenario),
		sites,
		totalPrior: sites.reduce((a, s) => a + s.prior, 0),
		specs,
		healthy: new Map(specs.map((s, i) => [s.id, healthy[i]])),
		partOut,
		started: new Map(),
		startMs: [],
		replanMs: 0
	};
}

export function settings(): Setting[] {
	const demo = demoHarness();
	const ign = defaultScenario(demo);
	const lights = { ...ign, switches: { ...ign.switches, 'light-switch': 'head' } };
	const out = [makeSetting('demo, ignition on', 'demo', demo, ign), makeSetting('demo, lights on', 'demo', demo, lights)];
	[40, 48, 56, 64, 72, 80].forEach((parts, k) => {
		// The first seed from 5100 + k, in steps of 10, that draws a harness a vehicle could have.
		for (let seed = 5100 + k; ; seed += 10) {
			const { doc, scenario } = generateHarness(seed, { parts });
			if (!plausible(doc, scenario)) continue;
			out.push(makeSetting(`generated ${doc.parts.length} parts (seed ${seed})`, 'generated', doc, scenario));
			break;
		}
	});
	return out;
}

/**
 * A generated harness a vehicle could have: every fuse carries no more than its rating, and every
 * relay is firmly in or out (its coil not between drop-out and pull-in as drawn, and the same
 * state in 20 true worlds). A random generator also draws fuses too small for their loads and
 * relays whose coils hang on one another's contacts; the engine notes such drawings (diagnose.ts)
 * but no true state can be planted in them.
 */
function plausible(doc: HarnessDocument, given: Scenario): boolean {
	const scenario = restorerScenario(doc, given);
	const c = buildCircuit(doc, scenario);
	const base = new Base(c);
	for (const f of fuseCurrents(base, c).values()) if (f.amps > f.rating) return false;
	const firm = c.relays.every((r) => {
		const v = base.coilVolts.get(r.part)!;
		return v < r.dropOut || v >= r.pullIn;
	});
	if (!firm) return false;
	const rng = prng(doc.parts.length);
	for (let i = 0; i < 20; i++) {
		const w = drawWorld(doc, scenario, rng);
		const b = new Base(buildCircuit(w.doc, w.scenario));
		if (c.relays.some((r, k) => b.energisedAt[k] !== base.energisedAt[k])) return false;
	}
	return true;
}

/** One world with its fault in place, ready to be read. */
interface Planted {
	world: TrueWorld;
	c: Circuit;
	base: Base;
	changes: Change[];
	marks: PartMark[];
}

function plant(world: TrueWorld, changes: Change[]): Planted {
	const c = buildCircuit(world.doc, world.scenario);
	const base = new Base(c);
	// A fuse the fault overloads blows in the true world too.
	const settled = settleFuses(base, c, { changes, label: '' }).changes;
	return { world, c, base, changes: settled, marks: marksSeen(c, base.solution, settled) };
}

/** True readings of a planted world by probe id, as the meter shows them; each probe read once per case. */
export function reader(p: Planted, partOut: string[], rng: Prng | null) {
	const specs = new Map(candidateProbes(p.world.doc, p.world.scenario, p.c, p.base.solution, wholeHarness(p.world.doc), { profile, partOut }).map((s) => [s.id, s]));
	const cache = new Map<string, Reading>();
	return (id: string): Reading => {
		const known = cache.get(id);
		if (known !== undefined) return known;
		const spec = specs.get(id);
		if (!spec) throw new Error(`robust bench: no probe "${id}" on the true world`);
		const { readings } = probeReadings(p.world.doc, p.world.scenario, p.c, p.base, [{ changes: p.changes }], [spec], profile);
		const kind: ShownKind = spec.kind === 'drop' || spec.kind === 'volts' || spec.kind === 'ohms' || spec.kind === 'lamp' ? spec.kind : 'volts';
		const shown = meterShows(kind, readings[0][0], { abs: spec.tolerance.abs, rel: spec.tolerance.rel }, profile, rng);
		cache.set(id, shown);
		return shown;
	};
}

/** Does a suspect's site name the true site (a double fault names both of its sites joined by "+")? */
const holds = (site: string, truth: string) => site === truth || site.startsWith(`${truth}+`) || site.endsWith(`+${truth}`);

interface Outcome {
	result: 'correct' | 'wrong' | 'stuck';
	exact: boolean;
	neverSuspect: boolean;
	probes: number;
	/** Distinct sites in the final group. */
	group: number;
	why?: string;
	/** The engine said to charge the battery before going on (a reading below its charge level). */
	charge?: boolean;
	start?: DiagnoseResult;
}

function started(setting: Setting, marks: PartMark[]): DiagnoseResult | Error {
	const key = JSON.stringify(marks);
	let r = setting.started.get(key);
	if (!r) {
		const t = now();
		try {
			r = diagnose({ doc: setting.doc, scenario: setting.scenario, marks });
		} catch (e) {
			r = e instanceof Error ? e : new Error(String(e));
		}
		setting.startMs.push(now() - t);
		setting.started.set(key, r);
	}
	return r;
}

/** Read loosely: the battery's state is a field of today's result that may change shape. */
const chargeFirst = (r: DiagnoseResult) => !!(r as { battery?: { charge?: boolean } | null }).battery?.charge;

/** Drive the engine to its end with true readings. */
export function hunt(setting: Setting, truth: string, marks: PartMark[], read: (id: string) => Reading): Outcome {
	const start = started(setting, marks);
	if (start instanceof Error) return { result: 'stuck', exact: false, neverSuspect: true, probes: 0, group: 0, why: 'diagnose threw' };
	const siteOf = new Map(start.suspects.map((s) => [s.id, s.site]));
	const neverSuspect = !start.suspects.some((s) => holds(s.site, truth));
	if (!start.suspects.length) return { result: 'stuck', exact: false, neverSuspect, probes: 0, group: 0, why: 'no suspect explains the marks', start };
	const readings: Record<string, Reading> = {};
	let r = start;
	let probes = 0;
	let why: string | undefined;
	const stuck = (reason: string): Outcome => ({ result: 'stuck', exact: false, neverSuspect, probes, group: 0, why: reason, charge: chargeFirst(r), start });
	for (let step = 0; step < MAX_STEPS; step++) {
		const next = r.plan?.steps?.[0]?.probe;
		if (!next) break;
		if (next in readings) {
			why = 'plan asked again for a probe already taken';
			break;
		}
		readings[next] = read(next);
		probes++;
		const t = now();
		try {
			r = withReadings(start, readings, profile);
		} catch {
			return stuck('withReadings threw');
		} finally {
			setting.replanMs += now() - t;
		}
		if (r.readings?.unexplained?.length) return stuck('a true reading was refused');
		if (r.readings && !r.readings.remaining.length) return stuck('no suspect left');
		if (step === MAX_STEPS - 1 && r.plan?.steps?.[0]) why = `still probing after ${MAX_STEPS} probes`;
	}
	const finalIds = r.readings ? r.readings.remaining.map((x) => x.suspect) : start.suspects.map((s) => s.id);
	const sites = new Set(finalIds.map((id) => siteOf.get(id) ?? id));
	const correct = [...sites].some((s) => holds(s, truth));
	return { result: correct ? 'correct' : 'wrong', exact: correct && sites.size === 1 && sites.has(truth), neverSuspect, probes, group: sites.size, why, charge: chargeFirst(r), start };
}

/**
 * The walk a skilled restorer makes without a plan, on the same true readings: volts to earth at
 * each point of the marked parts' feeds from the battery, then their earths (probes.ts
 * feedWalkOrder), stopping at the first reading off its healthy value; then the drop across each
 * joint and along each wire of the stretch between the last normal point and that one, in order
 * from the battery, until one reads above 0.2 V. Returns the probes taken and whether a drop
 * pointed at the fault's place.
 */
function walk(setting: Setting, abnormal: string[], start: DiagnoseResult, read: (id: string) => Reading): { probes: number; endedOnDrop: boolean } {
	const { doc, c, tracer } = setting;
	const order = feedWalkOrder(doc, setting.scenario, c, setting.specs, abnormal);
	const healthyOf = new Map(start.probes.map((p) => [p.id, p.healthy]));
	const healthy = (id: string) => healthyOf.get(id) ?? setting.healthy.get(id) ?? 0;
	// Each walked probe's place on its part's traced path (feed from the battery, then earth back).
	const nodeOf = new Map(setting.specs.filter((s) => order.includes(s.id)).map((s) => [s.id, s.meter.kind === 'volts' ? probeNode(c, s.meter.a) : -2]));
	const paths = abnormal.map((part) => [...(tracer.feed(part).paths[0] ?? []), ...[...(tracer.earth(part).paths[0] ?? [])].reverse()]);
	const placeOf = (id: string): { path: TracePoint[]; at: number } | null => {
		for (const path of paths) {
			const at = path.findIndex((pt) => pt.type === 'node' && c.nodeIndex.get(pt.node) === nodeOf.get(id));
			if (at >= 0) return { path, at };
		}
		return null;
	};
	let probes = 0;
	let lastNormal: { path: TracePoint[]; at: number } | null = null;
	for (const id of order) {
		const x = read(id);
		probes++;
		const h = healthy(id);
		const off = typeof x === 'number' && Math.abs(x - h) > Math.max(WALK_VOLTS.abs, WALK_VOLTS.rel * Math.abs(h));
		const here = placeOf(id);
		if (!off) {
			lastNormal = here;
			continue;
		}
		if (!here) return { probes, endedOnDrop: false };
		// The stretch: from the last normal point on the same path (else the path's start) to here.
		const from = lastNormal && lastNormal.path === here.path && lastNormal.at < here.at ? lastNormal.at : 0;
		let prevNode = -2;
		for (let i = from; i <= here.at; i++) {
			const pt = here.path[i];
			if (pt.type === 'node') {
				prevNode = c.nodeIndex.get(pt.node) ?? -2;
				continue;
			}
			if (pt.type !== 'wire') continue;
			const w = doc.wires.find((x) => x.id === pt.wire)!;
			const entry = c.terminalNode(w.from) === prevNode ? 'from' : 'to';
			const exit = entry === 'from' ? 'to' : 'from';
			for (const drop of [`joint:${w.id}:${entry}`, `drop:${w.id}`, `joint:${w.id}:${exit}`]) {
				const d = read(drop);
				probes++;
				if (typeof d === 'number' && Math.abs(d) > WALK_DROP) return { probes, endedOnDrop: true };
			}
		}
		return { probes, endedOnDrop: false };
	}
	return { probes, endedOnDrop: false };
}

const quantile = (xs: number[], q: number) => {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.floor(q * s.length))];
};

function timings(runs: number): void {
	const doc = demoHarness();
	const given = defaultScenario(doc);
	const scenario = { ...given, switches: { ...given.switches, ...(OPEN_HUNT.switches ?? {}) } };
	const input = { doc, scenario, marks: OPEN_HUNT.marks };
	for (let i = 0; i < 3; i++) diagnose(input);
	const startMs: number[] = [];
	let start: DiagnoseResult = diagnose(input);
	for (let i = 0; i < runs; i++) {
		const t = now();
		start = diagnose(input);
		startMs.push(now() - t);
	}
	const first = start.plan.steps[0]?.probe;
	const replanMs: number[] = [];
	if (first) {
		// The reading the planted fault gives at the first probe (what-if.ts), as a meter shows it.
		const [w] = readingsIf({ doc, scenario, probes: [first], fault: OPEN_HUNT.plantedFault });
		const spec = start.probes.find((p) => p.id === first)!;
		const shown = meterShows(spec.kind as ShownKind, w.reading, spec.tolerance, profile, null);
		for (let i = 0; i < 3; i++) withReadings(start, { [first]: shown }, profile);
		for (let i = 0; i < runs; i++) {
			const t = now();
			withReadings(start, { [first]: shown }, profile);
			replanMs.push(now() - t);
		}
	}
	const f = (xs: number[]) => (xs.length ? `median ${quantile(xs, 0.5).toFixed(1)} ms, p90 ${quantile(xs, 0.9).toFixed(1)} ms` : 'not timed (no first probe)');
	console.log(`\ntimings on the demo's open hunt ("${OPEN_HUNT.title}"), ${runs} runs after 3 warm-up runs (load average ${loadavg()[0].toFixed(1)} on ${availableParallelism()} cores):`);
	console.log(`  starting a diagnosis: ${f(startMs)} (target median ≤ 150 ms)`);
	console.log(`  planning again after one reading (${first ?? '—'}): ${f(replanMs)}`);
}


/** One case as drawn: the fault and both worlds with it planted. Everything follows from (setting, seed, draw number). */
interface Drawn {
	h: Hypothesis;
	nominal: Planted;
	robust: Planted;
}

export function drawCase(setting: Setting, seed: number, draw: number): Drawn {
	const rng = prng((Math.imul(seed, 0x9e3779b1) ^ Math.imul(draw + 1, 0x85ebca6b)) >>> 0);
	// The fault: a site by its prior, then one of its sweep values (the nominal run's size).
	let u = rng.next() * setting.totalPrior;
	const site = setting.sites.find((s) => (u -= s.prior) < 0) ?? setting.sites[setting.sites.length - 1];
	const h = rng.pick(site.hyps);
	const world = drawWorld(setting.doc, setting.scenario, rng);
	const robust = plant(world, drawFault(h, rng).changes);
	const nominal = plant(nominalWorld(setting.doc, setting.scenario), h.changes);
	return { h, nominal, robust };
}

/** A case kept: its number among the cases, its draw number and its setting. */
interface CaseRef {
	k: number;
	draw: number;
	setting: number;
}

/** What a case gives, as plain data (sent back by a worker). */
interface Row {
	k: number;
	draw: number;
	setting: number;
	kind: string;
	fault: string;
	nominal: Omit<Outcome, 'start'>;
	robust: Omit<Outcome, 'start'>;
	walk?: { probes: number; endedOnDrop: boolean };
	bound?: number;
}

function runCase(pool: Setting[], seed: number, ref: CaseRef): Row {
	const setting = pool[ref.setting];
	const { h, nominal, robust } = drawCase(setting, seed, ref.draw);
	const meterRng = prng((Math.imul(seed, 0x27d4eb2f) ^ Math.imul(ref.draw + 1, 0x165667b1)) >>> 0);
	const readRobust = reader(robust, setting.partOut, meterRng);
	const { start: _n, ...n } = hunt(setting, h.site, nominal.marks, reader(nominal, setting.partOut, null));
	const { start, ...b } = hunt(setting, h.site, robust.marks, readRobust);
	void _n;
	const row: Row = { k: ref.k, draw: ref.draw, setting: ref.setting, kind: h.kind, fault: h.id, nominal: n, robust: b };
	if (start) {
		const abnormal = robust.marks.filter((m) => m.mark !== 'normal').map((m) => m.part);
		row.walk = walk(setting, abnormal, start, readRobust);
		if (start.suspects.length) row.bound = huffmanLowerBound(start.table).probes;
	}
	return row;
}

/** Cases that share a starting diagnosis (same harness, same marks) go to one worker together, so each is made once. */
function tasksOf(refs: CaseRef[], keys: string[][]): CaseRef[][] {
	const parent = refs.map((_, i) => i);
	const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
	const byKey = new Map<string, number>();
	keys.forEach((ks, i) => {
		for (const key of ks) {
			const j = byKey.get(key);
			if (j === undefined) byKey.set(key, i);
			else parent[find(i)] = find(j);
		}
	});
	const groups = new Map<number, CaseRef[]>();
	refs.forEach((r, i) => (groups.get(find(i)) ?? groups.set(find(i), []).get(find(i))!).push(r));
	return [...groups.values()].sort((a, b) => b.length - a.length || a[0].k - b[0].k);
}

type TaskDone = { rows: Row[]; startMs: number[]; replanMs: number; ms: number };

function runTask(pool: Setting[], seed: number, task: CaseRef[]): TaskDone {
	const t = now();
	const rows = task.map((ref) => runCase(pool, seed, ref));
	const startMs: number[] = [];
	let replanMs = 0;
	for (const s of pool) {
		startMs.push(...s.startMs);
		s.startMs.length = 0;
		replanMs += s.replanMs;
		s.replanMs = 0;
		// No later task shares these marks (tasksOf), so the kept diagnoses can go.
		s.started.clear();
	}
	return { rows, startMs, replanMs, ms: now() - t };
}

/** Hand the tasks to `workers` child processes, each taking the next task when done; in this process when one. */
async function runTasks(pool: Setting[], seed: number, tasks: CaseRef[][], workers: number, progress: (done: number) => void): Promise<TaskDone[]> {
	const done: TaskDone[] = [];
	let cases = 0;
	const finish = (d: TaskDone) => {
		done.push(d);
		cases += d.rows.length;
		progress(cases);
	};
	if (workers <= 1) {
		for (const t of tasks) finish(runTask(pool, seed, t));
		return done;
	}
	let next = 0;
	const one = () =>
		new Promise<void>((resolve, reject) => {
			const child = fork(fileURLToPath(import.meta.url), [], { env: { ...process.env, BENCH_ROBUST_WORKER: '1' }, stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
			const give = () => {
				if (next < tasks.length) child.send({ seed, task: tasks[next++] });
				else child.send({ stop: true });
			};
			child.on('message', (m: { done?: TaskDone; error?: string }) => {
				if (m.error) {
					child.kill();
					reject(new Error(`robust bench worker: ${m.error}`));
					return;
				}
				if (m.done) finish(m.done);
				give();
			});
			child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`robust bench worker exited with ${code}`))));
			give();
		});
	await Promise.all(Array.from({ length: Math.min(workers, tasks.length) }, one));
	return done;
}

/** A worker: builds the settings once, then runs each task it is sent. */
function serve(): void {
	let pool: Setting[] | null = null;
	process.on('message', (m: { seed?: number; task?: CaseRef[]; stop?: boolean }) => {
		if (m.stop) process.exit(0);
		try {
			pool ??= settings();
			process.send!({ done: runTask(pool, m.seed!, m.task!) });
		} catch (e) {
			process.send!({ error: e instanceof Error ? (e.stack ?? e.message) : String(e) });
		}
	});
}

export async function run(): Promise<void> {
	const seed = Number(process.env.BENCH_ROBUST_SEED ?? 7243);
	const want = Number(process.env.BENCH_ROBUST_CASES ?? 500);
	// BENCH_ROBUST_TIMED=0 leaves the timings out (for profiling the cases); otherwise at least 20 runs.
	const timedRuns = Number(process.env.BENCH_ROBUST_TIMED ?? 20);
	const workers = Number(process.env.BENCH_ROBUST_WORKERS ?? availableParallelism());
	const t0 = now();
	const pool = settings();
	const demo = pool.map((s, i) => (s.group === 'demo' ? i : -1)).filter((i) => i >= 0);
	const generated = pool.map((s, i) => (s.group === 'generated' ? i : -1)).filter((i) => i >= 0);
	console.log(`seed ${seed}; ${want} cases; ${workers} worker${workers === 1 ? '' : 's'}; settings: ${pool.map((s) => `${s.name} (${s.sites.length} fault sites)`).join('; ')}`);

	// Draw the cases here (cheap: a few solves each), keeping those noticed in both worlds.
	const refs: CaseRef[] = [];
	const keys: string[][] = [];
	const unnoticed = { robust: 0, nominal: 0, both: 0 };
	let draws = 0;
	for (let draw = 0; refs.length < want; draw++) {
		draws++;
		if (draws > want * 50 + 100) throw new Error('robust bench: too few faults are noticed; check the marks');
		// Half the cases on the demo (its two scenarios in turn), half on the generated harnesses.
		const k = refs.length;
		const si = k % 2 === 0 ? demo[(k >> 1) % demo.length] : generated[(k >> 1) % generated.length];
		const { nominal, robust } = drawCase(pool[si], seed, draw);
		if (!robust.marks.length || !nominal.marks.length) {
			if (!robust.marks.length && !nominal.marks.length) unnoticed.both++;
			else if (!robust.marks.length) unnoticed.robust++;
			else unnoticed.nominal++;
			continue;
		}
		refs.push({ k, draw, setting: si });
		keys.push([nominal.marks, robust.marks].map((m) => `${si} ${JSON.stringify(m)}`));
	}
	const tasks = tasksOf(refs, keys);
	const drawnS = (now() - t0) / 1000;
	let shown = 0;
	const results = await runTasks(pool, seed, tasks, workers, (n) => {
		if (n >= shown + 50 || n === refs.length) {
			shown = n;
			process.stderr.write(`  robust: ${n} of ${refs.length} cases, ${((now() - t0) / 1000).toFixed(0)} s\n`);
		}
	});
	const rows = results.flatMap((d) => d.rows).sort((a, b) => a.k - b.k);
	const startMs = results.flatMap((d) => d.startMs);
	const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);
	const caseS = sum(results.map((d) => d.ms)) / 1000;
	const startS = sum(startMs) / 1000;
	const replanS = sum(results.map((d) => d.replanMs)) / 1000;

	const pct = (n: number, of: number) => (of ? `${((100 * n) / of).toFixed(1)} %` : '—');
	const mean = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : NaN);
	type O = Row['robust'];
	const summary = (outs: O[]) => ({
		cases: outs.length,
		correct: outs.filter((o) => o.result === 'correct').length,
		exact: outs.filter((o) => o.exact).length,
		wrong: outs.filter((o) => o.result === 'wrong').length,
		stuck: outs.filter((o) => o.result === 'stuck').length,
		never: outs.filter((o) => o.neverSuspect).length,
		probes: mean(outs.map((o) => o.probes)),
		group: mean(outs.filter((o) => o.result !== 'stuck').map((o) => o.group))
	});
	const nom = summary(rows.map((r) => r.nominal));
	const rob = summary(rows.map((r) => r.robust));
	const widths = [9, 6, 9, 9, 9, 9, 16, 12, 17];
	const line = (cells: string[]) => cells.map((c, j) => (j === 0 ? c.padEnd(widths[j]) : c.padStart(widths[j]))).join(' ');
	const out = (name: string, s: ReturnType<typeof summary>) =>
		line([name, String(s.cases), pct(s.correct, s.cases), pct(s.exact, s.cases), pct(s.wrong, s.cases), pct(s.stuck, s.cases), pct(s.never, s.cases), s.probes.toFixed(2), s.group.toFixed(2)]);
	const isDemo = (r: Row) => pool[r.setting].group === 'demo';
	console.log(
		`\n${rows.length} cases from ${draws} draws (${drawnS.toFixed(0)} s); faults not noticed, so drawn again: ${unnoticed.robust} in the robust world only, ${unnoticed.nominal} in the nominal world only, ${unnoticed.both} in both; ${rows.filter(isDemo).length} cases on the demo, ${rows.filter((r) => !isDemo(r)).length} on generated harnesses`
	);
	console.log(line(['run', 'cases', 'correct', 'exact', 'wrong', 'stuck', 'never a suspect', 'mean probes', 'mean final group']));
	console.log(out('nominal', nom));
	console.log(out('robust', rob));
	console.log(line(['target', '', '≥ 99 %', '', '≤ 1 %', '0 %', '', `≤ ${(1.3 * nom.probes).toFixed(2)}`, '']));
	console.log(`robust/nominal probes: ${(rob.probes / nom.probes).toFixed(2)}× (target ≤ 1.3×). Final group: distinct sites left at the end, stuck cases left out.`);
	for (const [name, pick] of [
		['demo', isDemo],
		['generated', (r: Row) => !isDemo(r)]
	] as const) {
		const sub = rows.filter(pick);
		const n = summary(sub.map((r) => r.nominal));
		const b = summary(sub.map((r) => r.robust));
		console.log(
			`  ${name} (${sub.length} cases): nominal correct ${pct(n.correct, n.cases)}, wrong ${pct(n.wrong, n.cases)}, stuck ${pct(n.stuck, n.cases)}, ${n.probes.toFixed(2)} probes; robust correct ${pct(b.correct, b.cases)}, wrong ${pct(b.wrong, b.cases)}, stuck ${pct(b.stuck, b.cases)}, ${b.probes.toFixed(2)} probes`
		);
	}
	for (const [name, pick] of [
		['nominal', (r: Row) => r.nominal],
		['robust', (r: Row) => r.robust]
	] as const) {
		const why = new Map<string, number>();
		for (const r of rows) {
			const o = pick(r);
			const key = o.result === 'stuck' ? `stuck (${o.why})` : o.why ? `${o.result}, ended as ${o.why}` : '';
			if (key) why.set(key, (why.get(key) ?? 0) + 1);
		}
		const kinds = new Map<string, number>();
		for (const r of rows) if (pick(r).result !== 'correct') kinds.set(r.kind, (kinds.get(r.kind) ?? 0) + 1);
		const top = [...kinds].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).slice(0, 8);
		const charged = rows.filter((r) => pick(r).charge).length;
		console.log(`  ${name}: ${[...why].map(([k, v]) => `${k}: ${v}`).join('; ') || 'every hunt ran to its end'}; the engine said to charge the battery first in ${charged} cases`);
		if (top.length) console.log(`    not correct, by fault kind: ${top.map(([k, v]) => `${k} ${v}`).join(', ')}`);
	}
	// Each robust case that went wrong, to look at one by one (its draw number and setting reproduce it).
	for (const r of rows.filter((x) => x.robust.result !== 'correct'))
		console.log(`    robust ${r.robust.result}${r.robust.why ? ` (${r.robust.why})` : ''}: draw ${r.draw}, ${pool[r.setting].name}, ${r.fault}`);

	// Yardsticks on the robust run.
	const walked = rows.filter((r) => r.walk);
	const planProbes = mean(walked.map((r) => r.robust.probes));
	const walkProbes = mean(walked.map((r) => r.walk!.probes));
	const bounded = rows.filter((r) => r.bound !== undefined);
	const boundProbes = mean(bounded.map((r) => r.bound!));
	const planOnBounded = mean(bounded.map((r) => r.robust.probes));
	console.log(`\nyardsticks (robust run):`);
	console.log(
		`  a skilled restorer's walk (volts along the marked parts' feeds from the battery, then drops over the stretch where they first go wrong; the same true readings): ${walkProbes.toFixed(2)} probes on average over ${walked.length} cases, ending on a drop above ${WALK_DROP} V in ${pct(walked.filter((r) => r.walk!.endedOnDrop).length, walked.length)}; the plan ${planProbes.toFixed(2)} probes → ${(planProbes / walkProbes).toFixed(2)}× the walk (target ≤ 0.7)`
	);
	console.log(
		`  information bound (plan.ts huffmanLowerBound on the starting table): ${boundProbes.toFixed(2)} probes on average over ${bounded.length} cases; the plan ${planOnBounded.toFixed(2)} → ${(planOnBounded / boundProbes).toFixed(2)}× the bound`
	);
	console.log(
		`  ${startMs.length} distinct starting diagnoses (cases with equal marks on one harness start alike): median ${quantile(startMs, 0.5).toFixed(0)} ms, p90 ${quantile(startMs, 0.9).toFixed(0)} ms, longest ${Math.max(...startMs).toFixed(0)} ms (${workers} at once)`
	);
	console.log(
		`  the cases took ${((now() - t0) / 1000).toFixed(0)} s on the clock; of ${caseS.toFixed(0)} s of work, ${startS.toFixed(0)} s starting diagnoses and ${replanS.toFixed(0)} s planning again after readings (the engine), ${(caseS - startS - replanS).toFixed(0)} s true worlds, readings and yardsticks (this bench)`
	);

	if (timedRuns !== 0) timings(Math.max(20, timedRuns));
}

if (process.env.BENCH_ROBUST_WORKER) serve();
else if (import.meta.url === `file://${process.argv[1]}`) await run();
