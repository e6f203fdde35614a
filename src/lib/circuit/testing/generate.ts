/**
 * Seeded generators of harness documents and scenarios, for tests and the benchmark.
 * Every generated document is invented and valid; the same seed gives the same document.
 */
import type { DisconnectSchema, Scenario } from '../scenario';
import { assertDocument, type DocumentInput, type HarnessDocument } from '../schema';
import type { z } from 'zod';

/** Mulberry32: a small, fast 32-bit seeded generator (public-domain algorithm by T. Ettinger). */
export function prng(seed: number) {
	let a = seed >>> 0;
	const next = () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
	return {
		next,
		int: (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1)),
		pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)],
		chance: (p: number) => next() < p,
		range: (lo: number, hi: number) => lo + next() * (hi - lo)
	};
}
export type Prng = ReturnType<typeof prng>;

export interface GenerateOptions {
	/** About how many parts (the result may exceed it by a few). */
	parts?: number;
	earth?: 'negative' | 'positive';
	systemVoltage?: 6 | 12 | 24;
	/** Chance per added part of an extra wire between two feed points (parallel paths). */
	crossLinks?: number;
	/** Chance per added part of a floating (unconnected) part or group. */
	floating?: number;
}

type Ref = { part: string; terminal: string };
type RawPart = Record<string, unknown> & { id: string; kind: string };

const CODES = ['B', 'U', 'N', 'G', 'LG', 'R', 'W', 'Y', 'P', 'S', 'K', 'O', 'G/B', 'W/R', 'N/Y', 'U/W', 'R/G', 'LG/N'];

/** A random but plausible harness: feeds branching from the battery, loads earthing to earth points. */
export function generateHarness(seed: number, options: GenerateOptions = {}): { doc: HarnessDocument; scenario: Scenario } {
	const r = prng(seed);
	const target = options.parts ?? r.int(8, 30);
	const earth = options.earth ?? (r.chance(0.5) ? 'negative' : 'positive');
	const systemVoltage = options.systemVoltage ?? 12;
	const crossLinks = options.crossLinks ?? 0.12;
	const floating = options.floating ?? 0.05;
	const live = earth === 'negative' ? '+' : '-';
	const earthed = earth === 'negative' ? '-' : '+';
	const parts: RawPart[] = [];
	const wires: Record<string, unknown>[] = [];
	const switches: Record<string, string> = {};
	const senders: Record<string, number> = {};
	let n = 0;
	const id = (prefix: string) => `${prefix}${++n}`;
	const addPart = (kind: string, extra: Record<string, unknown> = {}) => {
		const p: RawPart = { id: id(kind.slice(0, 2)), key: String(n), kind, position: { x: n * 40, y: r.int(0, 800) }, ...extra };
		parts.push(p);
		return p.id;
	};
	const wire = (from: Ref, to: Ref) => {
		if (from.part === to.part && from.terminal === to.terminal) return;
		const size = r.chance(0.2) ? { awg: r.pick([14, 16, 18, 20]) } : { mm2: r.pick([0.5, 0.75, 1, 1.5, 2.5]) };
		wires.push({ id: id('w'), from, to, code: r.pick(CODES), size, lengthM: Math.round(r.range(0.1, 4) * 100) / 100 });
	};

	const bat = addPart('battery', { params: { internalResistance: r.range(0.005, 0.05) } });
	const strap = addPart('earth-point', { params: { resistance: r.range(0.001, 0.02) } });
	wire({ part: bat, terminal: earthed }, { part: strap, terminal: 'stud' });
	const earthPoints = [strap];
	const feeds: Ref[] = [{ part: bat, terminal: live }];
	const earthRef = (): Ref => {
		if (r.chance(0.2) || earthPoints.length < 2) {
			const e = addPart('earth-point', { params: { resistance: r.range(0.001, 0.5) } });
			earthPoints.push(e);
			if (r.chance(0.1)) wire({ part: e, terminal: 'stud' }, { part: r.pick(earthPoints), terminal: 'stud' });
			return { part: e, terminal: 'stud' };
		}
		return { part: r.pick(earthPoints), terminal: 'stud' };
	};
	const feed = () => feeds[Math.floor(Math.pow(r.next(), 0.7) * feeds.length)];
	const twoTerminalLoad = () => {
		const k = r.pick(['lamp', 'lamp', 'load', 'resistor', 'motor', 'gauge', 'sender', 'ignition-coil']);
		const extra: Record<string, unknown> = {};
		if (k === 'lamp') extra.params = { watts: r.pick([2.2, 5, 6, 21, 36, 45]) };
		if (k === 'load') extra.terminals = ['a', 'b'];
		if (k === 'load') extra.params = { resistance: r.range(1, 500) };
		if (k === 'resistor') extra.params = { resistance: r.range(0.5, 200) };
		if (k === 'sender') extra.params = { ohmsAt0: r.range(100, 250), ohmsAt1: r.range(5, 40), taper: r.pick(['linear', 'logarithmic']) };
		const p = addPart(k, extra);
		const [a, b] = k === 'load' ? ['a', 'b'] : k === 'resistor' ? ['1', '2'] : k === 'ignition-coil' ? ['15', '1'] : k === 'gauge' ? ['feed', 'sender'] : ['feed', 'earth'];
		if (k === 'sender') senders[p] = Math.round(r.next() * 100) / 100;
		return { p, a, b };
	};

	while (parts.length < target) {
		const roll = r.next();
		if (r.chance(floating)) {
			// A floating part, or a little floating group of two.
			const x = twoTerminalLoad();
			if (r.chance(0.5)) {
				const y = twoTerminalLoad();
				wire({ part: x.p, terminal: x.b }, { part: y.p, terminal: y.a });
			}
			continue;
		}
		if (r.chance(crossLinks) && feeds.length > 2) {
			const a = feed();
			const b = r.pick(feeds);
			if (a.part !== b.part || a.terminal !== b.terminal) wire(a, b);
		}
		if (roll < 0.12) {
			const f = addPart('fuse', { params: { resistance: r.range(0.002, 0.02), blown: r.chance(0.05) } });
			wire(feed(), { part: f, terminal: 'in' });
			feeds.push({ part: f, terminal: 'out' });
		} else if (roll < 0.24) {
			const terms = r.chance(0.5) ? ['1', '2'] : ['1', '2', '3'];
			const positions = [
				{ name: 'off', closed: [] as string[][] },
				{ name: 'on', closed: [['1', '2']] }
			];
			if (terms.length === 3) positions.push({ name: 'both', closed: [['1', '2'], ['1', '3']] });
			const s = addPart('switch', { terminals: terms, params: { positions, contactResistance: r.range(0.005, 0.05) } });
			switches[s] = r.pick(positions.map((p) => p.name).concat(['on', 'on']).filter((x) => positions.some((p) => p.name === x)));
			wire(feed(), { part: s, terminal: '1' });
			for (const t of terms.slice(1)) feeds.push({ part: s, terminal: t });
		} else if (roll < 0.3) {
			const c = addPart('connector', { terminals: ['A1', 'B1', 'A2', 'B2'], params: { pins: [['A1', 'B1'], ['A2', 'B2']] } });
			wire(feed(), { part: c, terminal: 'A1' });
			feeds.push({ part: c, terminal: 'B1' });
			if (r.chance(0.5)) {
				wire(feed(), { part: c, terminal: 'A2' });
				feeds.push({ part: c, terminal: 'B2' });
			}
		} else if (roll < 0.36) {
			const sp = addPart('splice', { terminals: ['1', '2', '3'] });
			wire(feed(), { part: sp, terminal: '1' });
			feeds.push({ part: sp, terminal: '2' }, { part: sp, terminal: '3' });
		} else if (roll < 0.41) {
			const rl = addPart('relay', { params: { coilResistance: r.range(60, 120) } });
			wire(feed(), { part: rl, terminal: '86' });
			wire({ part: rl, terminal: '85' }, earthRef());
			wire(feed(), { part: rl, terminal: '30' });
			feeds.push({ part: rl, terminal: '87' }, { part: rl, terminal: '87a' });
		} else if (roll < 0.44) {
			const st = addPart('stabilizer');
			wire(feed(), { part: st, terminal: 'in' });
			wire({ part: st, terminal: 'earth' }, earthRef());
			feeds.push({ part: st, terminal: 'out' });
		} else {
			const x = twoTerminalLoad();
			wire(feed(), { part: x.p, terminal: x.a });
			if (r.chance(0.15)) {
				// A series chain: this load feeds another (a gauge and its sender, say).
				const y = twoTerminalLoad();
				wire({ part: x.p, terminal: x.b }, { part: y.p, terminal: y.a });
				wire({ part: y.p, terminal: y.b }, earthRef());
			} else wire({ part: x.p, terminal: x.b }, earthRef());
		}
	}
	const disconnected: z.input<typeof DisconnectSchema>[] = [];
	const input: DocumentInput = {
		schemaVersion: 1,
		vehicle: { systemVoltage, earth },
		palette: 'trade-letters',
		parts: parts as unknown as DocumentInput['parts'],
		wires: wires as unknown as DocumentInput['wires']
	};
	const doc = assertDocument(input);
	for (const w of doc.wires) if (r.chance(0.03)) disconnected.push(w.id);
	return { doc, scenario: { switches, senders, disconnected, engineRunning: false } };
}
