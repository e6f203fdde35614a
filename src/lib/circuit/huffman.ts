// Optimal K-ary prefix codes: the yardstick behind the plan's lower bounds (plan.ts, plan-search.ts).

/**
 * Expected codeword length of an optimal K-ary prefix code (Huffman 1952, "A Method for the
 * Construction of Minimum-Redundancy Codes", Proc. IRE 40(9):1098–1101): pad with zero-chance
 * dummies until (n − 1) is a multiple of (K − 1), then merge the K least likely repeatedly; the
 * expected length is the sum of the merged chances.
 */
export function huffmanExpectedLength(chances: readonly number[], K: number): number {
	if (!(Number.isInteger(K) && K >= 2)) throw new RangeError(`huffmanExpectedLength: K must be an integer ≥ 2, got ${K}`);
	const w = chances.filter((x) => x > 0);
	if (w.length <= 1) return 0;
	while ((w.length - 1) % (K - 1) !== 0) w.push(0);
	// n is small (ambiguity classes): a sorted array is enough.
	w.sort((a, b) => a - b);
	let total = 0;
	while (w.length > 1) {
		const merged = w.splice(0, K).reduce((a, b) => a + b, 0);
		total += merged;
		let i = 0;
		while (i < w.length && w[i] < merged) i++;
		w.splice(i, 0, merged);
	}
	return total;
}
