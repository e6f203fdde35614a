/**
 * Immediate dominators of a directed graph from a root.
 *
 * Algorithm: K. D. Cooper, T. J. Harvey and K. Kennedy, "A Simple, Fast Dominance
 * Algorithm", Software Practice and Experience 4 (2001): iterate over the nodes in reverse
 * postorder, setting each node's dominator to the intersection (nearest common ancestor in
 * the current tree, walked by postorder number) of its processed predecessors, until nothing
 * changes.
 *
 * A node d dominates t when every path from the root to t passes through d. On a graph with
 * arcs both ways (an undirected circuit) these are exactly the points on every path.
 */

/** Successor lists by node index. */
export type Successors = ReadonlyArray<ReadonlyArray<number>>;

export interface DominatorTree {
	root: number;
	/** Immediate dominator per node; the root's is itself; −1 when unreachable. */
	idom: Int32Array;
	/** Depth in the dominator tree (root 0); −1 when unreachable. */
	depth: Int32Array;
}

export function dominatorTree(successors: Successors, root: number): DominatorTree {
	const n = successors.length;
	if (!(root >= 0 && root < n)) throw new Error(`dominatorTree: root ${root} is not a node of a ${n}-node graph`);
	// Postorder by an iterative depth-first search (no recursion: harnesses can be deep).
	const post = new Int32Array(n).fill(-1);
	const order: number[] = [];
	const visited = new Uint8Array(n);
	const stack: number[] = [root];
	const next: number[] = [0];
	visited[root] = 1;
	while (stack.length) {
		const v = stack[stack.length - 1];
		const i = next[next.length - 1];
		const succ = successors[v];
		if (i < succ.length) {
			next[next.length - 1] = i + 1;
			const w = succ[i];
			if (!visited[w]) {
				visited[w] = 1;
				stack.push(w);
				next.push(0);
			}
		} else {
			post[v] = order.length;
			order.push(v);
			stack.pop();
			next.pop();
		}
	}
	const preds: number[][] = Array.from({ length: n }, () => []);
	for (const v of order) for (const w of successors[v]) preds[w].push(v);

	const idom = new Int32Array(n).fill(-1);
	idom[root] = root;
	const intersect = (a: number, b: number) => {
		while (a !== b) {
			while (post[a] < post[b]) a = idom[a];
			while (post[b] < post[a]) b = idom[b];
		}
		return a;
	};
	let changed = true;
	while (changed) {
		changed = false;
		for (let k = order.length - 1; k >= 0; k--) {
			const b = order[k];
			if (b === root) continue;
			let nd = -1;
			for (const p of preds[b]) {
				if (idom[p] === -1) continue;
				nd = nd === -1 ? p : intersect(p, nd);
			}
			if (nd !== -1 && idom[b] !== nd) {
				idom[b] = nd;
				changed = true;
			}
		}
	}
	const depth = new Int32Array(n).fill(-1);
	depth[root] = 0;
	// A dominator is a depth-first ancestor, so it comes first in reverse postorder.
	for (let k = order.length - 1; k >= 0; k--) {
		const v = order[k];
		if (v !== root && idom[v] >= 0) depth[v] = depth[idom[v]] + 1;
	}
	return { root, idom, depth };
}

/** The dominators of a node, from the node itself up to the root; empty if unreachable. */
export function dominatorsOf(tree: DominatorTree, v: number): number[] {
	if (tree.idom[v] < 0) return [];
	const out = [v];
	while (v !== tree.root) {
		v = tree.idom[v];
		out.push(v);
	}
	return out;
}

/** Nearest common dominator of several reachable nodes (their lowest common ancestor in the tree). */
export function nearestCommonDominator(tree: DominatorTree, nodes: readonly number[]): number {
	if (!nodes.length) throw new Error('nearestCommonDominator: no nodes given');
	let a = nodes[0];
	for (const b0 of nodes.slice(1)) {
		let b = b0;
		while (tree.depth[a] > tree.depth[b]) a = tree.idom[a];
		while (tree.depth[b] > tree.depth[a]) b = tree.idom[b];
		while (a !== b) {
			a = tree.idom[a];
			b = tree.idom[b];
		}
	}
	return a;
}
