// What a diagnosis cannot know: the wire-length worlds hold measured wires at their drawn length,
// and an uncertainty is checked against its document. Ranges: TRADE.md, "Tolerances for the
// uncertainty model" (wire lengths ±50 % unless measured: our default).
import { describe, expect, it } from 'vitest';
import { demoHarness } from './demo';
import { defaultScenario } from './scenario';
import type { HarnessDocument } from './schema';
import { checkUncertainty, factorWorlds, measuredWires, uncertaintyOf } from './uncertainty';

const markMeasured = (doc: HarnessDocument, ids: string[]): HarnessDocument => ({ ...doc, wires: doc.wires.map((w) => (ids.includes(w.id) ? { ...w, lengthMeasured: true } : w)) });

describe('factorWorlds and measured wires', () => {
	const drawn = demoHarness();
	const scenario = defaultScenario(drawn);
	const lengthOf = (doc: HarnessDocument, id: string) => doc.wires.find((w) => w.id === id)!.lengthM;

	const cases: { name: string; doc: HarnessDocument; u: Parameters<typeof uncertaintyOf>[0] }[] = [
		{ name: 'marked measured on the drawing', doc: markMeasured(drawn, ['w-ign-fuse']), u: {} },
		{ name: 'named measured for the diagnosis', doc: drawn, u: { measuredWires: ['w-ign-fuse'] } }
	];
	for (const c of cases) {
		it(`leaves a wire ${c.name} at its drawn length; the others move ±50 %`, () => {
			const worlds = factorWorlds(c.doc, scenario, uncertaintyOf(c.u)).filter((w) => w.id.startsWith('wires:'));
			expect(worlds.map((w) => w.id)).toEqual(['wires:low', 'wires:high']);
			for (const w of worlds) {
				// w-ign-fuse is drawn 1.6 m in the demo harness.
				expect(lengthOf(w.doc, 'w-ign-fuse')).toBe(1.6);
				// w-battery-feed, drawn 0.6 m, is not measured: 0.3 m and 0.9 m.
				expect(lengthOf(w.doc, 'w-battery-feed')).toBeCloseTo(w.id === 'wires:low' ? 0.3 : 0.9, 12);
			}
		});
	}

	it('makes no wire-length world when every wire is measured', () => {
		const doc = markMeasured(drawn, drawn.wires.map((w) => w.id));
		const ids = factorWorlds(doc, scenario, uncertaintyOf()).map((w) => w.id);
		expect(ids.some((id) => id.startsWith('wires:'))).toBe(false);
		// The other groups are still there.
		expect(ids).toContain('loads:low');
	});

	it('counts a wire once when it is both marked and named', () => {
		const doc = markMeasured(drawn, ['w-ign-fuse', 'w-battery-feed']);
		expect([...measuredWires(doc, uncertaintyOf({ measuredWires: ['w-ign-fuse'] }))].sort()).toEqual(['w-battery-feed', 'w-ign-fuse']);
	});
});

describe('checkUncertainty', () => {
	const doc = demoHarness();
	it('accepts the defaults and a battery range a 12 V battery can show', () => {
		expect(checkUncertainty(doc, uncertaintyOf())).toEqual([]);
		expect(checkUncertainty(doc, uncertaintyOf({ battery: { low: 12.1, high: 12.3 }, knownSenders: ['fuel-sender'], measuredWires: ['w-ign-fuse'] }))).toEqual([]);
	});
	it('names every problem by its path', () => {
		const issues = checkUncertainty(doc, uncertaintyOf({ battery: { low: 0, high: 30 }, knownSenders: ['fuel-sender', 'fuel-gauge'], measuredWires: ['w-nowhere'], stabilizer: { low: 9.5, high: 13 } }));
		expect(issues.map((i) => i.path)).toEqual(['battery.low', 'battery.high', 'stabilizer.high', 'knownSenders[1]', 'measuredWires[0]']);
		expect(issues.find((i) => i.path === 'knownSenders[1]')?.message).toMatch(/"fuel-gauge" is not a sender/);
	});
});
