import { describe, expect, it } from 'vitest';
import { analyse, factorize, minimumDegree, slotOf, symmetricPattern } from './sparse';
import { prng } from './testing/generate';

/** Dense Gaussian elimination with partial pivoting, as in any numerical-methods textbook. */
function denseSolve(a: number[][], b: number[]): number[] {
	const n = b.length;
	const m = a.map((row, i) => [...row, b[i]]);
	for (let k = 0; k < n; k++) {
		let p = k;
		for (let i = k + 1; i < n; i++) if (Math.abs(m[i][k]) > Math.abs(m[p][k])) p = i;
		[m[k], m[p]] = [m[p], m[k]];
		for (let i = k + 1; i < n; i++) {
			const f = m[i][k] / m[k][k];
			for (let j = k; j <= n; j++) m[i][j] -= f * m[k][j];
		}
	}
	const x = new Array(n).fill(0);
	for (let i = n - 1; i >= 0; i--) {
		let s = m[i][n];
		for (let j = i + 1; j < n; j++) s -= m[i][j] * x[j];
		x[i] = s / m[i][i];
	}
	return x;
}

describe('sparse LDLᵀ', () => {
	it('solves a 2×2 worked by hand', () => {
		// [[3, -1], [-1, 2]] x = [1, 0]: det 5, x = [2/5, 1/5].
		const p = symmetricPattern(2, [[0, 1]]);
		const v = new Float64Array(p.rowIdx.length);
		v[slotOf(p, 0, 0)] = 3;
		v[slotOf(p, 1, 1)] = 2;
		v[slotOf(p, 0, 1)] = -1;
		v[slotOf(p, 1, 0)] = -1;
		const f = factorize(analyse(p), v);
		const x = f.solve(Float64Array.from([1, 0]));
		expect(x[0]).toBeCloseTo(0.4, 14);
		expect(x[1]).toBeCloseTo(0.2, 14);
	});

	it('agrees with dense elimination on random sparse SPD matrices (Laplacian + diagonal)', () => {
		for (let seed = 1; seed <= 40; seed++) {
			const r = prng(seed);
			const n = r.int(2, 40);
			const pairs: [number, number][] = [];
			const dense = Array.from({ length: n }, () => new Array(n).fill(0));
			for (let i = 1; i < n; i++) {
				const edges = r.int(1, 3);
				for (let e = 0; e < edges; e++) {
					const j = r.int(0, i - 1);
					const g = Math.pow(10, r.range(-3, 3));
					pairs.push([i, j]);
					dense[i][i] += g;
					dense[j][j] += g;
					dense[i][j] -= g;
					dense[j][i] -= g;
				}
			}
			for (let i = 0; i < n; i++) dense[i][i] += r.chance(0.3) ? r.range(0.01, 10) : 1e-3;
			const p = symmetricPattern(n, pairs);
			const v = new Float64Array(p.rowIdx.length);
			for (let j = 0; j < n; j++) for (let q = p.colPtr[j]; q < p.colPtr[j + 1]; q++) v[q] = dense[p.rowIdx[q]][j];
			const b = Array.from({ length: n }, () => r.range(-5, 5));
			const x = factorize(analyse(p), v).solve(Float64Array.from(b));
			const ref = denseSolve(dense, b);
			for (let i = 0; i < n; i++) expect(Math.abs(x[i] - ref[i])).toBeLessThan(1e-6 * (1 + Math.abs(ref[i])));
		}
	});

	it('minimum degree gives no fill on a tree (eliminating leaves first)', () => {
		const n = 200;
		const r = prng(3);
		const pairs: [number, number][] = [];
		for (let i = 1; i < n; i++) pairs.push([i, r.int(0, i - 1)]);
		const p = symmetricPattern(n, pairs);
		const perm = minimumDegree(p);
		expect(new Set(perm).size).toBe(n);
		expect(analyse(p, perm).nnzL).toBe(n - 1);
	});

	it('refuses a matrix that is not positive definite', () => {
		const p = symmetricPattern(2, [[0, 1]]);
		const v = new Float64Array(p.rowIdx.length);
		v[slotOf(p, 0, 0)] = 1;
		v[slotOf(p, 1, 1)] = 1;
		v[slotOf(p, 0, 1)] = -2;
		v[slotOf(p, 1, 0)] = -2;
		expect(() => factorize(analyse(p), v)).toThrow(/not positive definite/);
	});
});
