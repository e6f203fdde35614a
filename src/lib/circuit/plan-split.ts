// What one probe does at one point of a plan, worked out fast enough to be asked for every probe
// at every point: the outcome bins over the suspects still in play (the same bins as
// outcomes.ts binReadings gives, found from a per-probe order prepared once), the expected
// information of the probe there, and the points its outcomes lead to.
//
// A point is the suspects still in play with their absolute chances (of being the fault and of
// the plan reaching this point). A suspect with no defined reading on the probe follows every
// outcome at its weight ÷ K (K the number of bins there), as plan.ts describes.
import { acceptRange, type PredictionTable } from './outcomes';

/** Per-probe precomputation: acceptance intervals and each suspect's rank by low end. */
export type Prepared = {
	n: number;
	low: Float64Array[];
	high: Float64Array[];
	rank: Int32Array[];
	byRank: Int32Array[];
	/** Suspects with a defined reading, in order of their interval's high end. */
	byHigh: Int32Array[];
	/** True when some reading of the table is undefined. */
	hasNull: boolean;
};

export function prepare(table: PredictionTable): Prepared {
	const n = table.suspects.length;
	const low: Float64Array[] = [];
	const high: Float64Array[] = [];
	const rank: Int32Array[] = [];
	const byRank: Int32Array[] = [];
	const byHigh: Int32Array[] = [];
	let hasNull = false;
	table.probes.forEach((probe, p) => {
		const lo = new Float64Array(n);
		const hi = new Float64Array(n);
		const defined: number[] = [];
		for (let s = 0; s < n; s++) {
			const r = table.readings[p][s];
			if (r === null) {
				hasNull = true;
				continue;
			}
			const a = acceptRange(probe.tolerance, r, table.bands?.[p]?.[s]);
			lo[s] = a.low;
			hi[s] = a.high;
			defined.push(s);
		}
		// Same order as binReadings: low end, then suspect index.
		defined.sort((a, b) => lo[a] - lo[b] || a - b);
		const rk = new Int32Array(n).fill(-1);
		defined.forEach((s, i) => (rk[s] = i));
		low.push(lo);
		high.push(hi);
		rank.push(rk);
		byRank.push(Int32Array.from(defined));
		byHigh.push(Int32Array.from([...defined].sort((a, b) => hi[a] - hi[b] || a - b)));
	});
	return { n, low, high, rank, byRank, byHigh, hasNull };
}

const xlogx = (x: number): number => (x > 0 ? x * Math.log(x) : 0);

/** Entropy (nats) of weights with total m and Σ w·ln w = s. */
const entropyOf = (m: number, s: number): number => (m > 0 ? Math.log(m) - s / m : 0);

const LN2 = Math.log(2);

/** Per-point sums shared by every probe scored there; `w` is indexed by suspect. */
export type Point = { members: readonly number[]; w: ArrayLike<number>; wl: Float64Array; mass: number; sAll: number; buf: Int32Array; inside: Uint8Array };

/** Scratch space of one table's size, reused by every point scored on it. */
export type Scratch = { w: Float64Array; wl: Float64Array; inside: Uint8Array; buf: Int32Array; label: Int32Array };

export function scratch(n: number): Scratch {
	return { w: new Float64Array(n), wl: new Float64Array(n), inside: new Uint8Array(n), buf: new Int32Array(n), label: new Int32Array(n) };
}

/**
 * Loads a point (members and their weights, in the same order) into the scratch space; call
 * `release` before loading another.
 */
export function point(members: readonly number[], weights: ArrayLike<number>, sc: Scratch): Point {
	let mass = 0;
	let sAll = 0;
	members.forEach((s, i) => {
		const x = weights[i];
		sc.w[s] = x;
		sc.wl[s] = xlogx(x);
		mass += x;
		sAll += sc.wl[s];
		sc.inside[s] = 1;
	});
	return { members, w: sc.w, wl: sc.wl, mass, sAll, buf: sc.buf, inside: sc.inside };
}

export function release(at: Point): void {
	for (const s of at.members) at.inside[s] = 0;
}

/**
 * The members with a defined reading on probe p, in order of their interval's low end, as
 * ranks into `prep.byRank[p]` (written into `at.buf`); returns their number and the unread mass.
 */
function ordered(prep: Prepared, p: number, at: Point): { k: number; sorted: Int32Array; nullMass: number; nullS: number } {
	const { members, w, wl, buf } = at;
	const rank = prep.rank[p];
	let nullMass = 0;
	let nullS = 0;
	let k = 0;
	for (let i = 0; i < members.length; i++) {
		const s = members[i];
		const r = rank[s];
		if (r < 0) {
			nullMass += w[s];
			nullS += wl[s];
		} else buf[k++] = r;
	}
	const order = prep.byRank[p];
	// Sort the members' ranks, or for a large point pick them out of the probe's whole order,
	// whichever is less work.
	let sorted: Int32Array;
	if (k * 8 > order.length) {
		k = 0;
		for (let r = 0; r < order.length; r++) if (at.inside[order[r]]) buf[k++] = r;
		sorted = buf.subarray(0, k);
	} else sorted = buf.subarray(0, k).sort();
	return { k, sorted, nullMass, nullS };
}

/**
 * Expected entropy drop (bits) from reading probe p at a point, and the number of bins there;
 * fewer than 2 bins when the probe splits nothing.
 */
export function score(prep: Prepared, p: number, at: Point): { gain: number; bins: number } {
	const { w, wl, mass, sAll } = at;
	const { k, sorted, nullMass, nullS } = ordered(prep, p, at);
	const order = prep.byRank[p];
	const lo = prep.low[p];
	const hi = prep.high[p];
	const binMass: number[] = [];
	const binS: number[] = [];
	let end = -Infinity;
	let bm = 0;
	let bs = 0;
	for (let i = 0; i < k; i++) {
		const s = order[sorted[i]];
		if (i > 0 && lo[s] > end) {
			binMass.push(bm);
			binS.push(bs);
			bm = 0;
			bs = 0;
		}
		if (hi[s] > end || i === 0) end = i === 0 ? hi[s] : Math.max(end, hi[s]);
		bm += w[s];
		bs += wl[s];
	}
	if (k > 0) {
		binMass.push(bm);
		binS.push(bs);
	}
	const K = binMass.length;
	if (K < 2) return { gain: 0, bins: K };
	// An unread suspect goes into every branch at weight ÷ K: Σ (w/K)·ln(w/K) = (S − W ln K)/K.
	const nullPart = (nullS - nullMass * Math.log(K)) / K;
	let after = 0;
	for (let b = 0; b < K; b++) {
		const m = binMass[b] + nullMass / K;
		after += (m / mass) * entropyOf(m, binS[b] + nullPart);
	}
	return { gain: Math.max(0, entropyOf(mass, sAll) - after) / LN2, bins: K };
}

/**
 * Bin index of each member with a defined reading on probe p, written into `label` (indexed by
 * suspect; unread members get −1); returns the number of bins.
 */
export function labelBins(prep: Prepared, p: number, at: Point, label: Int32Array): number {
	const { k, sorted } = ordered(prep, p, at);
	for (const s of at.members) label[s] = -1;
	const order = prep.byRank[p];
	const lo = prep.low[p];
	const hi = prep.high[p];
	let end = -Infinity;
	let K = 0;
	for (let i = 0; i < k; i++) {
		const s = order[sorted[i]];
		if (i === 0 || lo[s] > end) {
			K++;
			end = hi[s];
		} else if (hi[s] > end) end = hi[s];
		label[s] = K - 1;
	}
	return K;
}

/**
 * The most pairwise told-apart readings probe p has among the members (outcomes.ts maxOutcomes
 * over them: the earliest-right-end greedy of interval scheduling). No point below this one can
 * have more bins on p.
 */
export function maxOutcomesAmong(prep: Prepared, p: number, at: Point): number {
	const lo = prep.low[p];
	const hi = prep.high[p];
	const order = prep.byHigh[p];
	let count = 0;
	let end = -Infinity;
	const take = (s: number) => {
		if (lo[s] > end) {
			count++;
			end = hi[s];
		}
	};
	// Walk the probe's whole order when the point is a good part of it, else sort the members.
	if (at.members.length * 8 > order.length) {
		for (let i = 0; i < order.length; i++) if (at.inside[order[i]]) take(order[i]);
	} else {
		const rank = prep.rank[p];
		const ids = at.members.filter((s) => rank[s] >= 0).sort((a, b) => hi[a] - hi[b] || a - b);
		for (const s of ids) take(s);
	}
	return count;
}

/** A point: suspects in play (ascending) and their absolute weights, in the same order. */
export type State = { members: number[]; weights: Float64Array; mass: number };

/**
 * The points the outcomes of probe p lead to, in rising order of reading: each bin's members
 * plus the unread ones (ascending), the unread at weight ÷ K. `label` is scratch (see labelBins).
 */
export function children(prep: Prepared, p: number, at: Point, label: Int32Array): State[] {
	const K = labelBins(prep, p, at, label);
	const kids: { members: number[]; weights: number[]; mass: number }[] = Array.from({ length: K }, () => ({ members: [], weights: [], mass: 0 }));
	for (const s of at.members) {
		const b = label[s];
		if (b >= 0) {
			const c = kids[b];
			c.members.push(s);
			c.weights.push(at.w[s]);
			c.mass += at.w[s];
		} else {
			const x = at.w[s] / K;
			for (const c of kids) {
				c.members.push(s);
				c.weights.push(x);
				c.mass += x;
			}
		}
	}
	return kids.map((c) => ({ members: c.members, weights: Float64Array.from(c.weights), mass: c.mass }));
}
