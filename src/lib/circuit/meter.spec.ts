// The one meter model: what it shows, its setups, and that the incremental predictor (probes,
// diagnosis, the API) and the direct solve (the trace panel) read the same meter the same way.
import { describe, expect, it } from 'vitest';
import { buildCircuit } from './circuit';
import { demoHarness } from './demo';
import { ANALOGUE_METER, ENTRY_DMM, meterFor, PROBE_KINDS, setupScenario, shownReading, tableReading, unitOf } from './meter';
import { measureOhms, measureVolts, testLamp } from './meters';
import { Base, predictReadings } from './predict';
import { defaultScenario } from './scenario';

const doc = demoHarness();
const scenario = defaultScenario(doc);

describe('meter model', () => {
	it('shows volts as they are, lamp brightness in %, ohms capped and "OL" at the top of the range', () => {
		expect(tableReading('volts', -12.31, ENTRY_DMM)).toBe(-12.31);
		expect(tableReading('lamp', 0.42, ENTRY_DMM)).toBeCloseTo(42, 9);
		expect(tableReading('ohms', Infinity, ENTRY_DMM)).toBe(ENTRY_DMM.ohms.overLimit);
		expect(shownReading('ohms', Infinity, ENTRY_DMM)).toBe('OL');
		expect(shownReading('ohms', 5e6, ANALOGUE_METER)).toBe('OL'); // over an analogue meter's 1 MΩ range
		expect(shownReading('ohms', 5e6, ENTRY_DMM)).toBe(5e6);
		expect(PROBE_KINDS.map(unitOf)).toEqual(['V', 'V', 'Ω', '%']);
	});

	it('a 5 W test lamp on a 12 V system is a 28.8 Ω load (P = V²/R, Ohm’s law)', () => {
		const m = meterFor('lamp', { part: 'fuse-box', terminal: 'in' }, 'earth', ENTRY_DMM, 12);
		expect(m.kind === 'lamp' && m.ohms).toBeCloseTo(28.8, 9);
	});

	it('the battery-off setup disconnects every battery and stops the engine; a part out disconnects that part', () => {
		const off = setupScenario(doc, { ...scenario, engineRunning: true }, 'power-off');
		const batteries = doc.parts.filter((p) => p.kind === 'battery').map((p) => p.id);
		expect(batteries.length).toBeGreaterThan(0);
		for (const b of batteries) expect(off.disconnected).toContain(b);
		expect(off.engineRunning).toBe(false);
		expect(setupScenario(doc, scenario, 'part-out:x').disconnected).toContain('x');
		expect(setupScenario(doc, scenario, 'as-given')).toBe(scenario);
	});

	it('the predictor with meterFor reads what a direct solve reads, for volts, lamp and ohms (demo harness)', () => {
		const gauge = doc.parts.find((p) => p.kind === 'gauge')!;
		const at = { part: gauge.id, terminal: gauge.terminals[0] };
		const v = doc.vehicle.systemVoltage;
		const powered = predictReadings(new Base(buildCircuit(doc, scenario)), [{ changes: [] }], [meterFor('volts', at, 'earth', ENTRY_DMM, v), meterFor('lamp', at, 'earth', ENTRY_DMM, v)]);
		expect(powered[0][0]).toBeCloseTo(measureVolts(doc, scenario, at).volts, 6);
		expect(powered[1][0]).toBeCloseTo(testLamp(doc, scenario, at).brightness, 6);
		const off = predictReadings(new Base(buildCircuit(doc, setupScenario(doc, scenario, 'power-off'))), [{ changes: [] }], [meterFor('ohms', at, 'chassis', ENTRY_DMM, v)]);
		const direct = measureOhms(doc, scenario, at, 'chassis');
		expect(tableReading('ohms', off[0][0], ENTRY_DMM)).toBeCloseTo(direct.overLimit ? ENTRY_DMM.ohms.overLimit : direct.ohms, 3);
	});
});
