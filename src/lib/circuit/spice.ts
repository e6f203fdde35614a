/**
 * SPICE netlist export of a flat circuit, and parsing of ngspice's ASCII raw output, so an
 * independent simulator can check the solver. Running ngspice is I/O and lives in the tests
 * and the benchmark, not here.
 *
 * Batteries and generators go out in Thevenin form (a voltage source behind its resistance),
 * the form a SPICE user would draw, while the solver uses their Norton equivalents; every
 * node gets the same 1e12 Ω leakage to ground (node 0, our reference) that the solver uses.
 */
import type { Circuit } from './circuit';

export interface SpiceDeck {
	/** Netlist text, ending in `.end`. */
	text: string;
	/** SPICE node name per node index (ours), e.g. "n12"; the reference is "0". */
	nodes: string[];
}

const num = (x: number) => {
	if (!Number.isFinite(x)) throw new Error(`spice: value ${x} is not finite`);
	return x.toPrecision(17).replace(/\.?0+(e|$)/, '$1');
};

export interface SpiceOptions {
	title?: string;
	/** Conductances to export (default: each element's `g`); pass a solution's `g` for settled relays and stabilizers. */
	g?: ArrayLike<number>;
	/** Text placed before `.end`, e.g. a `.control` block. */
	control?: string;
}

/** Export a circuit as a SPICE netlist. */
export function toSpice(c: Circuit, options: SpiceOptions = {}): SpiceDeck {
	const g = options.g ?? c.elements.map((e) => e.g);
	const nodes = c.nodeNames.map((_, i) => `n${i + 1}`);
	const name = (i: number) => (i < 0 ? '0' : nodes[i]);
	const title = (options.title ?? 'loomwright circuit').replace(/[\r\n]+/g, ' ');
	const lines: string[] = [title];
	const thevenin = new Map<number, { a: number; b: number; emf: number }>();
	for (const s of c.sources) if (s.element !== undefined) thevenin.set(s.element, { a: s.a, b: s.b, emf: s.emf ?? 0 });
	c.elements.forEach((e, k) => {
		const gk = g[k];
		if (!(gk > 0) || e.a === e.b) return;
		const src = thevenin.get(k);
		if (src) {
			// V(a) − V(b) = emf with the element's resistance in series: a —R— m —V— b
			// (the source's own orientation, which may run against the element's).
			lines.push(`R${k} ${name(src.a)} m${k} ${num(1 / gk)}`);
			lines.push(`V${k} m${k} ${name(src.b)} DC ${num(src.emf)}`);
		} else {
			lines.push(`R${k} ${name(e.a)} ${name(e.b)} ${num(1 / gk)}`);
		}
	});
	c.sources.forEach((s, k) => {
		if (s.element !== undefined || !s.current) return;
		// SPICE current flows from n+ through the source to n−: "I b a" drives current into a.
		lines.push(`I${k} ${name(s.b)} ${name(s.a)} DC ${num(s.current)}`);
	});
	nodes.forEach((n, i) => lines.push(`RL${i} ${n} 0 ${num(1 / c.gmin)}`));
	if (options.control) lines.push(options.control.trimEnd());
	lines.push('.end', '');
	return { text: lines.join('\n'), nodes };
}

/** Node voltages from an ngspice ASCII raw file (`set filetype=ascii`, `write file all`) of an `.op` run, by lower-case node name. */
export function parseSpiceRaw(text: string): Map<string, number> {
	const lines = text.split(/\r?\n/);
	const count = Number(/^No\. Variables:\s*(\d+)/m.exec(text)?.[1]);
	if (!Number.isInteger(count) || count <= 0) throw new Error('parseSpiceRaw: no "No. Variables:" line; is this an ASCII raw file?');
	const varsAt = lines.findIndex((l) => l.startsWith('Variables:'));
	const valuesAt = lines.findIndex((l) => l.startsWith('Values:'));
	if (varsAt < 0 || valuesAt < 0) throw new Error('parseSpiceRaw: missing "Variables:" or "Values:" section');
	const names: string[] = [];
	for (let i = 1; i <= count; i++) {
		const cols = lines[varsAt + i].trim().split(/\s+/);
		names.push(cols[1].toLowerCase());
	}
	// Values: the first line carries the point index before the first value.
	const values: number[] = [];
	for (let i = valuesAt + 1; i < lines.length && values.length < count; i++) {
		const cols = lines[i].trim().split(/\s+/).filter(Boolean);
		if (!cols.length) continue;
		values.push(Number(cols[cols.length - 1]));
	}
	if (values.length !== count) throw new Error(`parseSpiceRaw: ${count} variables but ${values.length} values`);
	const out = new Map<string, number>();
	names.forEach((n, i) => {
		const m = /^v\((.+)\)$/.exec(n);
		if (m) out.set(m[1], values[i]);
	});
	return out;
}
