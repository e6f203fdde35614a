import { describe, expect, it } from 'vitest';
import { buildCircuit } from './circuit';
import { solveCircuit } from './solve';
import { parseSpiceRaw, toSpice } from './spice';
import { generateHarness } from './testing/generate';
import { runOperatingPoints } from './testing/ngspice';
import { demoHarness, withOppositeEarth } from './demo';
import { defaultScenario } from './scenario';
import type { HarnessDocument } from './schema';
import type { Scenario } from './scenario';

/** Agreement the issue asks for: 1 µV + 1e-6 of the value, on every node. */
const agrees = (ours: number, theirs: number) => Math.abs(ours - theirs) <= 1e-6 + 1e-6 * Math.abs(theirs);

function compare(cases: { doc: HarnessDocument; scenario: Scenario; name: string }[]) {
	const solved = cases.map(({ doc, scenario, name }) => {
		const s = solveCircuit(buildCircuit(doc, scenario));
		const deck = toSpice(s.circuit, { g: s.g, title: name });
		return { s, deck, name };
	});
	// ngspice-39 from Debian, an independent simulator, run on every deck in one batch process.
	const results = runOperatingPoints(solved.map((x) => x.deck.text));
	const bad: string[] = [];
	let nodes = 0;
	let live = 0;
	solved.forEach(({ s, deck, name }, i) => {
		const spice = results[i];
		deck.nodes.forEach((n, k) => {
			const theirs = spice.get(n);
			if (theirs === undefined) return void bad.push(`${name}: ngspice has no node ${n}`);
			nodes++;
			if (Math.abs(theirs) > 0.5) live++;
			if (!agrees(s.voltages[k], theirs)) bad.push(`${name} ${s.circuit.nodeNames[k]}: ours ${s.voltages[k]}, ngspice ${theirs}`);
		});
	});
	return { bad, nodes, live };
}

describe('DC solve against ngspice (independent SPICE simulator, Debian package ngspice 39)', () => {
	it('agrees on every node of 240 generated harnesses (floating parts, parallel paths, open switches)', () => {
		const cases = [];
		for (let seed = 1; seed <= 240; seed++) {
			const { doc, scenario } = generateHarness(5000 + seed, {
				parts: 10 + (seed % 60),
				crossLinks: seed % 3 === 0 ? 0.3 : 0.1,
				floating: 0.08,
				systemVoltage: ([6, 12, 24] as const)[seed % 3]
			});
			cases.push({ doc, scenario, name: `generated seed ${5000 + seed}` });
		}
		const { bad, nodes, live } = compare(cases);
		expect(bad).toEqual([]);
		expect(nodes).toBeGreaterThan(20000);
		expect(live).toBeGreaterThan(5000); // plenty of nodes carry real voltages, not just floating zeros
	}, 120_000);

	it('agrees on every node of the demo harness, both polarities, in several scenarios', () => {
		const cases = [];
		for (const doc of [demoHarness(), withOppositeEarth(demoHarness())]) {
			const base = defaultScenario(doc);
			const variants: [string, Scenario][] = [
				['default', base],
				['ignition off', { ...base, switches: { ...base.switches, ignition: 'off' } }],
				['head lamps main', { ...base, switches: { ...base.switches, 'light-switch': 'head', 'dip-switch': 'main' } }],
				['starting', { ...base, switches: { ...base.switches, ignition: 'start' } }],
				['horn, wiper, brakes', { ...base, switches: { ...base.switches, 'horn-push': 'pressed', 'wiper-switch': 'on', 'brake-switch': 'pressed' } }],
				['running', { ...base, engineRunning: true, switches: { ...base.switches, 'oil-switch': 'pressure' } }],
				['stabilizer earth off', { ...base, disconnected: ['w-stab-earth'] }],
				['tank unplugged', { ...base, disconnected: ['rear-plug'] }]
			];
			for (const [name, scenario] of variants) cases.push({ doc, scenario, name: `demo ${doc.vehicle.earth} earth, ${name}` });
		}
		const { bad, nodes } = compare(cases);
		expect(bad).toEqual([]);
		expect(nodes).toBeGreaterThan(16 * 200);
	}, 60_000);

	it('parses an ngspice ASCII raw file', () => {
		const raw = [
			'Title: t',
			'Plotname: Operating Point',
			'Flags: real',
			'No. Variables: 3',
			'No. Points: 1',
			'Variables:',
			'\t0\tv(n1)\tvoltage',
			'\t1\tv(n2)\tvoltage',
			'\t2\ti(v1)\tcurrent',
			'Values:',
			' 0\t1.260000000000000e+01',
			'\t1.177417261518494e+01',
			'\t-4.088254380272929e-01'
		].join('\n');
		const m = parseSpiceRaw(raw);
		expect(m.get('n1')).toBe(12.6);
		expect(m.get('n2')).toBe(11.77417261518494);
		expect(m.has('v1')).toBe(false);
	});
});

export { compare as compareWithNgspice };
