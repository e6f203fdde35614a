import { describe, expect, it } from 'vitest';
import { assertDocument, type HarnessDocument } from './schema';
import { defaultScenario, viewScenario, type Scenario } from './scenario';
import { pointKey, prepareTrace, sharedEarth, sharedUpstream, traceEarth, traceFeed } from './trace';
import { generateHarness, prng } from './testing/generate';
import { relayStates } from './solve';

/**
 * An independent reading of "is the part fed?", written straight from the definition in
 * DESIGN.md §4: current may pass through wires, fuses (not blown), closed switch contacts,
 * connector pins, a relay's closed contact (30–87 energised, 30–87a not), a stabilizer (input to output) and
 * earth points (to the chassis); a splice's terminals are one point. A point is must-pass
 * when removing it leaves the part with no path at all.
 */
function model(doc: HarnessDocument, scenario: Scenario, energised: ReadonlySet<string>) {
	const view = viewScenario(doc, scenario);
	const adj = new Map<string, Set<string>>();
	const link = (a: string, b: string) => {
		if (!adj.has(a)) adj.set(a, new Set());
		adj.get(a)!.add(b);
	};
	const parts = new Map(doc.parts.map((p) => [p.id, p]));
	const nodeOf = (part: string, t: string) => (parts.get(part)!.kind === 'splice' ? `node:${part}` : `node:${part}:${t}`);
	const on = (part: string, t: string) => !view.terminalOff({ part, terminal: t });
	const through = (el: string, a: string, b: string, oneWay = false) => {
		link(a, el);
		link(el, b);
		if (!oneWay) {
			link(b, el);
			link(el, a);
		}
	};
	for (const p of doc.parts) {
		if (view.partOff(p.id)) continue;
		const pair = (a: string, b: string) => on(p.id, a) && on(p.id, b) && through(`part:${p.id}:${a}-${b}`, nodeOf(p.id, a), nodeOf(p.id, b));
		if (p.kind === 'fuse' && !p.params.blown && on(p.id, 'in') && on(p.id, 'out')) through(`part:${p.id}`, nodeOf(p.id, 'in'), nodeOf(p.id, 'out'));
		if (p.kind === 'earth-point' && on(p.id, 'stud')) through(`part:${p.id}`, nodeOf(p.id, 'stud'), 'node:chassis');
		if (p.kind === 'switch') for (const [a, b] of view.position(p).closed) pair(a, b);
		if (p.kind === 'connector') for (const [a, b] of p.params.pins) pair(a, b);
		if (p.kind === 'relay') pair('30', energised.has(p.id) ? '87' : '87a');
		if (p.kind === 'stabilizer' && on(p.id, 'in') && on(p.id, 'out')) through(`part:${p.id}`, nodeOf(p.id, 'in'), nodeOf(p.id, 'out'), true);
	}
	for (const w of doc.wires) {
		if (view.wireOff(w.id) || view.terminalOff(w.from) || view.terminalOff(w.to)) continue;
		through(`wire:${w.id}`, nodeOf(w.from.part, w.from.terminal), nodeOf(w.to.part, w.to.terminal));
	}
	const bat = doc.parts.find((p) => p.kind === 'battery')!;
	const live = nodeOf(bat.id, doc.vehicle.earth === 'negative' ? '+' : '-');
	const ends = (partId: string) => {
		const p = parts.get(partId)!;
		if (view.partOff(partId)) return [];
		const ts = p.kind === 'relay' ? ['85', '86'] : p.kind === 'stabilizer' ? ['in', 'earth'] : p.terminals;
		return ts.filter((t) => on(partId, t)).map((t) => nodeOf(partId, t));
	};
	const reaches = (from: string, goals: string[], removed?: string) => {
		if (from === removed) return false;
		const goal = new Set(goals);
		const seen = new Set([from]);
		const stack = [from];
		while (stack.length) {
			const v = stack.pop()!;
			if (goal.has(v)) return true;
			for (const w of adj.get(v) ?? []) {
				if (w === removed || seen.has(w)) continue;
				seen.add(w);
				stack.push(w);
			}
		}
		return false;
	};
	return { adj, live, ends, reaches };
}

describe('must-pass points against their definition, 200 generated harnesses', () => {
	it('a point is must-pass exactly when removing it cuts every feed', () => {
		let checkedPoints = 0;
		let mustPassSeen = 0;
		const wrong: string[] = [];
		for (let seed = 1; seed <= 200; seed++) {
			const { doc, scenario } = generateHarness(seed, { parts: 10 + (seed % 25) });
			const energised = relayStates(doc, scenario);
			const tracer = prepareTrace(doc, scenario, { energised });
			const m = model(doc, scenario, energised);
			const r = prng(seed * 7);
			const loads = doc.parts.filter((p) => !['battery', 'earth-point', 'splice'].includes(p.kind));
			for (let k = 0; k < 4 && loads.length; k++) {
				const part = r.pick(loads);
				const goals = m.ends(part.id);
				const fed = m.reaches(m.live, goals);
				const trace = tracer.feed(part.id);
				expect(trace.reached, `seed ${seed} part ${part.id}`).toBe(fed);
				if (!fed) {
					expect(trace.mustPass).toEqual([]);
					continue;
				}
				const must = new Set(trace.mustPass.map(pointKey));
				mustPassSeen += must.size;
				for (const point of m.adj.keys()) {
					// A point that is itself one of the part's terminals cuts it only if it is its only terminal.
					const cut = !m.reaches(m.live, goals.filter((g) => g !== point), point);
					if (must.has(point) !== cut) wrong.push(`seed ${seed} part ${part.id} point ${point}: must-pass ${must.has(point)}, cuts ${cut}`);
					checkedPoints++;
				}
				// Every listed path passes every must-pass point.
				for (const path of trace.paths) {
					const keys = new Set(path.map(pointKey));
					for (const p of must) expect(keys.has(p)).toBe(true);
				}
			}
		}
		expect(wrong).toEqual([]);
		expect(checkedPoints).toBeGreaterThan(10000);
		expect(mustPassSeen).toBeGreaterThan(1000);
	}, 60_000);

	it('the shared upstream chain is the common part of the must-pass lists, nearest last', () => {
		let shared = 0;
		for (let seed = 1; seed <= 200; seed++) {
			const { doc, scenario } = generateHarness(seed + 1000, { parts: 15 + (seed % 20) });
			const tracer = prepareTrace(doc, scenario);
			const loads = doc.parts.filter((p) => ['lamp', 'load', 'motor', 'gauge', 'resistor', 'ignition-coil', 'sender'].includes(p.kind));
			const fed = loads.filter((p) => tracer.feed(p.id).reached);
			if (fed.length < 2) continue;
			const r = prng(seed);
			const pick = [r.pick(fed), r.pick(fed), r.pick(fed)].map((p) => p.id);
			const lists = pick.map((id) => tracer.mustPass(id).map(pointKey));
			const common = lists[0].filter((k) => lists.every((l) => l.includes(k)));
			const result = tracer.shared(pick);
			const chain = result.chain.map(pointKey);
			if (new Set(pick).size === 1) continue;
			expect(chain, `seed ${seed}`).toEqual(common);
			expect(result.nearest && pointKey(result.nearest)).toBe(common[common.length - 1]);
			expect(result.shared).toBe(common.length > 1);
			if (result.shared) shared++;
		}
		expect(shared).toBeGreaterThan(50);
	}, 60_000);
});

/** A small hand-drawn harness: two lamps on a fuse, one lamp fed by two parallel fuses. */
function small(earth: 'negative' | 'positive') {
	const live = earth === 'negative' ? '+' : '-';
	const earthed = earth === 'negative' ? '-' : '+';
	return assertDocument({
		schemaVersion: 1,
		vehicle: { systemVoltage: 12, earth },
		parts: [
			{ id: 'bat', key: '1', kind: 'battery' },
			{ id: 'e1', key: '2', kind: 'earth-point' },
			{ id: 'e2', key: '3', kind: 'earth-point' },
			{ id: 'fa', key: '4', kind: 'fuse' },
			{ id: 'fb', key: '5', kind: 'fuse' },
			{ id: 'fc', key: '6', kind: 'fuse' },
			{ id: 'sp', key: '7', kind: 'splice', terminals: ['1', '2', '3'] },
			{ id: 'l1', key: '8', kind: 'lamp' },
			{ id: 'l2', key: '9', kind: 'lamp' },
			{ id: 'l3', key: '10', kind: 'lamp' },
			{ id: 'l4', key: '11', kind: 'lamp' }
		],
		wires: [
			{ id: 'strap', from: { part: 'bat', terminal: earthed }, to: { part: 'e1', terminal: 'stud' }, code: 'B' },
			{ id: 'main', from: { part: 'bat', terminal: live }, to: { part: 'sp', terminal: '1' }, code: 'N' },
			{ id: 'wa', from: { part: 'sp', terminal: '2' }, to: { part: 'fa', terminal: 'in' }, code: 'N' },
			{ id: 'wa1', from: { part: 'fa', terminal: 'out' }, to: { part: 'l1', terminal: 'feed' }, code: 'R' },
			{ id: 'wa2', from: { part: 'fa', terminal: 'out' }, to: { part: 'l2', terminal: 'feed' }, code: 'R' },
			{ id: 'wb', from: { part: 'sp', terminal: '3' }, to: { part: 'fb', terminal: 'in' }, code: 'N' },
			{ id: 'wc', from: { part: 'sp', terminal: '3' }, to: { part: 'fc', terminal: 'in' }, code: 'N' },
			{ id: 'wb1', from: { part: 'fb', terminal: 'out' }, to: { part: 'l3', terminal: 'feed' }, code: 'G' },
			{ id: 'wc1', from: { part: 'fc', terminal: 'out' }, to: { part: 'l3', terminal: 'feed' }, code: 'G' },
			{ id: 'el1', from: { part: 'l1', terminal: 'earth' }, to: { part: 'e2', terminal: 'stud' }, code: 'B' },
			{ id: 'el2', from: { part: 'l2', terminal: 'earth' }, to: { part: 'e2', terminal: 'stud' }, code: 'B' },
			{ id: 'el3', from: { part: 'l3', terminal: 'earth' }, to: { part: 'e1', terminal: 'stud' }, code: 'B' },
			{ id: 'direct', from: { part: 'bat', terminal: live }, to: { part: 'l4', terminal: 'feed' }, code: 'P' },
			{ id: 'el4', from: { part: 'l4', terminal: 'earth' }, to: { part: 'e2', terminal: 'stud' }, code: 'B' }
		]
	});
}

describe('tracing a hand-drawn harness', () => {
	const doc = small('positive');
	const s = defaultScenario(doc);
	it('lists both parallel feeds and leaves their fuses off the must-pass list', () => {
		const t = traceFeed(doc, s, 'l3');
		expect(t.paths).toHaveLength(2);
		const must = t.mustPass.map(pointKey);
		expect(must).toEqual(['node:bat:-', 'wire:main', 'node:sp', 'node:l3:feed']);
		expect(must).not.toContain('part:fb');
		expect(must).not.toContain('part:fc');
	});
	it('finds the shared fuse of two lamps and the shared earth point', () => {
		const up = sharedUpstream(doc, s, ['l1', 'l2']);
		expect(up.shared).toBe(true);
		expect(up.nearest && pointKey(up.nearest)).toBe('node:fa:out');
		expect(up.chain.map(pointKey)).toEqual(['node:bat:-', 'wire:main', 'node:sp', 'wire:wa', 'node:fa:in', 'part:fa', 'node:fa:out']);
		expect(up.message).toBe('shared feed: 7 points from the battery to the nearest common point');
		const down = sharedEarth(doc, s, ['l1', 'l2']);
		expect(down.nearest && pointKey(down.nearest)).toBe('node:e2:stud');
		expect(down.chain.map(pointKey)).toEqual(['node:bat:+', 'wire:strap', 'node:e1:stud', 'part:e1', 'node:chassis', 'part:e2', 'node:e2:stud']);
		const earth3 = traceEarth(doc, s, 'l3');
		expect(earth3.mustPass.map(pointKey)).toEqual(['node:bat:+', 'wire:strap', 'node:e1:stud', 'wire:el3', 'node:l3:earth']);
	});
	it('says clearly when parts share nothing but the battery', () => {
		const none = sharedUpstream(doc, s, ['l1', 'l4']);
		expect(none.shared).toBe(false);
		expect(none.chain.map(pointKey)).toEqual(['node:bat:-']);
		expect(none.message).toMatch(/share no feed point but the battery terminal/);
		const up = sharedUpstream(doc, { ...s, disconnected: ['main'] }, ['l1', 'l3', 'l4']);
		expect(up.unreached).toEqual(['l1', 'l3']);
		expect(up.message).toMatch(/no feed path at all to 8, 10/);
		const down = sharedEarth(doc, s, ['l1', 'l3']);
		expect(down.shared).toBe(true); // both earth through the strap
		expect(down.nearest && pointKey(down.nearest)).toBe('node:e1:stud');
	});
	it('a blown fuse or a cut wire ends the feed', () => {
		const cut = traceFeed(doc, { ...s, disconnected: ['wa'] }, 'l1');
		expect(cut.reached).toBe(false);
		expect(cut.reason).toMatch(/no feed path reaches "8"/);
		const one = traceFeed(doc, { ...s, disconnected: ['wb'] }, 'l3');
		expect(one.mustPass.map(pointKey)).toContain('part:fc');
	});
	it('positive and negative earth give the same must-pass points', () => {
		const neg = small('negative');
		const swap = (k: string) => k.replace(/^node:bat:[+-]$/, 'node:bat:live');
		for (const part of ['l1', 'l2', 'l3', 'l4']) {
			for (const side of ['feed', 'earth'] as const) {
				const a = prepareTrace(doc, s).mustPass(part, side).map(pointKey).map(swap);
				const b = prepareTrace(neg, defaultScenario(neg)).mustPass(part, side).map(pointKey).map(swap);
				expect(a).toEqual(b);
			}
		}
	});
});

describe('positive and negative earth, generated harnesses', () => {
	it('same structure, same must-pass points', () => {
		for (let seed = 1; seed <= 30; seed++) {
			const a = generateHarness(seed, { earth: 'negative', parts: 30 });
			const b = generateHarness(seed, { earth: 'positive', parts: 30 });
			const ta = prepareTrace(a.doc, a.scenario);
			const tb = prepareTrace(b.doc, b.scenario);
			const live = (k: string) => k.replace(/^(node:ba\d+):[+-]$/, '$1:battery');
			for (const p of a.doc.parts) {
				expect(ta.mustPass(p.id).map(pointKey).map(live)).toEqual(tb.mustPass(p.id).map(pointKey).map(live));
				expect(ta.mustPass(p.id, 'earth').map(pointKey).map(live)).toEqual(tb.mustPass(p.id, 'earth').map(pointKey).map(live));
			}
		}
	});
});
