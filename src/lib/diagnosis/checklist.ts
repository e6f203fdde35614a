/**
 * The printable probe checklist of a diagnosis: the planner's numbered steps (plan.ts
 * `checklist()`) joined with each probe's place, setting and conditions (probes.ts), the wire
 * colours in words and as a stripe, the cautions that apply (cautions.ts) and the readings
 * already taken. Every expected reading is a band (the battery, part tolerances, wire lengths and
 * the fault's size move it); the battery's own probe comes first with its caution and when to
 * charge it; a range that ends on suspects no probe tells apart gives their one job (groups.ts).
 * One model feeds both the print page and the PDF, so they show the same steps.
 *
 * Pure: no database, no Svelte, no network.
 */
import { dayText, type Dates } from '$lib/dates';
import { parseCode, resolvePalette, type Palette } from '$lib/circuit/colours';
import type { DiagnoseResult } from '$lib/circuit/diagnose';
import type { MeterProfile } from '$lib/circuit/meter';
import { formatRange } from '$lib/circuit/outcomes';
import type { ChecklistStep } from '$lib/circuit/plan';
import type { HarnessDocument } from '$lib/circuit/schema';
import type { Mark } from '$lib/circuit/symptoms';
import { leadWords } from './leads';
import { CAUTION_TEXTS, mayHaveAirbags, requiredCautions, type CautionId } from './cautions';
import { readingsForPlan, type DiagnosisJson, type ReadingJson } from './session';
import { endingText, formatBand, jobFor } from './view';

type Probe = DiagnoseResult['probes'][number];

export interface ChecklistInput {
	vehicle: { name: string; make: string; model: string; year: string };
	diagram: { title: string };
	diagnosis: Pick<DiagnosisJson, 'id' | 'title' | 'diagramRevision' | 'marks' | 'status' | 'createdAt' | 'foundLabel' | 'conclusion'>;
	document: HarnessDocument;
	result: Pick<DiagnoseResult, 'plan' | 'probes' | 'suspects' | 'readings' | 'explainedBy' | 'table' | 'bands' | 'groups' | 'battery'>;
	meter: MeterProfile;
	readings: readonly ReadingJson[];
	/** When the checklist is printed (the header's date). */
	printedAt: Date;
	/** The reader's locale and time zone for the header's dates; English and UTC when not given. */
	dates?: Dates;
}

export interface Colour {
	code: string;
	name: string;
	/** The palette's colour as #rrggbb. */
	hex: string;
}

/** One wire's colour: the code as written, in words, and the two colours of its stripe. */
export interface WireColour {
	code: string;
	/** "green with black tracer"; for a code the palette does not know, says so. */
	words: string;
	base: Colour | null;
	tracer: Colour | null;
	/** How many wires with this code meet at the terminal. */
	count: number;
}

export interface CautionBlockEntry {
	id: CautionId;
	/** Printed number, from 1; steps refer to it. */
	number: number;
	title: string;
	text: string;
}

export interface ExpectedLine {
	suspect: string;
	label: string;
	/** The band the suspect predicts: "−12.74 to −11.82 V", "75–111 %", "2.10 Ω to OL", "no reading". */
	reading: string;
	/** "34 %": the suspect's chance at this step. */
	chance: string;
}

export interface OutcomeLine {
	/** The range as the plan prints it, with its unit. */
	reading: string;
	/** The plan's line: "9.00–11.00 V: go to step 4"; a range that ends on a group gives the group's job. */
	text: string;
	/** The step it sends you to, or null when it ends (found, cannot be told apart, plan again). */
	next: number | null;
	/** For a range that ends on suspects no probe tells apart: their one job ("…: clean and re-make both."). */
	action: string | null;
}

/** The battery as the checklist prints it: read first, and charged before going on when low. */
export interface BatteryLine {
	probe: string;
	/** The step that reads it, when it is still to be read. */
	step: number | null;
	/** "11.9–12.8 V at rest". */
	assumed: string;
	/** The reading taken at its posts, or null. */
	reading: string | null;
	/** Read below the charge threshold: charge it (and rest it) before going on. */
	charge: boolean;
	/** What to do, in a sentence or two. */
	advice: string;
}

export interface TakenReading {
	probe: string;
	label: string;
	/** "-12.41 V", "over range (OL)", "could not reach this point". */
	value: string;
	takenAt: string;
	takenBy: string | null;
	struck: boolean;
	queued: boolean;
}

export interface PrintStep {
	number: number;
	probe: string;
	kind: Probe['kind'];
	label: string;
	place: {
		partId: string;
		key: string;
		partLabel: string;
		terminal: string;
		/** "6 Fuse, ignition accessories, terminal out". */
		text: string;
	};
	wires: WireColour[];
	/** Where the black lead (or the lamp's clip) goes. */
	blackLead: string;
	setting: string;
	conditions: string[];
	/** Numbers in the cautions block. */
	cautions: number[];
	/** At the battery's own probe: why it comes first and when to charge it. */
	advice: string | null;
	unit: string;
	expected: ExpectedLine[];
	/** The reading already taken at this probe (latest, not struck), filled into the box. */
	taken: string | null;
	outcomes: OutcomeLine[];
	otherwise: string;
}

export interface ChecklistModel {
	title: string;
	header: {
		vehicle: string;
		vehicleName: string;
		make: string;
		model: string;
		year: string;
		diagramTitle: string;
		revision: number;
		/** The days as the reader writes them (dates.ts). */
		started: string;
		printed: string;
		/** When printed, ISO 8601 (the PDF's creation date). */
		printedAt: string;
		status: 'open' | 'concluded';
		conclusion: string;
		marks: { part: string; key: string; label: string; mark: Mark; words: string }[];
		/** "7 suspects left; the plan takes about 3.2 readings". */
		standing: string;
	};
	cautions: CautionBlockEntry[];
	meter: {
		label: string;
		/** "10 MΩ". */
		inputResistance: string;
		lampWatts: string;
		/** Each setting the steps use, with the steps that use it. */
		settings: { setting: string; steps: number[] }[];
	};
	steps: PrintStep[];
	readings: TakenReading[];
	/** The main battery: read first, with when to charge it; null when the plan has none (nothing powered). */
	battery: BatteryLine | null;
	/** Suspects no probe of the plan can tell apart, by label, with the one job for them; `final` is the group the plan ended on. */
	groups: { suspects: string[]; action: string; final: boolean }[];
	notes: string[];
	/** Parts and wires the steps touch, and the marked parts: the region drawn beside the steps. */
	region: { parts: string[]; wires: string[] };
	fileName: string;
}

export const MARK_WORDS: Record<Mark, string> = { 'reads-low': 'reads low', 'reads-high': 'reads high', dead: 'dead', erratic: 'erratic', normal: 'normal' };

/** YYYY-MM-DD (ISO 8601), for file names: they sort by date. */
export function isoDate(d: Date | string): string {
	return (typeof d === 'string' ? new Date(d) : d).toISOString().slice(0, 10);
}

/** "10 MΩ", "400 kΩ", "4.7 Ω" (SI prefixes, at most three significant digits). */
export function formatOhms(ohms: number): string {
	const [div, prefix] = ohms >= 1e6 ? [1e6, 'M'] : ohms >= 1e3 ? [1e3, 'k'] : [1, ''];
	return `${Number((ohms / div).toPrecision(3))} ${prefix}\u03a9`;
}

/** A predicted or taken reading in the plan's style (two decimals and the unit); ohms at the range top read OL. */
export function formatReading(value: number | null, unit: string, overLimit: number): string {
	if (value === null || !Number.isFinite(value)) return unit === '\u03a9' ? 'OL (over range)' : 'no reading';
	if (unit === '\u03a9' && value >= overLimit) return 'OL (over range)';
	if (unit === '%') return `${Math.round(value)} %`;
	// A reading that rounds to zero prints as 0.00, not -0.00.
	return formatRange({ low: Math.abs(value) < 0.005 ? 0 : value, high: Math.abs(value) < 0.005 ? 0 : value }, unit, 2);
}

function colourOf(palette: Palette, code: string): Colour | null {
	const c = palette.colours.find((x) => x.code.toUpperCase() === code.toUpperCase());
	return c ? { code: c.code, name: c.name, hex: c.display } : null;
}

/** The colour of each distinct wire code, in the order first met. */
export function wireColours(codes: readonly string[], palette: Palette): WireColour[] {
	const out: WireColour[] = [];
	for (const code of codes) {
		const seen = out.find((w) => w.code === code);
		if (seen) {
			seen.count++;
			continue;
		}
		const parsed = parseCode(code, palette);
		if (!parsed.ok) {
			out.push({ code, words: `code ${code} is not in the palette`, base: null, tracer: null, count: 1 });
			continue;
		}
		const base = colourOf(palette, parsed.code.base);
		const tracer = parsed.code.tracer ? colourOf(palette, parsed.code.tracer) : null;
		const words = tracer ? `${base?.name ?? parsed.code.base} with ${tracer.name} tracer` : (base?.name ?? parsed.code.base);
		out.push({ code, words, base, tracer, count: 1 });
	}
	return out;
}

function readingText(r: Pick<ReadingJson, 'outcome' | 'value' | 'unit'>, overLimit: number): string {
	if (r.outcome === 'over-range') return 'over range (OL)';
	if (r.outcome === 'unreachable') return 'could not reach this point';
	return formatReading(r.value, r.unit, overLimit);
}

/** An ASCII file name: letters, digits and hyphens (RFC 6266 quoted filename, no escaping needed). */
export function slug(text: string): string {
	return (
		text
			.normalize('NFKD')
			.replace(/[\u0300-\u036f]/g, '')
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-+|-+$/g, '')
			.slice(0, 40) || 'vehicle'
	);
}

/**
 * The checklist model of a diagnosis as it stands (the plan after the readings so far).
 * @example checklistModel({ vehicle, diagram, diagnosis, document, result, meter, readings, printedAt: new Date() }).steps[0].number // 1
 */
export function checklistModel(input: ChecklistInput): ChecklistModel {
	const { document: doc, result, meter, diagnosis } = input;
	const palette = resolvePalette(doc.palette);
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const wiresById = new Map(doc.wires.map((w) => [w.id, w]));
	const probes = new Map(result.probes.map((p) => [p.id, p]));
	const planSteps: ChecklistStep[] = result.plan.steps;
	const overLimit = meter.ohms.overLimit;

	const stepProbes = planSteps.map((s) => {
		const p = probes.get(s.probe);
		if (!p) throw new Error(`checklistModel: step ${s.step} names probe "${s.probe}", which is not among the plan's probes`);
		return p;
	});

	// The cautions block: the required ones, then planner cautions not covered by them, the general note last.
	const needs = {
		powered: stepProbes.some((p) => p.setup !== 'power-off'),
		coil: doc.parts.some((p) => p.kind === 'ignition-coil'),
		ohms: stepProbes.some((p) => p.kind === 'ohms'),
		fuelTank: stepProbes.some((p) => [p.place.part, typeof p.place.to === 'object' ? p.place.to.part : null].some((id) => id && parts.get(id)?.location === 'fuel-tank')),
		airbags: mayHaveAirbags(input.vehicle.year, doc.parts.map((p) => p.label))
	};
	const ids: CautionId[] = requiredCautions(needs);
	const stepCautionIds = stepProbes.map((p) => {
		const own: CautionId[] = [];
		for (const id of p.cautions) {
			if (id === 'general') continue;
			if (!own.includes(id)) own.push(id);
			if (!ids.includes(id)) ids.push(id);
		}
		// A step taken at the tank or with ohms refers to those cautions even when the planner did not say so;
		// the battery's own probe to the battery's.
		if (p.kind === 'ohms' && !own.includes('ohms')) own.push('ohms');
		if (p.id === result.battery?.probe && !own.includes('battery')) own.push('battery');
		if (p.setup !== 'power-off' && needs.coil && !own.includes('coil')) own.push('coil');
		return own;
	});
	ids.push('general');
	const cautions: CautionBlockEntry[] = ids.map((id, i) => ({ ...CAUTION_TEXTS[id], number: i + 1 }));
	const cautionNumber = new Map(ids.map((id, i) => [id, i + 1]));

	const used = readingsForPlan(input.readings);

	// Each suspect's band at each probe (the table's probes and suspects are the result's, in order).
	const probeAt = new Map(result.probes.map((p, i) => [p.id, i]));
	const suspectAt = new Map(result.suspects.map((x, i) => [x.id, i]));
	const expectedText = (probe: string, suspect: string, unit: string, nominal: number | null) => {
		const b = result.bands?.[probeAt.get(probe) ?? -1]?.[suspectAt.get(suspect) ?? -1];
		return b ? formatBand(b, unit, overLimit) : formatReading(nominal, unit, overLimit);
	};

	// The battery: read first (its probe leads a powered plan), charged before going on when low.
	const bat = result.battery;
	const v1 = (x: number) => `${x.toFixed(1)} V`;
	const minus = doc.vehicle.earth === 'positive' ? ' (the meter shows a minus sign: positive earth)' : '';
	const batteryStep = bat ? (planSteps.find((s) => s.probe === bat.probe)?.step ?? null) : null;
	const batteryRead = bat ? used[bat.probe] : undefined;
	const batteryAdvice = (): string => {
		if (!bat) return '';
		const range = `${v1(bat.assumed.low)}\u2013${v1(bat.assumed.high)}`;
		if (bat.measured === undefined) {
			return bat.chargeBelow !== null
				? `Read the battery first, on its posts (not the clamps): every expected reading depends on it. At rest it should read ${range}${minus}. Below ${v1(bat.chargeBelow)}, charge it and let it rest some hours before going on. Enter the reading in the diagnosis and print again for ranges worked out from it.`
				: `Read the battery first, on its posts (not the clamps), with the engine running: about ${range}${minus}. Enter the reading in the diagnosis and print again for ranges worked out from it.`;
		}
		const read = formatReading(bat.measured, 'V', overLimit);
		const emf = bat.emf !== undefined ? `, about ${bat.emf.toFixed(2)} V with nothing drawing current` : '';
		if (bat.charge)
			return `Charge the battery first: it read ${read} at its posts${emf}, below ${v1(bat.chargeBelow ?? 0)}. A flat battery pulls every reading down. Charge it, let it rest some hours, then read it again before going on.`;
		return bat.chargeBelow !== null ? `The battery read ${read} at its posts${emf}: charged enough to go on.` : `The battery read ${read} at its posts with the engine running.`;
	};
	const battery: BatteryLine | null = bat
		? {
				probe: bat.probe,
				step: batteryStep,
				assumed: `${v1(bat.assumed.low)}\u2013${v1(bat.assumed.high)}${bat.chargeBelow !== null ? ' at rest' : ' running'}`,
				reading: typeof batteryRead === 'number' ? formatReading(batteryRead, 'V', overLimit) : null,
				charge: bat.charge,
				advice: batteryAdvice()
			}
		: null;

	const steps: PrintStep[] = planSteps.map((s, i) => {
		const p = stepProbes[i];
		const part = parts.get(p.place.part);
		const lead = leadWords(p, doc);
		const u = used[p.id];
		const taken = u === undefined ? null : readingText(u === 'OL' ? { outcome: 'over-range', value: null, unit: p.unit } : u === 'unreachable' ? { outcome: 'unreachable', value: null, unit: p.unit } : { outcome: 'value', value: u, unit: p.unit }, overLimit);
		return {
			number: s.step,
			probe: p.id,
			kind: p.kind,
			label: s.label,
			place: {
				partId: p.place.part,
				key: p.place.key,
				partLabel: part?.label ?? '',
				terminal: p.place.terminal,
				text: lead.red
			},
			wires: wireColours(p.place.wires, palette),
			blackLead: lead.black,
			setting: p.setting,
			conditions: p.conditions.filter((c) => c !== lead.blackFromConditions),
			cautions: stepCautionIds[i].map((id) => cautionNumber.get(id)!).sort((a, b) => a - b),
			advice: battery && p.id === battery.probe ? battery.advice : null,
			unit: p.unit,
			expected: s.expected.map((e) => ({ suspect: e.suspect, label: e.label, reading: expectedText(p.id, e.suspect, p.unit, e.reading), chance: `${Math.round(e.chance * 100)} %` })),
			taken,
			outcomes: s.outcomes.map((o) => {
				const action = o.then.kind === 'ambiguous' ? jobFor(result, o.then.suspects) : null;
				return { reading: o.reading, text: action ? `${o.reading}: ${endingText(result, o.then)}` : o.text, next: o.then.kind === 'step' ? o.then.step : null, action };
			}),
			otherwise: s.otherwise
		};
	});

	// Readings taken so far, oldest first, struck ones kept (marked) so the record is whole.
	const labels = new Map(result.probes.map((p) => [p.id, p.label]));
	const readings: TakenReading[] = input.readings.map((r) => ({
		probe: r.probeId,
		label: labels.get(r.probeId) ?? r.probeId,
		value: readingText(r, overLimit),
		takenAt: r.takenAt,
		takenBy: r.takenBy ?? null,
		struck: !!r.struck,
		queued: !!r.queued
	}));

	// The region: the parts and wires the steps touch, the other ends of those wires, and the marked parts.
	const regionParts = new Set<string>(diagnosis.marks.map((m) => m.part).filter((id) => parts.has(id)));
	const regionWires = new Set<string>();
	for (const p of stepProbes) {
		const ends = [{ part: p.place.part, terminal: p.place.terminal }];
		if (typeof p.place.to === 'object') ends.push({ part: p.place.to.part, terminal: p.place.to.terminal });
		for (const e of ends) regionParts.add(e.part);
		if (typeof p.place.to === 'object' && p.place.to.wire) regionWires.add(p.place.to.wire);
		if (p.id.startsWith('drop:')) regionWires.add(p.id.slice('drop:'.length));
		for (const w of doc.wires) if (ends.some((e) => (w.from.part === e.part && w.from.terminal === e.terminal) || (w.to.part === e.part && w.to.terminal === e.terminal))) regionWires.add(w.id);
	}
	for (const id of regionWires) {
		const w = wiresById.get(id);
		if (!w) continue;
		regionParts.add(w.from.part);
		regionParts.add(w.to.part);
	}

	const v = input.vehicle;
	const makeModel = [v.make, v.model].filter(Boolean).join(' ');
	const vehicleLine = [v.name, makeModel && makeModel !== v.name ? makeModel : '', v.year].filter(Boolean).join(', ');
	const remaining = result.readings ? result.readings.remaining.length : result.suspects.length;
	const finalGroup = result.groups.find((g) => g.final);
	const labelOf = new Map(result.suspects.map((s) => [s.id, s.label]));
	const last = result.readings ? result.readings.remaining[0]?.suspect : result.suspects[0]?.id;
	// The suspect left is named, so the paper says what to look at without the screen.
	const standing =
		remaining === 0
			? 'No suspect explains the marks and readings: check the marks, the scenario and the diagram.'
			: remaining === 1
				? `One suspect left: ${labelOf.get(last ?? '') ?? last}.`
				: planSteps.length
					? `${remaining} suspects left; the plan takes about ${result.plan.expectedProbes.toFixed(1)} readings to tell them apart.`
					: `${remaining} suspects left that no meter reading here can tell apart. ${finalGroup?.action ?? jobFor(result, result.readings?.remaining.map((r) => r.suspect) ?? result.suspects.map((x) => x.id))}`;

	return {
		title: `Probe checklist: ${diagnosis.title}`,
		header: {
			vehicle: vehicleLine,
			vehicleName: v.name,
			make: v.make,
			model: v.model,
			year: v.year,
			diagramTitle: input.diagram.title,
			revision: diagnosis.diagramRevision,
			started: dayText(diagnosis.createdAt, input.dates),
			printed: dayText(input.printedAt, input.dates),
			printedAt: input.printedAt.toISOString(),
			status: diagnosis.status,
			conclusion: diagnosis.status === 'concluded' ? [diagnosis.foundLabel, diagnosis.conclusion].filter(Boolean).join(': ') : '',
			marks: diagnosis.marks.map((m) => {
				const p = parts.get(m.part);
				return { part: m.part, key: p?.key ?? m.part, label: p?.label ?? '', mark: m.mark, words: MARK_WORDS[m.mark] };
			}),
			standing
		},
		cautions,
		meter: {
			label: meter.label || meter.id,
			inputResistance: formatOhms(meter.inputOhms),
			lampWatts: `${meter.lamp.watts} W`,
			settings: [...new Set(steps.map((s) => s.setting))].map((setting) => ({ setting, steps: steps.filter((s) => s.setting === setting).map((s) => s.number) }))
		},
		steps,
		readings,
		battery,
		groups: result.groups.map((g) => ({ suspects: g.suspects.map((id) => labelOf.get(id) ?? id), action: g.action, final: !!g.final })),
		notes:
			result.explainedBy === 'none'
				? ['No single or double fault of the region explains the marks.']
				: result.explainedBy === 'nearest'
					? ['No fault of the drawing explains every mark: the suspects are the faults that come nearest, and the readings decide.']
					: [],
		region: { parts: [...regionParts], wires: [...regionWires] },
		fileName: `checklist-${slug(v.name)}-${isoDate(diagnosis.createdAt)}-${diagnosis.id.slice(0, 8)}.pdf`
	};
}
