import { describe, expect, it } from 'vitest';
import { dominatorTree, dominatorsOf, nearestCommonDominator } from './dominators';

describe('dominatorTree', () => {
	// Cooper, Harvey & Kennedy, "A Simple, Fast Dominance Algorithm" (2001), the irreducible
	// example graph of their Figure 4, nodes named by postorder number 6 (entry) … 1:
	// 6→5, 6→4, 5→1, 4→2, 4→3, 1→2, 2→1, 2→3, 3→2. The paper works it to idom = 6 for every node.
	it('reproduces the worked example of Cooper, Harvey & Kennedy (2001)', () => {
		const succ: number[][] = [];
		const edges = [
			[6, 5],
			[6, 4],
			[5, 1],
			[4, 2],
			[4, 3],
			[1, 2],
			[2, 1],
			[2, 3],
			[3, 2]
		];
		for (let i = 0; i <= 6; i++) succ.push([]);
		for (const [a, b] of edges) succ[a].push(b);
		const t = dominatorTree(succ, 6);
		for (const v of [1, 2, 3, 4, 5]) expect(t.idom[v]).toBe(6);
		expect(t.idom[0]).toBe(-1); // node 0 is not in the graph: unreachable
	});

	// A textbook diamond worked by hand: r→a, r→b, a→c, b→c, c→d. idom(c) = r, idom(d) = c.
	it('handles a diamond and a chain (worked by hand)', () => {
		const succ = [[1, 2], [3], [3], [4], []];
		const t = dominatorTree(succ, 0);
		expect([...t.idom]).toEqual([0, 0, 0, 0, 3]);
		expect(dominatorsOf(t, 4)).toEqual([4, 3, 0]);
		expect(nearestCommonDominator(t, [1, 2])).toBe(0);
		expect(nearestCommonDominator(t, [4, 3])).toBe(3);
		expect(t.depth[4]).toBe(2);
	});
});
