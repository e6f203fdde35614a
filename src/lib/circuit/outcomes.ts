// Turning predicted readings into outcome bins: the part of probe planning that says which
// suspects one probe can tell apart, and where a real reading lands.
//
// The rule. Each predicted reading r carries a tolerance t(r) = abs + rel·|r| + band: the
// meter's accuracy stated as ±(% of reading + counts) plus, for pulsing parts such as a bimetal
// voltage stabilizer, the swing of the displayed value (TRADE.md, "Meters" and "Thermal
// gauges"). A suspect predicting r is consistent with a measured reading x when
// |x − r| ≤ t(r), i.e. x lies in r's acceptance interval [r − t(r), r + t(r)]. Two suspects are
// told apart by the probe when their intervals do not overlap: |a − b| > t(a) + t(b), so no
// single reading is consistent with both.
//
// Bands. In a real vehicle a suspect's reading is not one number: the battery's state, part
// tolerances, guessed wire lengths and the fault's own size move it (diagnose.ts works out the
// span). With a band [lo, hi] the acceptance interval is [lo − t(lo), hi + t(hi)]; everything
// below works on acceptance intervals, so a point reading is the band [r, r].
//
// Bins. A probe's bins are the connected components of the "intervals overlap" graph over the
// suspects that have a defined reading: sort the intervals by their low end and merge while the
// next one starts at or below the running high end (the classic interval-union sweep). Each bin
// is then one contiguous range of readings, bins never overlap, and a reading lands in at most
// one bin.
//
// Limits (tolerance is not transitive). If a ~ b and b ~ c overlap but a and c do not, all three
// share one bin although a and c alone could be told apart: a bin can be wider than one
// tolerance, and the bins of a subset of suspects can be finer than the bins of the whole set
// (removing b splits the chain). The planner therefore bins again at every step over the
// suspects still in play, and treats table-wide bins as the coarsest view.
//
// The tolerance is taken at the predicted reading, not at the displayed one; the two differ by
// rel·|x − r|, a fraction of a count for meter-grade rel, which is below what a meter resolves.
//
// Undefined readings. A null reading means the probe has no defined value for that suspect (it
// cannot be taken, or nothing predicts what the meter would show). Such a suspect is kept
// outside the bins ("unread") and is never told apart from anyone by that probe: a reading can
// never rule it out.

/** Accuracy of one probe: ±(abs + rel·|reading|), widened by `band` for a fluctuating reading. */
export type Tolerance = { abs: number; rel: number; band?: number };

export type Suspect = { id: string; prior: number; label?: string };

export type ProbeCandidate = {
	id: string;
	/** Effort of taking the probe (reach, disconnecting things); any positive unit. */
	cost: number;
	tolerance: Tolerance;
	label?: string;
	/** Unit printed after reading ranges ("V", "Ω"); units are the caller's. */
	unit?: string;
};

/**
 * What every suspect predicts for every probe. `readings[p][s]` is the reading probe `p` should
 * show if suspect `s` is the fault, or null when it has no defined value.
 */
export type PredictionTable = {
	suspects: Suspect[];
	probes: ProbeCandidate[];
	readings: (number | null)[][];
	/**
	 * The span each reading can take in a real vehicle (battery state, part tolerances, the
	 * fault's size; see diagnose.ts), same shape as `readings`; a missing table or entry is the
	 * point reading itself. The meter's tolerance is added at the span's ends.
	 */
	bands?: (ReadingRange | null)[][];
};

export type ReadingRange = { low: number; high: number };

export type OutcomeBin = {
	/** Suspect indices (ascending) whose predicted reading falls in this bin. */
	suspects: number[];
	/** Span of the predicted readings themselves. */
	predicted: ReadingRange;
	/** Readings that land in this bin: the union of the suspects' acceptance intervals. */
	accepts: ReadingRange;
};

export type ProbeOutcomes = {
	/** Bins in ascending order of reading. */
	bins: OutcomeBin[];
	/** Suspects with no defined reading on this probe. */
	unread: number[];
};

/** Thrown for a malformed prediction table; `problems` names each fault by its path. */
export class TableError extends Error {
	constructor(
		where: string,
		readonly problems: string[]
	) {
		super(`${where}: invalid prediction table:\n  ${problems.join('\n  ')}`);
		this.name = 'TableError';
	}
}

/**
 * Checks a prediction table and throws a TableError listing every problem with its path
 * (`probes[3].cost`, `readings[2][7]`). `where` names the calling function in the message.
 */
export function checkTable(table: PredictionTable, where = 'checkTable'): void {
	const problems: string[] = [];
	if (!table || !Array.isArray(table.suspects) || !Array.isArray(table.probes) || !Array.isArray(table.readings)) {
		throw new TableError(where, ['table must have suspects, probes and readings arrays']);
	}
	const ids = new Set<string>();
	table.suspects.forEach((s, i) => {
		if (typeof s?.id !== 'string' || s.id === '') problems.push(`suspects[${i}].id: must be a non-empty string`);
		else if (ids.has(s.id)) problems.push(`suspects[${i}].id: duplicate id "${s.id}"`);
		else ids.add(s.id);
		if (!(Number.isFinite(s?.prior) && s.prior > 0)) problems.push(`suspects[${i}].prior: must be a finite number > 0, got ${s?.prior}`);
	});
	const probeIds = new Set<string>();
	table.probes.forEach((p, i) => {
		if (typeof p?.id !== 'string' || p.id === '') problems.push(`probes[${i}].id: must be a non-empty string`);
		else if (probeIds.has(p.id)) problems.push(`probes[${i}].id: duplicate id "${p.id}"`);
		else probeIds.add(p.id);
		if (!(Number.isFinite(p?.cost) && p.cost > 0)) problems.push(`probes[${i}].cost: must be a finite number > 0, got ${p?.cost}`);
		const t = p?.tolerance;
		if (!t) problems.push(`probes[${i}].tolerance: missing`);
		else {
			if (!(Number.isFinite(t.abs) && t.abs >= 0)) problems.push(`probes[${i}].tolerance.abs: must be a finite number ≥ 0, got ${t.abs}`);
			if (!(Number.isFinite(t.rel) && t.rel >= 0)) problems.push(`probes[${i}].tolerance.rel: must be a finite number ≥ 0, got ${t.rel}`);
			if (t.band !== undefined && !(Number.isFinite(t.band) && t.band >= 0))
				problems.push(`probes[${i}].tolerance.band: must be a finite number ≥ 0, got ${t.band}`);
		}
	});
	if (table.readings.length !== table.probes.length) {
		problems.push(`readings: has ${table.readings.length} rows, expected one per probe (${table.probes.length})`);
	}
	table.readings.forEach((row, p) => {
		if (!Array.isArray(row)) {
			problems.push(`readings[${p}]: must be an array`);
			return;
		}
		if (row.length !== table.suspects.length) {
			problems.push(`readings[${p}]: has ${row.length} entries, expected one per suspect (${table.suspects.length})`);
		}
		row.forEach((r, s) => {
			// Over-range (an open circuit on ohms) should be a large finite value or null, so that
			// tolerance arithmetic stays finite.
			if (r !== null && !Number.isFinite(r)) problems.push(`readings[${p}][${s}]: must be a finite number or null, got ${r}`);
		});
	});
	if (problems.length > 0) throw new TableError(where, problems);
}

/** Half-width of the acceptance interval around a predicted reading. */
export function toleranceAt(tolerance: Tolerance, reading: number): number {
	return tolerance.abs + tolerance.rel * Math.abs(reading) + (tolerance.band ?? 0);
}

/** The readings consistent with a predicted one, or with any reading of its span `band`. */
export function acceptRange(tolerance: Tolerance, predicted: number, band?: ReadingRange | null): ReadingRange {
	const low = band ? Math.min(band.low, predicted) : predicted;
	const high = band ? Math.max(band.high, predicted) : predicted;
	return { low: low - toleranceAt(tolerance, low), high: high + toleranceAt(tolerance, high) };
}

/** The acceptance interval of suspect `s` on probe `p` of a table (its band widened by the meter's tolerance), or null when unread. */
export function acceptOf(table: PredictionTable, p: number, s: number): ReadingRange | null {
	const r = table.readings[p][s];
	return r === null || r === undefined ? null : acceptRange(table.probes[p].tolerance, r, table.bands?.[p]?.[s]);
}

/** How far a measured reading lies beyond an acceptance interval (0 inside it). */
export function beyond(accept: ReadingRange, measured: number): number {
	return measured < accept.low ? accept.low - measured : measured > accept.high ? measured - accept.high : 0;
}

/** The table restricted to some suspects (in the given order). */
export function subTable(table: PredictionTable, suspects: readonly number[]): PredictionTable {
	return {
		suspects: suspects.map((s) => table.suspects[s]),
		probes: table.probes,
		readings: table.readings.map((row) => suspects.map((s) => row[s])),
		...(table.bands ? { bands: table.bands.map((row) => suspects.map((s) => row[s])) } : {})
	};
}

/**
 * The table as the planner should see it when readings are bands. On each probe the bands are
 * grouped, narrowest first: a band that overlaps no group starts one (its acceptance interval is
 * the group's hull); a band that overlaps one group joins it, clipped to the hull so that it
 * cannot stretch the group over its neighbours; a band that overlaps two or more groups is taken
 * as unread there (it follows every outcome, as a suspect with no defined reading does). Without
 * this, one suspect whose reading could be almost anything (a short of unknown size) would merge
 * every bin of every probe. Readings are still weighed against the real bands (plan.ts replan);
 * only the plan's bins change.
 */
export function planningView(table: PredictionTable): PredictionTable {
	if (!table.bands) return table;
	let changed = false;
	const readings = table.readings.map((row) => [...row]);
	const bands = table.bands.map((row) => [...row]);
	table.readings.forEach((row, p) => {
		const tol = table.probes[p].tolerance;
		const items = row
			.map((r, s) => {
				const a = acceptOf(table, p, s);
				return a ? { s, low: a.low, high: a.high } : null;
			})
			.filter((x): x is { s: number; low: number; high: number } => x !== null)
			.sort((x, y) => x.high - x.low - (y.high - y.low) || x.s - y.s);
		const hulls: ReadingRange[] = [];
		for (const it of items) {
			const over = hulls.filter((g) => it.low <= g.high && g.low <= it.high);
			if (over.length === 0) hulls.push({ low: it.low, high: it.high });
			else if (over.length === 1) {
				const g = over[0];
				if (it.low >= g.low && it.high <= g.high) continue;
				// Clip the band so its acceptance stays inside the hull.
				const band = bands[p][it.s] ?? { low: row[it.s]!, high: row[it.s]! };
				const lo = Math.max(band.low, g.low + toleranceAt(tol, g.low));
				const hi = Math.min(band.high, g.high - toleranceAt(tol, g.high));
				const clipped = lo <= hi ? { low: lo, high: hi } : { low: (g.low + g.high) / 2, high: (g.low + g.high) / 2 };
				bands[p][it.s] = clipped;
				readings[p][it.s] = Math.min(clipped.high, Math.max(clipped.low, row[it.s]!));
				changed = true;
			} else {
				readings[p][it.s] = null;
				bands[p][it.s] = null;
				changed = true;
			}
		}
	});
	return changed ? { ...table, readings, bands } : table;
}

/** True when a measured reading is within tolerance of a predicted one. */
export function consistent(tolerance: Tolerance, predicted: number, measured: number): boolean {
	return Math.abs(measured - predicted) <= toleranceAt(tolerance, predicted);
}

/** True when two predicted readings can be told apart: their acceptance intervals do not overlap. */
export function toldApart(tolerance: Tolerance, a: number, b: number): boolean {
	return Math.abs(a - b) > toleranceAt(tolerance, a) + toleranceAt(tolerance, b);
}

/**
 * Bins of one probe over the suspects `among` (all suspects when omitted).
 *
 * @example
 * // ±(0.5 % + 2 counts of 10 mV): 12.6 V accepts 12.517–12.683 V, 0 V accepts −0.02–0.02 V.
 * binReadings([12.6, 0, 12.55], { abs: 0.02, rel: 0.005 });
 * // → bins [{ suspects: [1] … }, { suspects: [0, 2] … }], unread []
 */
export function binReadings(readings: readonly (number | null)[], tolerance: Tolerance, among?: readonly number[], bands?: readonly (ReadingRange | null)[]): ProbeOutcomes {
	const members = among ?? readings.map((_, i) => i);
	const unread: number[] = [];
	const items: { s: number; r: number; low: number; high: number }[] = [];
	for (const s of members) {
		const r = readings[s];
		if (r === null || r === undefined) {
			unread.push(s);
			continue;
		}
		const a = acceptRange(tolerance, r, bands?.[s]);
		items.push({ s, r, low: a.low, high: a.high });
	}
	items.sort((x, y) => x.low - y.low || x.s - y.s);
	const bins: OutcomeBin[] = [];
	let current: OutcomeBin | null = null;
	for (const it of items) {
		if (current && it.low <= current.accepts.high) {
			current.suspects.push(it.s);
			current.accepts.high = Math.max(current.accepts.high, it.high);
			current.predicted.low = Math.min(current.predicted.low, it.r);
			current.predicted.high = Math.max(current.predicted.high, it.r);
		} else {
			current = { suspects: [it.s], predicted: { low: it.r, high: it.r }, accepts: { low: it.low, high: it.high } };
			bins.push(current);
		}
	}
	for (const b of bins) b.suspects.sort((x, y) => x - y);
	unread.sort((x, y) => x - y);
	return { bins, unread };
}

/** Bins of probe `probe` of a table, over `among` suspects (all when omitted). */
export function probeOutcomes(table: PredictionTable, probe: number, among?: readonly number[]): ProbeOutcomes {
	return binReadings(table.readings[probe], table.probes[probe].tolerance, among, table.bands?.[probe]);
}

/**
 * Index of the bin a measured reading lands in, or null when no bin matches: a reading that no
 * suspect predicted (a fault outside the list, a wrong diagram, or a bad probe contact).
 */
export function placeReading(outcomes: ProbeOutcomes, measured: number): number | null {
	if (!Number.isFinite(measured)) throw new RangeError(`placeReading: measured reading must be a finite number, got ${measured}`);
	const i = outcomes.bins.findIndex((b) => measured >= b.accepts.low && measured <= b.accepts.high);
	return i < 0 ? null : i;
}

/**
 * The most outcomes this probe can ever distinguish: the largest set of predicted readings that
 * are pairwise told apart (a maximum set of disjoint acceptance intervals, found by the
 * earliest-right-end greedy of interval scheduling). Bins of any subset of suspects never number
 * more than this.
 */
export function maxOutcomes(readings: readonly (number | null)[], tolerance: Tolerance, bands?: readonly (ReadingRange | null)[]): number {
	const iv = readings
		.map((r, s) => (r === null || r === undefined ? null : acceptRange(tolerance, r, bands?.[s])))
		.filter((a): a is ReadingRange => a !== null)
		.sort((a, b) => a.high - b.high);
	let count = 0;
	let end = -Infinity;
	for (const { low, high } of iv) {
		// Strictly after: touching intervals overlap (|a − b| = t(a) + t(b) is not told apart).
		if (low > end) {
			count++;
			end = high;
		}
	}
	return count;
}

/**
 * Prints a reading range with an en dash, "9.0–11.0 V", and a point range once. Below zero the
 * sign is the minus sign and the ends are joined by "to" ("−12.60 to −12.43 V"), since a dash
 * beside a minus reads as a double sign (ISO 80000-1 writes the minus as U+2212, common practice).
 */
export function formatRange(range: ReadingRange, unit = '', digits = 2): string {
	const number = (v: number) => {
		const t = v.toFixed(digits);
		return /^-0?\.?0*$/.test(t) ? t.slice(1) : t.replace('-', '\u2212');
	};
	const lo = number(range.low);
	const hi = number(range.high);
	const text = lo === hi ? lo : range.low < 0 ? `${lo} to ${hi}` : `${lo}–${hi}`;
	return unit ? `${text} ${unit}` : text;
}
