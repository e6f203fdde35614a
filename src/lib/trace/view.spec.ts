import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { defaultScenario, type Scenario } from '$lib/circuit/scenario';
import { pointKey, prepareTrace, type TracePoint } from '$lib/circuit/trace';
import { canvasMarks, traceView } from './view';

const doc = demoHarness();
const base = defaultScenario(doc);
const tracer = prepareTrace(doc, base);

/** The scenario with one point taken out: a wire cut, a part removed, or a node's terminals unplugged. */
function without(point: TracePoint): Scenario {
	const cut = point.type === 'node' ? point.terminals.map((t) => ({ part: t.part, terminal: t.terminal })) : [point.type === 'wire' ? point.wire : point.part];
	return { ...base, disconnected: [...base.disconnected, ...cut] };
}

describe('traceView on the demo harness', () => {
	it('a single gauge: its feed runs through its fuse and the stabilizer, and those are must-pass', () => {
		const v = traceView(doc, tracer, ['fuel-gauge']);
		const feed = v.traces.find((t) => t.side === 'feed')!;
		expect(feed.reached).toBe(true);
		const keys = feed.mustPass.map(pointKey);
		// The demo wires the gauges from fuse 6 through stabilizer 19 (src/lib/circuit/demo.ts).
		expect(keys).toContain('part:fuse-ign');
		expect(keys).toContain('part:stabilizer');
		expect(feed.mustPassNames).toContain('6 Fuse, ignition accessories');
		// Definition of must-pass (DESIGN.md §4): take the fuse out and the gauge loses its feed.
		expect(prepareTrace(doc, without({ type: 'part', part: 'fuse-ign' })).feed('fuel-gauge').reached).toBe(false);
		expect(v.mustPass.has('part:fuse-ign')).toBe(true);
		expect(v.feed.wires).toContain('w-fuel-gauge');
		expect(v.feed.wires).toContain('w-stab-in');
		expect(v.feed.parts).toContain('fuse-ign');
		expect(v.feed.wires).not.toContain('w-temp-gauge');
		expect(v.shared).toBeNull();
	});

	it('a gauge earths by way of its sender: the earth marks hold the sender wires, not the feed', () => {
		const v = traceView(doc, tracer, ['fuel-gauge']);
		const earth = v.traces.find((t) => t.side === 'earth')!;
		expect(earth.reached).toBe(true);
		expect(earth.via).toBe('fuel-sender');
		for (const w of ['w-fuel-a', 'w-fuel-b', 'w-fuel-earth', 'w-strap']) expect(v.earth.wires).toContain(w);
		expect(v.earth.wires).not.toContain('w-fuel-gauge');
		// Definition: without the tank earth point the sender (and so the gauge) has no earth.
		expect(prepareTrace(doc, without({ type: 'part', part: 'tank-earth' })).earth('fuel-sender').reached).toBe(false);
		expect(earth.mustPass.map(pointKey)).toContain('part:tank-earth');
	});

	it('the two gauges share the stabilizer output or a point above it, checked by the definition', () => {
		const v = traceView(doc, tracer, ['fuel-gauge', 'temp-gauge']);
		const shared = v.shared!.feed;
		expect(shared.point).not.toBeNull();
		const point = shared.point!;
		// "Or above": the shared point is on the fuel gauge's feed chain at or before the stabilizer output.
		const chain = tracer.feed('fuel-gauge').mustPass.map(pointKey);
		expect(chain.indexOf(pointKey(point))).toBeGreaterThanOrEqual(0);
		expect(chain.indexOf(pointKey(point))).toBeLessThanOrEqual(chain.indexOf('node:stabilizer:out'));
		// Remove it: both gauges lose their feed (DESIGN.md §4).
		const cut = prepareTrace(doc, without(point));
		expect(cut.feed('fuel-gauge').reached).toBe(false);
		expect(cut.feed('temp-gauge').reached).toBe(false);
		// Nearest: the next point towards the fuel gauge (its own wire) does not cut the other gauge.
		const next = tracer.feed('fuel-gauge').mustPass[chain.indexOf(pointKey(point)) + 1];
		expect(prepareTrace(doc, without(next)).feed('temp-gauge').reached).toBe(true);
		// The sentence names the point; on the demo it is the stabilizer's output terminal.
		expect(shared.name).toBe('terminal out of 19 Instrument voltage stabilizer');
		expect(shared.sentence).toBe('Both get their feed through terminal out of 19 Instrument voltage stabilizer; a fault there or above it explains both.');
		expect(shared.place).toEqual({ on: 'terminal', part: 'stabilizer', terminal: 'out' });
	});

	it('the two gauges share an earth through their senders, and cutting it loses both', () => {
		const v = traceView(doc, tracer, ['fuel-gauge', 'temp-gauge']);
		const earth = v.shared!.earth;
		expect(earth.point).not.toBeNull();
		const cut = prepareTrace(doc, without(earth.point!));
		expect(cut.earth('fuel-sender').reached).toBe(false);
		expect(cut.earth('temp-sender').reached).toBe(false);
		expect(earth.sentence).toMatch(/^Both return to earth \(by way of 22 Fuel tank sender and 23 Coolant temperature sender\) through /);
	});

	it('ignition off: the gauges get no feed, and the sentence says so', () => {
		const off = { ...base, switches: { ...base.switches, ignition: 'off' } };
		const v = traceView(doc, prepareTrace(doc, off), ['fuel-gauge', 'temp-gauge']);
		expect(v.traces.filter((t) => t.side === 'feed').every((t) => !t.reached)).toBe(true);
		expect(v.feed.wires.size).toBe(0);
		expect(v.shared!.feed.point).toBeNull();
		expect(v.shared!.feed.sentence).toContain('No feed path at all reaches 20 Fuel gauge, 21 Coolant temperature gauge.');
	});

	it('unknown part ids are left out rather than thrown on', () => {
		const v = traceView(doc, tracer, ['no-such-part']);
		expect(v.parts).toEqual([]);
		expect(v.traces).toEqual([]);
	});
});

describe('canvasMarks', () => {
	it('gives each wire, part and terminal its own marks', () => {
		const m = canvasMarks(traceView(doc, tracer, ['fuel-gauge', 'temp-gauge']));
		expect(m.any).toBe(true);
		expect(m.wires.get('w-fuel-gauge')).toMatchObject({ feed: true, earth: false, mustPass: true });
		expect(m.wires.get('w-fuel-earth')).toMatchObject({ feed: false, earth: true });
		expect(m.wires.has('w-horn')).toBe(false);
		expect(m.parts.get('fuel-gauge')?.selected).toBe(true);
		expect(m.parts.get('fuse-ign')).toMatchObject({ feed: true, mustPass: true });
		// The shared feed marker sits on the stabilizer's output terminal.
		expect(m.parts.get('stabilizer')?.terminals.get('out')?.shared).toEqual(['feed']);
		expect(canvasMarks(traceView(doc, tracer, [])).any).toBe(false);
	});
});
