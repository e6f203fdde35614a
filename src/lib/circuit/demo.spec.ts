import { describe, expect, it } from 'vitest';
import { demoHarness, withOppositeEarth } from './demo';
import { parseDocument } from './schema';
import { defaultScenario } from './scenario';
import { solve } from './solve';
import { measureVolts, testLamp } from './meters';
import { pointKey, prepareTrace, sharedUpstream, sharedEarth } from './trace';
import { nets } from './nets';

const doc = demoHarness();
const base = defaultScenario(doc);

describe('demo harness', () => {
	it('is a valid document of at least 40 parts, positive earth, laid out left to right', () => {
		expect(parseDocument(JSON.parse(JSON.stringify(doc))).ok).toBe(true);
		expect(doc.parts.length).toBeGreaterThanOrEqual(40);
		expect(doc.vehicle).toEqual({ systemVoltage: 12, earth: 'positive' });
		const xs = doc.parts.map((p) => p.position.x);
		expect(Math.min(...xs)).toBeLessThan(Math.max(...xs));
		expect(doc.meta?.notes).toMatch(/invented/);
		expect(nets(doc).length).toBeGreaterThan(15);
	});
	it('defaults to ignition on, lights off, engine stopped', () => {
		expect(base.switches.ignition).toBe('ign');
		expect(base.switches['light-switch']).toBe('off');
		expect(base.engineRunning).toBe(false);
	});
	it('battery ≈ 12.6 V at rest, ≈ 14 V charging, gauges fed ≈ 10 V average and pulsing (common practice)', () => {
		const rest = measureVolts(doc, { ...base, switches: { ...base.switches, ignition: 'off' } }, { part: 'battery', terminal: '-' });
		// Positive earth: the live post reads negative with the black lead on the earthed post.
		expect(rest.volts).toBeCloseTo(-12.6, 3);
		const charging = measureVolts(doc, { ...base, engineRunning: true, switches: { ...base.switches, 'oil-switch': 'pressure' } }, { part: 'battery', terminal: '-' });
		expect(Math.abs(charging.volts)).toBeGreaterThan(13.5);
		expect(Math.abs(charging.volts)).toBeLessThan(14.5);
		const gauges = measureVolts(doc, base, { part: 'fuel-gauge', terminal: 'feed' }, { black: { part: 'stabilizer', terminal: 'earth' } });
		// The set-point holds at the stabilizer's own output; the gauge wire drops about a millivolt.
		expect(gauges.volts).toBeCloseTo(-10, 2);
		expect(gauges.pulsing).toBe(true);
		expect(rest.pulsing).toBe(false);
	});
	it('warning lamps: charging and oil lamps lit with the engine stopped, out when running', () => {
		const stopped = solve(doc, base);
		expect(stopped.converged).toBe(true);
		const lit = (s: ReturnType<typeof solve>, id: string) => (s.power.get(id) ?? 0) / 2.2;
		expect(lit(stopped, 'charge-lamp')).toBeGreaterThan(0.5);
		expect(lit(stopped, 'oil-lamp')).toBeGreaterThan(0.5);
		const running = solve(doc, { ...base, engineRunning: true, switches: { ...base.switches, 'oil-switch': 'pressure' } });
		expect(lit(running, 'charge-lamp')).toBeLessThan(0.01);
		expect(lit(running, 'oil-lamp')).toBeLessThan(1e-9);
	});
	it('the horn sounds through its relay when the push is pressed; the starter turns on "start"', () => {
		const horn = solve(doc, { ...base, switches: { ...base.switches, 'horn-push': 'pressed' } });
		expect(horn.energised.has('horn-relay')).toBe(true);
		expect(horn.power.get('horn')!).toBeGreaterThan(30);
		const start = solve(doc, { ...base, switches: { ...base.switches, ignition: 'start' } });
		expect(start.energised.has('starter-relay')).toBe(true);
		expect(start.power.get('starter')!).toBeGreaterThan(500);
	});
	it('both gauges share the stabilizer; the two dip beams share the dip switch, and the earths differ', () => {
		const gauges = sharedUpstream(doc, base, ['fuel-gauge', 'temp-gauge']);
		expect(gauges.shared).toBe(true);
		expect(gauges.nearest && pointKey(gauges.nearest)).toBe('node:stabilizer:out');
		const keys = gauges.chain.map(pointKey);
		for (const k of ['part:stabilizer', 'part:fuse-ign', 'part:ignition:30-15', 'wire:w-battery-feed', 'node:battery:-']) expect(keys).toContain(k);
		const lights = { ...base, switches: { ...base.switches, 'light-switch': 'head' } };
		const dips = sharedUpstream(doc, lights, ['head-dip-left', 'head-dip-right']);
		expect(dips.nearest && pointKey(dips.nearest)).toBe('node:bulkhead:B5');
		const earth = sharedEarth(doc, lights, ['head-dip-left', 'tail-left']);
		expect(earth.nearest && pointKey(earth.nearest)).toBe('node:chassis');
		// The temperature sender earths on the engine, whose strap goes straight to the battery
		// strap's stud as well as through the chassis: the senders meet only at that stud.
		const senders = sharedEarth(doc, base, ['fuel-sender', 'temp-sender']);
		expect(senders.nearest && pointKey(senders.nearest)).toBe('node:strap-earth:stud');
	});
	it('a test lamp on the dash earth stud reads nothing; on the gauge feed it dims the pulsing supply', () => {
		const onEarth = testLamp(doc, base, { part: 'dash-earth', terminal: 'stud' });
		expect(onEarth.brightness).toBeLessThan(1e-4);
		const onFeed = testLamp(doc, base, { part: 'fuel-gauge', terminal: 'feed' }, { watts: 5 });
		expect(onFeed.brightness).toBeGreaterThan(0.3);
	});
});

describe('positive and negative earth versions of the demo harness', () => {
	const neg = withOppositeEarth(doc);
	const negBase = defaultScenario(neg);
	const scenarios = [
		base,
		{ ...base, switches: { ...base.switches, 'light-switch': 'head', 'dip-switch': 'main' } },
		{ ...base, switches: { ...base.switches, 'horn-push': 'pressed', 'wiper-switch': 'on' } },
		{ ...base, engineRunning: true }
	];
	it('give mirror-image voltages on every node', () => {
		for (const s of scenarios) {
			const a = solve(doc, s);
			const b = solve(neg, { ...negBase, ...s });
			const swap = (name: string) => name.replace(/^battery:([+-])$/, (_, t) => `battery:${t === '+' ? '-' : '+'}`);
			a.circuit.nodeNames.forEach((name, i) => {
				const j = b.circuit.nodeIndex.get(swap(name))!;
				expect(b.at(j), name).toBeCloseTo(-a.voltages[i], 9);
			});
		}
	});
	it('give the same must-pass points for every part', () => {
		const live = (k: string) => k.replace(/^node:battery:[+-]$/, 'node:battery:live');
		for (const s of scenarios) {
			const ta = prepareTrace(doc, s);
			const tb = prepareTrace(neg, s);
			for (const p of doc.parts) {
				for (const side of ['feed', 'earth'] as const) {
					expect(tb.mustPass(p.id, side).map(pointKey).map(live)).toEqual(ta.mustPass(p.id, side).map(pointKey).map(live));
				}
			}
		}
	});
});
