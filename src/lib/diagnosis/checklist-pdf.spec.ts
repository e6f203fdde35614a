// The checklist PDF from the demo hunts, read back with pdf-lib's own parser (testing/pdf-text.ts).
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { ENTRY_DMM } from '$lib/circuit/meter';
import { defaultScenario } from '$lib/circuit/scenario';
import type { PartMark } from '$lib/circuit/symptoms';
import { checklistModel, type ChecklistModel } from './checklist';
import { checklistPdf, PAPER, winAnsi } from './checklist-pdf';
import { planDiagnosis } from './session';
import { pdfText, stepHeadings, type PdfText } from './testing/pdf-text';

const doc = demoHarness();

function model(marks: PartMark[]): ChecklistModel {
	const { result } = planDiagnosis(doc, { scenario: defaultScenario(doc), marks, meter: 'entry-dmm' }, []);
	return checklistModel({
		vehicle: { name: 'The Ostrimmel', make: 'Ombrith & Vessick', model: 'Ostrimmel Tourer', year: '1962' },
		diagram: { title: 'Complete harness' },
		diagnosis: { id: '6f1c2a9e-0000-4000-8000-000000000002', title: 'Fuel gauge dead', diagramRevision: 1, marks, status: 'open', createdAt: '2026-11-28T09:30:00.000Z', foundLabel: '', conclusion: '' },
		document: doc,
		result,
		meter: ENTRY_DMM,
		readings: [],
		printedAt: new Date('2026-12-02T14:00:00Z')
	});
}

let gauges: ChecklistModel;
let dead: ChecklistModel;
let gaugesPdf: Uint8Array;
let gaugesText: PdfText;
let deadText: PdfText;

beforeAll(async () => {
	gauges = model([
		{ part: 'fuel-gauge', mark: 'reads-low' },
		{ part: 'temp-gauge', mark: 'reads-low' }
	]);
	dead = model([{ part: 'fuel-gauge', mark: 'dead' }]);
	gaugesPdf = await checklistPdf(gauges);
	gaugesText = await pdfText(gaugesPdf);
	deadText = await pdfText(await checklistPdf(dead, { paper: 'letter' }));
});

describe('checklistPdf', () => {
	it('is a PDF (ISO 32000-1 §7.5.2: the file starts with %PDF-) titled as the checklist', () => {
		expect(new TextDecoder().decode(gaugesPdf.slice(0, 5))).toBe('%PDF-');
		expect(gaugesText.title).toBe(winAnsi(gauges.title));
	});

	it('heads each step once, 1…n, as many as the model has', () => {
		expect(stepHeadings(gaugesText)).toEqual(gauges.steps.map((s) => s.number));
		expect(stepHeadings(deadText)).toEqual(dead.steps.map((s) => s.number));
	});

	it('prints the cautions block with every caution of the model, before the first step', () => {
		const runs = gaugesText.runs.flat();
		const block = runs.indexOf('CAUTIONS: read before you start');
		expect(block).toBeGreaterThan(-1);
		expect(block).toBeLessThan(runs.indexOf('Step 1'));
		const all = runs.join(' ');
		for (const c of gauges.cautions) {
			expect(runs).toContain(winAnsi(c.title));
			// Wrapped over lines, the words are all there in order.
			expect(all.replace(/\s+/g, ' ')).toContain(winAnsi(c.text).split(' ').slice(0, 6).join(' '));
		}
	});

	it('prints each step\u2019s expected readings and outcome lines', () => {
		const all = gaugesText.runs.flat().join('\n');
		for (const s of gauges.steps) {
			for (const e of s.expected) expect(all).toContain(winAnsi(e.reading));
			for (const o of s.outcomes) expect(all.replace(/\n/g, ' ')).toContain(winAnsi(o.text).slice(0, 30));
		}
	});

	it('prints the battery step first, with when to charge it, and every group\u2019s one job', () => {
		const words = gaugesText.runs.flat().join(' ').replace(/\s+/g, ' ');
		const first = gauges.steps[0];
		expect(first.advice).toMatch(/^Read the battery first/);
		expect(words).toContain(`Battery first ${winAnsi(first.advice!)}`);
		// Wrapped over lines, a group's job is there whole, after the heading of the groups.
		expect(gauges.groups.length).toBeGreaterThan(0);
		expect(words).toContain('Cannot be told apart with a meter: one job for each group');
		for (const g of gauges.groups) expect(words).toContain(winAnsi(g.action));
		// A range that ends on a group prints its job in "Where next".
		const ending = gauges.steps.flatMap((s) => s.outcomes).find((o) => o.action)!;
		expect(words).toContain(winAnsi(ending.text));
	});

	it('numbers every page "Page i of n"', () => {
		for (const [i, runs] of [...gaugesText.runs.entries()]) expect(runs).toContain(`Page ${i + 1} of ${gaugesText.pages}`);
		expect(gaugesText.pages).toBeGreaterThan(1);
	});

	it('makes Letter pages when asked (8.5 × 11 in = 612 × 792 pt), A4 otherwise (210 × 297 mm)', async () => {
		const letter = await PDFDocument.load(await checklistPdf(dead, { paper: 'letter' }));
		expect(letter.getPage(0).getSize()).toEqual({ width: 612, height: 792 });
		const a4 = await PDFDocument.load(gaugesPdf);
		const { width, height } = a4.getPage(0).getSize();
		expect(width / 72 * 25.4).toBeCloseTo(210, 0);
		expect(height / 72 * 25.4).toBeCloseTo(297, 0);
		expect(PAPER.letter).toEqual([612, 792]);
	});

	it('records when it was printed as the PDF’s creation date (ISO 32000-1 §14.3.3)', async () => {
		const doc = await PDFDocument.load(gaugesPdf, { updateMetadata: false });
		expect(doc.getCreationDate()?.toISOString()).toBe('2026-12-02T14:00:00.000Z');
	});

	it('spells ohms out: the standard fonts cannot encode Ω', () => {
		const all = deadText.runs.flat().join(' ');
		expect(dead.steps.some((s) => s.setting.includes('\u03a9'))).toBe(true);
		expect(all).toMatch(/200 ohm range/);
		// Nothing fell through to the "?" of an unknown character.
		expect(all).not.toMatch(/\?/);
	});
});

describe('winAnsi', () => {
	let font: Awaited<ReturnType<PDFDocument['embedFont']>>;
	beforeAll(async () => {
		font = await (await PDFDocument.create()).embedFont(StandardFonts.Helvetica);
	});

	it('keeps exactly the characters Helvetica can encode in pdf-lib (its WinAnsi table), from U+0020 to U+FFFF', () => {
		const charset = new Set(font.getCharacterSet());
		const kept: number[] = [];
		for (let cp = 0x20; cp <= 0xffff; cp++) {
			if (cp >= 0xd800 && cp <= 0xdfff) continue;
			const ch = String.fromCodePoint(cp);
			if (winAnsi(ch) === ch) kept.push(cp);
		}
		// Helvetica's charset may name a few glyphs WinAnsi cannot address; every kept one it has.
		for (const cp of kept) expect(charset.has(cp), cp.toString(16)).toBe(true);
		expect(kept.length).toBe(95 + 96 + 27);
	});

	it.each([
		['Ohms, 200 \u03a9 range', 'Ohms, 200 ohm range'],
		['\u22129.62\u2013\u22129.41 V', '-9.62\u2013-9.41 V'],
		['reading \u2264 0.5 V \u2192 step 4', 'reading <= 0.5 V -> step 4'],
		['battery\u2019s \u00b10.02 V', 'battery\u2019s \u00b10.02 V'],
		['1.5 mm\u00b2 \u2014 \u00bd turn', '1.5 mm\u00b2 \u2014 \u00bd turn'],
		['\u0150rs \u4e00', 'Ors ?']
	])('%s → %s, which Helvetica encodes', (text, safe) => {
		expect(winAnsi(text)).toBe(safe);
		expect(() => font.encodeText(winAnsi(text))).not.toThrow();
	});

	it('is needed: Helvetica refuses Ω and the minus sign as they are', () => {
		expect(() => font.encodeText('\u03a9')).toThrow();
		expect(() => font.encodeText('\u2212')).toThrow();
	});
});
