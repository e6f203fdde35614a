// An invented loom of any size for the drawing board's benchmark and its large-loom tests.
// Invented data: numbered parts on a grid, trade-letter codes, no real vehicle.

/** A deterministic pseudo-random sequence (Park–Miller minimal standard generator). */
function random(seed: number) {
	let s = seed;
	return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

/** An invented loom: parts on a grid, wires mostly between near neighbours, trade-letter codes. */
export function generateLoom(parts: number, wires: number) {
	const rnd = random(20261201);
	const kinds: { kind: string; terminals: string[]; params?: Record<string, unknown> }[] = [
		{ kind: 'fuse', terminals: ['in', 'out'] },
		{ kind: 'lamp', terminals: ['feed', 'earth'] },
		{ kind: 'resistor', terminals: ['1', '2'] },
		{ kind: 'relay', terminals: ['85', '86', '30', '87', '87a'] },
		{ kind: 'gauge', terminals: ['feed', 'sender'] },
		{ kind: 'splice', terminals: ['1', '2', '3', '4'] },
		{ kind: 'earth-point', terminals: ['stud'] },
		{ kind: 'connector', terminals: ['A1', 'A2', 'B1', 'B2'], params: { pins: [['A1', 'B1'], ['A2', 'B2']] } }
	];
	const codes = ['B', 'R', 'G', 'U', 'N', 'W', 'Y', 'P', 'G/B', 'R/W', 'U/W', 'N/Y', 'G/W', 'W/R', 'LG/N', 'B/Y'];
	const columns = Math.ceil(Math.sqrt(parts * 1.6));
	const list = Array.from({ length: parts }, (_, i) => {
		const k = kinds[i % kinds.length];
		return {
			id: `p${i}`,
			key: String(i + 1),
			label: `Part ${i + 1}`,
			kind: k.kind,
			terminals: k.terminals,
			...(k.params ? { params: k.params } : {}),
			position: { x: (i % columns) * 260, y: Math.floor(i / columns) * 170 }
		};
	});
	const out = [];
	for (let i = 0; i < wires; i++) {
		const a = Math.floor(rnd() * parts);
		// A neighbour within two columns and two rows, as looms are drawn in local groups.
		const b = Math.min(parts - 1, Math.max(0, a + Math.floor(rnd() * 5 - 2) + columns * Math.floor(rnd() * 5 - 2)));
		const to = b === a ? (a + 1) % parts : b;
		const pa = list[a];
		const pb = list[to];
		out.push({
			id: `w${i}`,
			from: { part: pa.id, terminal: pa.terminals[Math.floor(rnd() * pa.terminals.length)] },
			to: { part: pb.id, terminal: pb.terminals[Math.floor(rnd() * pb.terminals.length)] },
			code: codes[Math.floor(rnd() * codes.length)],
			size: { mm2: 1 },
			lengthM: 1
		});
	}
	return { schemaVersion: 1, vehicle: { systemVoltage: 12, earth: 'negative' }, palette: 'trade-letters', parts: list, wires: out };
}
