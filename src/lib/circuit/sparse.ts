/**
 * Sparse symmetric positive-definite matrices: assembly, a fill-reducing ordering and an
 * LDLᵀ factorisation whose `solve` callers can reuse (one factorisation, many right-hand
 * sides, as rank-one fault updates need).
 *
 * Ordering: minimum degree on the explicit elimination graph (Tinney & Walker's scheme 2,
 * 1967; George & Liu, "The evolution of the minimum degree ordering algorithm", SIAM Review
 * 1989). Harness graphs are nearly trees, so the elimination graph stays small.
 * Factorisation: the up-looking LDLᵀ of T. A. Davis, "Algorithm 849: A concise sparse
 * Cholesky factorization package", ACM TOMS 31 (2005): the elimination tree gives each row's
 * pattern, and row k of L is found by a sparse triangular solve.
 */

/** Symmetric matrix in compressed columns, both triangles stored, diagonal included. */
export interface SymmetricPattern {
	n: number;
	colPtr: Int32Array;
	rowIdx: Int32Array;
}

/** Build the pattern from off-diagonal pairs (i, j); the diagonal is always present. Negative indices are skipped. */
export function symmetricPattern(n: number, pairs: ReadonlyArray<readonly [number, number]>): SymmetricPattern {
	// Count, place both directions plus the diagonal by column, then sort and de-duplicate each column.
	const count = new Int32Array(n + 1);
	for (let j = 0; j < n; j++) count[j + 1] = 1;
	for (const [i, j] of pairs) {
		if (i < 0 || j < 0 || i === j) continue;
		if (i >= n || j >= n) throw new Error(`symmetricPattern: entry (${i}, ${j}) outside a ${n}×${n} matrix`);
		count[i + 1]++;
		count[j + 1]++;
	}
	for (let j = 0; j < n; j++) count[j + 1] += count[j];
	const fill = count.slice(0, n);
	const rows = new Int32Array(count[n]);
	for (let j = 0; j < n; j++) rows[fill[j]++] = j;
	for (const [i, j] of pairs) {
		if (i < 0 || j < 0 || i === j) continue;
		rows[fill[j]++] = i;
		rows[fill[i]++] = j;
	}
	const colPtr = new Int32Array(n + 1);
	const out = new Int32Array(count[n]);
	let q = 0;
	for (let j = 0; j < n; j++) {
		const col = rows.subarray(count[j], count[j + 1]).sort();
		colPtr[j] = q;
		for (let k = 0; k < col.length; k++) if (k === 0 || col[k] !== col[k - 1]) out[q++] = col[k];
	}
	colPtr[n] = q;
	return { n, colPtr, rowIdx: out.slice(0, q) };
}

/** Position of entry (i, j) in the values array, or −1 if not in the pattern. */
export function slotOf(p: SymmetricPattern, i: number, j: number): number {
	let lo = p.colPtr[j];
	let hi = p.colPtr[j + 1] - 1;
	while (lo <= hi) {
		const mid = (lo + hi) >> 1;
		const r = p.rowIdx[mid];
		if (r === i) return mid;
		if (r < i) lo = mid + 1;
		else hi = mid - 1;
	}
	return -1;
}

/** Minimum-degree ordering: perm[k] = the original index eliminated k-th. Ties go to the lower index. */
export function minimumDegree(p: SymmetricPattern): Int32Array {
	const n = p.n;
	const adj: number[][] = new Array(n);
	for (let j = 0; j < n; j++) {
		const a: number[] = [];
		for (let q = p.colPtr[j]; q < p.colPtr[j + 1]; q++) if (p.rowIdx[q] !== j) a.push(p.rowIdx[q]);
		adj[j] = a;
	}
	const heap = new MinHeap(n);
	for (let v = 0; v < n; v++) heap.push(adj[v].length, v);
	const done = new Uint8Array(n);
	const mark = new Int32Array(n).fill(-1);
	const perm = new Int32Array(n);
	let k = 0;
	let stamp = 0;
	while (k < n) {
		const v = heap.pop();
		if (done[v] || heap.lastKey !== adj[v].length) continue;
		done[v] = 1;
		perm[k++] = v;
		const nbrs = adj[v];
		// Eliminating v joins its neighbours into a clique (the fill): each neighbour's list
		// becomes its old list plus v's other neighbours, without v and without repeats.
		for (const u of nbrs) {
			stamp++;
			const next: number[] = [];
			mark[u] = stamp;
			for (const w of adj[u]) {
				if (w === v || done[w] || mark[w] === stamp) continue;
				mark[w] = stamp;
				next.push(w);
			}
			for (const w of nbrs) {
				if (mark[w] === stamp) continue;
				mark[w] = stamp;
				next.push(w);
			}
			adj[u] = next;
			heap.push(next.length, u);
		}
		adj[v] = [];
	}
	return perm;
}

/** Binary heap of (key, index) pairs, smallest key first, ties to the smaller index; lazy deletion by the caller. */
class MinHeap {
	private keys: number[] = [];
	private vals: number[] = [];
	lastKey = -1;
	constructor(capacity: number) {
		this.keys = new Array(0);
		this.vals = new Array(0);
		void capacity;
	}
	private less(i: number, j: number) {
		return this.keys[i] < this.keys[j] || (this.keys[i] === this.keys[j] && this.vals[i] < this.vals[j]);
	}
	push(key: number, val: number) {
		const { keys, vals } = this;
		let i = keys.length;
		keys.push(key);
		vals.push(val);
		while (i > 0) {
			const up = (i - 1) >> 1;
			if (!this.less(i, up)) break;
			[keys[i], keys[up]] = [keys[up], keys[i]];
			[vals[i], vals[up]] = [vals[up], vals[i]];
			i = up;
		}
	}
	pop(): number {
		const { keys, vals } = this;
		const top = vals[0];
		this.lastKey = keys[0];
		const lk = keys.pop()!;
		const lv = vals.pop()!;
		if (keys.length) {
			keys[0] = lk;
			vals[0] = lv;
			let i = 0;
			for (;;) {
				const l = 2 * i + 1;
				const r = l + 1;
				let m = i;
				if (l < keys.length && this.less(l, m)) m = l;
				if (r < keys.length && this.less(r, m)) m = r;
				if (m === i) break;
				[keys[i], keys[m]] = [keys[m], keys[i]];
				[vals[i], vals[m]] = [vals[m], vals[i]];
				i = m;
			}
		}
		return top;
	}
}

/** The structure of L for a pattern and an ordering, reusable for many numeric factorisations. */
export interface Symbolic {
	pattern: SymmetricPattern;
	perm: Int32Array;
	pinv: Int32Array;
	parent: Int32Array;
	/** Column pointers of L (strictly lower part). */
	lp: Int32Array;
	nnzL: number;
}

export function analyse(pattern: SymmetricPattern, perm: Int32Array = minimumDegree(pattern)): Symbolic {
	const n = pattern.n;
	const pinv = new Int32Array(n);
	for (let k = 0; k < n; k++) pinv[perm[k]] = k;
	const parent = new Int32Array(n).fill(-1);
	const flag = new Int32Array(n).fill(-1);
	const lnz = new Int32Array(n);
	for (let k = 0; k < n; k++) {
		flag[k] = k;
		const col = perm[k];
		for (let q = pattern.colPtr[col]; q < pattern.colPtr[col + 1]; q++) {
			let i = pinv[pattern.rowIdx[q]];
			if (i >= k) continue;
			// Walk up the elimination tree from i to the first node already in row k's pattern.
			for (; flag[i] !== k; i = parent[i]) {
				if (parent[i] === -1) parent[i] = k;
				lnz[i]++;
				flag[i] = k;
			}
		}
	}
	const lp = new Int32Array(n + 1);
	for (let k = 0; k < n; k++) lp[k + 1] = lp[k] + lnz[k];
	return { pattern, perm, pinv, parent, lp, nnzL: lp[n] };
}

/** A numeric factorisation P A Pᵀ = L D Lᵀ. */
export interface Factorization {
	n: number;
	/** Solve A x = rhs; rhs is left unchanged. */
	solve(rhs: Float64Array): Float64Array;
	/** Nonzeros of L below the diagonal. */
	nnzL: number;
	/** Pivots raised to the floor (rounding in a floating group of nodes). */
	raisedPivots: number;
	/**
	 * w = D^(−1/2) L⁻¹ P eᵢ as a sparse vector (positions in elimination order, rising), so that
	 * (A⁻¹)ᵢⱼ = wᵢ · wⱼ. Its nonzeros lie on the elimination-tree path from node i to the root
	 * (Gilbert 1994, "Predicting structure in sparse matrix computations", SIAM J. Matrix Anal.
	 * Appl. 15(1)), so a few entries of the inverse cost a path, not a full solve.
	 */
	unitForward(i: number): { idx: Int32Array; val: Float64Array };
}

/** (A⁻¹)ᵢⱼ from two `unitForward` vectors (a merge of their rising positions). */
export function inverseEntry(wi: { idx: Int32Array; val: Float64Array }, wj: { idx: Int32Array; val: Float64Array }): number {
	let s = 0;
	let p = 0;
	let q = 0;
	while (p < wi.idx.length && q < wj.idx.length) {
		const a = wi.idx[p];
		const b = wj.idx[q];
		if (a === b) s += wi.val[p++] * wj.val[q++];
		else if (a < b) p++;
		else q++;
	}
	return s;
}

/**
 * Factorise the matrix with `values` laid out on the symbolic pattern. A pivot below
 * `pivotFloor` is raised to it: with a leakage g on every node, every exact pivot of
 * G + g·I is at least g, so only rounding can push one lower.
 */
export function factorize(sym: Symbolic, values: Float64Array, pivotFloor = 0): Factorization {
	const { pattern, perm, pinv, parent, lp } = sym;
	const n = pattern.n;
	const li = new Int32Array(sym.nnzL);
	const lx = new Float64Array(sym.nnzL);
	const d = new Float64Array(n);
	const y = new Float64Array(n);
	const flag = new Int32Array(n);
	const lnz = new Int32Array(n);
	const stack = new Int32Array(n);
	let raised = 0;
	for (let k = 0; k < n; k++) {
		y[k] = 0;
		let top = n;
		flag[k] = k;
		lnz[k] = 0;
		const col = perm[k];
		for (let q = pattern.colPtr[col]; q < pattern.colPtr[col + 1]; q++) {
			let i = pinv[pattern.rowIdx[q]];
			if (i > k) continue;
			y[i] += values[q];
			let len = 0;
			for (; flag[i] !== k; i = parent[i]) {
				stack[len++] = i;
				flag[i] = k;
			}
			while (len > 0) stack[--top] = stack[--len];
		}
		// Row k of L by a sparse triangular solve in topological order.
		let dk = y[k];
		y[k] = 0;
		for (; top < n; top++) {
			const i = stack[top];
			const yi = y[i];
			y[i] = 0;
			const end = lp[i] + lnz[i];
			for (let p = lp[i]; p < end; p++) y[li[p]] -= lx[p] * yi;
			const lki = yi / d[i];
			dk -= lki * yi;
			li[end] = k;
			lx[end] = lki;
			lnz[i]++;
		}
		if (!(dk > pivotFloor)) {
			if (pivotFloor > 0 && Number.isFinite(dk)) {
				dk = pivotFloor;
				raised++;
			} else {
				throw new Error(`factorize: pivot ${dk} at step ${k} (row ${perm[k]}): the matrix is not positive definite`);
			}
		}
		d[k] = dk;
	}
	const solve = (rhs: Float64Array) => {
		if (rhs.length !== n) throw new Error(`solve: right-hand side has ${rhs.length} entries, the matrix ${n}`);
		const x = new Float64Array(n);
		for (let k = 0; k < n; k++) x[k] = rhs[perm[k]];
		for (let j = 0; j < n; j++) {
			const xj = x[j];
			if (xj === 0) continue;
			for (let p = lp[j]; p < lp[j + 1]; p++) x[li[p]] -= lx[p] * xj;
		}
		for (let k = 0; k < n; k++) x[k] /= d[k];
		for (let j = n - 1; j >= 0; j--) {
			let s = x[j];
			for (let p = lp[j]; p < lp[j + 1]; p++) s -= lx[p] * x[li[p]];
			x[j] = s;
		}
		const out = new Float64Array(n);
		for (let k = 0; k < n; k++) out[perm[k]] = x[k];
		return out;
	};
	const scratch = new Float64Array(n);
	const pathBuf = new Int32Array(n);
	const unitForward = (i: number) => {
		let len = 0;
		for (let k = pinv[i]; k !== -1; k = parent[k]) pathBuf[len++] = k;
		scratch[pinv[i]] = 1;
		for (let q = 0; q < len; q++) {
			const j = pathBuf[q];
			const xj = scratch[j];
			if (xj === 0) continue;
			for (let p = lp[j]; p < lp[j + 1]; p++) scratch[li[p]] -= lx[p] * xj;
		}
		const idx = pathBuf.slice(0, len);
		const val = new Float64Array(len);
		for (let q = 0; q < len; q++) {
			const k = idx[q];
			val[q] = scratch[k] / Math.sqrt(d[k]);
			scratch[k] = 0;
		}
		return { idx, val };
	};
	return { n, solve, nnzL: sym.nnzL, raisedPivots: raised, unitForward };
}
