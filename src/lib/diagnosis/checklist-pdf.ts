/**
 * The probe checklist as a PDF, drawn with pdf-lib from the same model as the print page
 * (checklist.ts): header, the cautions block, meter settings, then each step kept whole on one
 * page where it fits, with wrapped text, the wire colour as a drawn stripe (base colour with the
 * tracer along its middle, cased in ink so white and yellow show on paper), an empty box for the
 * reading, and "Page n of m" on every page.
 *
 * Fonts: the PDF standard Helvetica faces, which every reader has (PDF 1.7 §9.6.2.2) and which
 * keeps the file small; they only encode WinAnsi (PDF 1.7 Annex D.2). Text outside WinAnsi is
 * transliterated by `winAnsi` (Ω → "ohm", − → "-", ≤ → "<=", → → "->" …) rather than embedding a
 * font: the IBM Plex files the app ships are woff/woff2, which pdf-lib cannot embed without
 * fontkit, and a restorer reads "200 ohm range" as well as "200 Ω range".
 */
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage, type RGB } from 'pdf-lib';
import type { ChecklistModel, PrintStep, WireColour } from './checklist';
import { noun } from '../words';

export type Paper = 'a4' | 'letter';
/** Page sizes in PDF points (1/72 in): A4 210 × 297 mm (ISO 216), Letter 8.5 × 11 in (ANSI/ASME Y14.1). */
export const PAPER: Record<Paper, [number, number]> = {
	a4: [595.28, 841.89],
	letter: [612, 792]
};

/**
 * The Windows-1252 characters above ASCII that WinAnsiEncoding has (0x80–0x9F per the WHATWG
 * Encoding Standard's index, and all of 0xA0–0xFF).
 */
const CP1252_HIGH = '\u20ac\u201a\u0192\u201e\u2026\u2020\u2021\u02c6\u2030\u0160\u2039\u0152\u017d\u2018\u2019\u201c\u201d\u2022\u2013\u2014\u02dc\u2122\u0161\u203a\u0153\u017e\u0178';
const WIN_ANSI = new Set<number>([...Array.from({ length: 0x7f - 0x20 }, (_, i) => 0x20 + i), ...Array.from({ length: 0x100 - 0xa0 }, (_, i) => 0xa0 + i), ...[...CP1252_HIGH].map((c) => c.codePointAt(0)!)]);

/** Our own spellings of the signs the checklist uses that WinAnsi lacks. */
const SPELLED: Record<string, string> = {
	'\u03a9': 'ohm', // Ω
	'\u2126': 'ohm', // Ohm sign
	'\u2212': '-', // minus sign
	'\u2264': '<=',
	'\u2265': '>=',
	'\u2192': '->',
	'\u2190': '<-',
	'\u2248': '~',
	'\u26a0': '!',
	'\u2009': ' ', // thin space
	'\u202f': ' ', // narrow no-break space
	'\u2011': '-', // non-breaking hyphen
	'\u2010': '-',
	'\u2032': "'",
	'\u2033': '"',
	'\t': ' '
};

/** Text the standard fonts can encode: WinAnsi kept, known signs spelled out, accents dropped where needed, anything else "?". */
export function winAnsi(text: string): string {
	let out = '';
	for (const ch of text) {
		const cp = ch.codePointAt(0)!;
		if (WIN_ANSI.has(cp)) out += ch;
		else if (ch in SPELLED) out += SPELLED[ch];
		else if (ch === '\n' || ch === '\r') out += ' ';
		else {
			const bare = ch.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
			out += bare && [...bare].every((c) => WIN_ANSI.has(c.codePointAt(0)!)) ? bare : '?';
		}
	}
	return out;
}

/** Words into lines no wider than `width` at `size`; a word longer than a line is cut. */
export function wrap(text: string, font: PDFFont, size: number, width: number): string[] {
	const lines: string[] = [];
	for (const para of winAnsi(text).split(/\s*\u2028\s*/)) {
		let line = '';
		for (const word of para.split(/\s+/).filter(Boolean)) {
			const next = line ? `${line} ${word}` : word;
			if (font.widthOfTextAtSize(next, size) <= width) {
				line = next;
				continue;
			}
			if (line) lines.push(line);
			let rest = word;
			while (font.widthOfTextAtSize(rest, size) > width) {
				let cut = rest.length - 1;
				while (cut > 1 && font.widthOfTextAtSize(rest.slice(0, cut), size) > width) cut--;
				lines.push(rest.slice(0, cut));
				rest = rest.slice(cut);
			}
			line = rest;
		}
		lines.push(line);
	}
	return lines;
}

const INK = rgb(0.106, 0.122, 0.141);
const SOFT = rgb(0.24, 0.275, 0.318);
const RULE = rgb(0.6, 0.62, 0.65);
const SHADE = rgb(0.93, 0.92, 0.9);
const MARGIN = 42;
const BODY = 9.5;
const SMALL = 8;
const LEAD = 1.32;

function hex(colour: string): RGB {
	const n = parseInt(colour.slice(1), 16);
	return rgb(((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255);
}

interface Fonts {
	regular: PDFFont;
	bold: PDFFont;
}

/** A cursor down the pages; every drawing call can be measured first (dry) and drawn after. */
class Sheet {
	page!: PDFPage;
	y = 0;
	readonly pages: PDFPage[] = [];
	constructor(
		readonly pdf: PDFDocument,
		readonly fonts: Fonts,
		readonly size: [number, number]
	) {
		this.newPage();
	}
	get width() {
		return this.size[0] - 2 * MARGIN;
	}
	get bottom() {
		return MARGIN + 18;
	}
	newPage() {
		this.page = this.pdf.addPage(this.size);
		this.pages.push(this.page);
		this.y = this.size[1] - MARGIN;
	}
	/** Room for `height` points on this page, or a new page. */
	ensure(height: number) {
		if (this.y - height < this.bottom && this.y < this.size[1] - MARGIN) this.newPage();
	}
	/** Wrapped text at x (from the left margin); returns its height. */
	text(text: string, opts: { x?: number; width?: number; size?: number; bold?: boolean; colour?: RGB; dry?: boolean } = {}): number {
		const size = opts.size ?? BODY;
		const font = opts.bold ? this.fonts.bold : this.fonts.regular;
		const x = MARGIN + (opts.x ?? 0);
		const lines = wrap(text, font, size, opts.width ?? this.width - (opts.x ?? 0));
		const step = size * LEAD;
		if (!opts.dry) {
			for (const [i, line] of lines.entries()) {
				if (!line) continue;
				this.page.drawText(line, { x, y: this.y - size - i * step, size, font, color: opts.colour ?? INK });
			}
		}
		return lines.length * step;
	}
}

/** A wire's stripe: the base colour cased in ink, the tracer a band along its middle edged with hairlines. */
function drawSwatch(page: PDFPage, x: number, y: number, w: WireColour) {
	const width = 26;
	const height = 9;
	if (!w.base) {
		page.drawRectangle({ x, y, width, height, borderColor: INK, borderWidth: 0.75, borderDashArray: [2, 1.5] });
		return;
	}
	page.drawRectangle({ x, y, width, height, color: hex(w.base.hex), borderColor: INK, borderWidth: 0.75 });
	if (w.tracer) {
		const band = 3;
		page.drawRectangle({ x: x + 0.4, y: y + (height - band) / 2, width: width - 0.8, height: band, color: hex(w.tracer.hex) });
		for (const edge of [y + (height - band) / 2, y + (height + band) / 2]) page.drawLine({ start: { x: x + 0.4, y: edge }, end: { x: x + width - 0.4, y: edge }, thickness: 0.3, color: INK });
	}
}

const wireWords = (w: WireColour) => `${w.code} (${w.words}${w.count > 1 ? `, ${w.count} wires` : ''})`;

/** One labelled row: a bold label in a left column and wrapped text beside it. Returns its height. */
function row(sheet: Sheet, label: string, text: string, dry: boolean, x = 0): number {
	const col = 78;
	const h1 = sheet.text(label, { x, width: col - 6, bold: true, size: SMALL + 0.5, dry, colour: SOFT });
	const h2 = sheet.text(text, { x: x + col, width: sheet.width - x - col, dry });
	return Math.max(h1, h2) + 2;
}

/** Draws a step (or measures it, dry) at the cursor; returns its height. */
function step(sheet: Sheet, s: PrintStep, cautionTitles: Map<number, string>, dry: boolean): number {
	const top = sheet.y;
	const down = (h: number) => {
		sheet.y -= h;
	};
	// Heading: "Step N" alone as its own text run, then the probe's label (wrapped: the bar grows).
	const labelX = 64;
	const labelH = sheet.text(s.label, { x: labelX, width: sheet.width - labelX - 6, bold: true, dry: true });
	const headH = Math.max(20, labelH + 9);
	if (!dry) {
		sheet.page.drawRectangle({ x: MARGIN, y: sheet.y - headH, width: sheet.width, height: headH, color: SHADE, borderColor: INK, borderWidth: 0.75 });
		sheet.page.drawText(`Step ${s.number}`, { x: MARGIN + 6, y: sheet.y - 14, size: 12, font: sheet.fonts.bold, color: INK });
		sheet.y -= 4.5;
		sheet.text(s.label, { x: labelX, width: sheet.width - labelX - 6, bold: true });
		sheet.y += 4.5;
	}
	down(headH + 5);

	const boxW = 150;
	const textW = sheet.width - boxW - 12;
	const startY = sheet.y;
	// Left column: place, wires, leads, setting, conditions, cautions.
	const col = (label: string, text: string) => {
		const h1 = sheet.text(label, { width: 74, bold: true, size: SMALL + 0.5, dry, colour: SOFT });
		const h2 = sheet.text(text, { x: 78, width: textW - 78, dry });
		down(Math.max(h1, h2) + 2);
	};
	col('Red lead', s.place.text);
	if (s.wires.length) {
		for (const w of s.wires) {
			const h1 = sheet.text('Wire', { width: 74, bold: true, size: SMALL + 0.5, dry, colour: SOFT });
			if (!dry) drawSwatch(sheet.page, MARGIN + 78, sheet.y - 10, w);
			const h2 = sheet.text(wireWords(w), { x: 110, width: textW - 110, dry });
			down(Math.max(h1, h2, 12) + 2);
		}
	}
	col('Black lead', s.blackLead);
	col('Setting', s.setting);
	if (s.conditions.length) col('Conditions', s.conditions.join('; '));
	if (s.cautions.length) col('Cautions', s.cautions.map((n) => `${n} (${cautionTitles.get(n) ?? ''})`).join(', '));
	if (s.advice) col('Battery first', s.advice);
	const leftEnd = sheet.y;

	// Right column: the reading box.
	sheet.y = startY;
	const boxX = MARGIN + sheet.width - boxW;
	const boxH = 40;
	if (!dry) {
		sheet.page.drawText(winAnsi(`Your reading (${s.unit || 'value'})`), { x: boxX, y: sheet.y - SMALL, size: SMALL, font: sheet.fonts.bold, color: SOFT });
		sheet.page.drawRectangle({ x: boxX, y: sheet.y - 12 - boxH, width: boxW, height: boxH, borderColor: INK, borderWidth: 1.25 });
		if (s.taken) sheet.page.drawText(winAnsi(`Taken: ${s.taken}`), { x: boxX + 6, y: sheet.y - 12 - boxH / 2 - 4, size: 11, font: sheet.fonts.bold, color: INK });
	}
	const rightEnd = sheet.y - 12 - boxH - 4;
	sheet.y = Math.min(leftEnd, rightEnd) - 2;

	// Expected readings and where next: line by line, so a step longer than a page goes on
	// over the next with a "continued" heading instead of running off the paper.
	const flow = (draw: (d: boolean) => number) => {
		if (!dry) {
			const need = draw(true);
			if (sheet.y - need < sheet.bottom) {
				sheet.newPage();
				down(sheet.text(`Step ${s.number}, continued`, { bold: true, size: SMALL + 0.5, colour: SOFT }) + 3);
			}
		}
		down(draw(dry));
	};
	flow((d) => sheet.text('Expected range for each remaining suspect (likeliest first)', { bold: true, size: SMALL + 0.5, colour: SOFT, dry: d }) + 1);
	// A band ("-12.74 to -11.82 V") takes about 100 pt in bold at the body size.
	for (const e of s.expected) {
		flow((d) => {
			const h1 = sheet.text(e.reading, { x: 6, width: 112, bold: true, dry: d });
			const h2 = sheet.text(e.chance, { x: 122, width: 34, size: SMALL, dry: d, colour: SOFT });
			const h3 = sheet.text(e.label, { x: 158, width: sheet.width - 158, dry: d });
			return Math.max(h1, h2, h3) + 1;
		});
	}
	down(3);
	flow((d) => sheet.text('Where next', { bold: true, size: SMALL + 0.5, colour: SOFT, dry: d }) + 1);
	for (const o of s.outcomes) flow((d) => sheet.text(`\u2022 ${o.text}`, { x: 6, width: sheet.width - 6, dry: d }) + 1);
	flow((d) => sheet.text(`Otherwise: ${s.otherwise}`, { x: 6, width: sheet.width - 6, size: SMALL, colour: SOFT, dry: d }) + 2);
	if (!dry) sheet.page.drawLine({ start: { x: MARGIN, y: sheet.y }, end: { x: MARGIN + sheet.width, y: sheet.y }, thickness: 0.5, color: RULE });
	down(10);
	const height = top - sheet.y;
	if (dry) sheet.y = top;
	return height;
}

/** Draws `draw` whole on one page: measured dry first, a new page when it does not fit (unless taller than a page). */
function keepTogether(sheet: Sheet, draw: (dry: boolean) => number) {
	const top = sheet.y;
	const page = sheet.page;
	const height = draw(true);
	sheet.y = top;
	sheet.page = page;
	sheet.ensure(Math.min(height, sheet.size[1] - 2 * MARGIN - 18));
	draw(false);
}

export interface PdfOptions {
	paper?: Paper;
}

/** The checklist PDF's bytes. */
export async function checklistPdf(model: ChecklistModel, options: PdfOptions = {}): Promise<Uint8Array> {
	const pdf = await PDFDocument.create();
	const fonts = { regular: await pdf.embedFont(StandardFonts.Helvetica), bold: await pdf.embedFont(StandardFonts.HelveticaBold) };
	const size = PAPER[options.paper ?? 'a4'];
	const sheet = new Sheet(pdf, fonts, size);
	const down = (h: number) => {
		sheet.y -= h;
	};
	const h = model.header;

	// Header.
	down(sheet.text('Loomwright probe checklist', { size: SMALL, bold: true, colour: SOFT }) + 2);
	down(sheet.text(model.title.replace(/^Probe checklist: /, ''), { size: 16, bold: true }) + 4);
	down(row(sheet, 'Vehicle', h.vehicle, false));
	down(row(sheet, 'Diagram', `${h.diagramTitle}, revision ${h.revision}`, false));
	down(row(sheet, 'Dates', `started ${h.started}; printed ${h.printed}`, false));
	down(row(sheet, 'Marked', h.marks.map((m) => `${m.key}${m.label ? ` ${m.label}` : ''}: ${m.words}`).join('; '), false));
	down(row(sheet, 'Where it stands', h.standing + (h.conclusion ? ` Concluded: ${h.conclusion}` : ''), false));
	// Once read, the battery's state heads the page: a low one is charged before anything else.
	if (model.battery?.reading) down(row(sheet, model.battery.charge ? 'CHARGE FIRST' : 'Battery', model.battery.advice, false));
	down(8);

	// Cautions, boxed with a heavy rule so the block reads as a warning without colour.
	keepTogether(sheet, (dry) => {
		const top = sheet.y;
		down(6);
		down(sheet.text('CAUTIONS: read before you start', { x: 10, size: 11.5, bold: true, dry }) + 3);
		for (const c of model.cautions) {
			const h1 = sheet.text(`${c.number}.`, { x: 10, width: 16, bold: true, dry });
			const save = sheet.y;
			const h2 = sheet.text(c.title, { x: 28, width: sheet.width - 38, bold: true, dry });
			sheet.y -= h2;
			const h3 = sheet.text(c.text, { x: 28, width: sheet.width - 38, dry });
			sheet.y = save;
			down(Math.max(h1, h2 + h3) + 3);
		}
		down(4);
		const height = top - sheet.y;
		if (!dry) sheet.page.drawRectangle({ x: MARGIN, y: sheet.y, width: sheet.width, height, borderColor: INK, borderWidth: 2.25 });
		down(10);
		return height + 10;
	});

	// Meter settings.
	keepTogether(sheet, (dry) => {
		const top = sheet.y;
		down(sheet.text('Meter', { size: 11.5, bold: true, dry }) + 3);
		down(row(sheet, 'Profile', model.meter.label, dry));
		down(row(sheet, 'Volts input', `${model.meter.inputResistance} (DC volts range)`, dry));
		down(row(sheet, 'Test lamp', model.meter.lampWatts, dry));
		for (const st of model.meter.settings) down(row(sheet, 'Setting', `${st.setting} (${noun(st.steps.length, 'step')} ${st.steps.join(', ')})`, dry));
		down(8);
		return top - sheet.y;
	});

	if (model.readings.length) {
		keepTogether(sheet, (dry) => {
			const top = sheet.y;
			down(sheet.text('Readings taken so far', { size: 11.5, bold: true, dry }) + 3);
			for (const r of model.readings) down(row(sheet, r.value, `${r.label}${r.takenBy ? `, by ${r.takenBy}` : ''}, ${r.takenAt.slice(0, 16).replace('T', ' ')}${r.struck ? ' (struck out: not used)' : ''}${r.queued ? ' (not yet sent)' : ''}`, dry));
			down(8);
			return top - sheet.y;
		});
	}
	if (model.groups.length) {
		keepTogether(sheet, (dry) => {
			const top = sheet.y;
			down(sheet.text('Cannot be told apart with a meter: one job for each group', { size: 11.5, bold: true, dry }) + 3);
			for (const g of model.groups) down(sheet.text(`\u2022 ${g.final ? 'Left at the end: ' : ''}${g.action}`, { x: 6, dry }) + 2);
			down(8);
			return top - sheet.y;
		});
	}

	// The "Steps" heading stays with the first step.
	const titles = new Map(model.cautions.map((c) => [c.number, c.title]));
	const firstH = model.steps.length ? step(sheet, model.steps[0], titles, true) : 0;
	sheet.ensure(Math.min(24 + firstH, sheet.size[1] - 2 * MARGIN - 18));
	down(sheet.text(model.steps.length ? 'Steps' : 'No steps: nothing left that a meter reading here can tell apart.', { size: 11.5, bold: true }) + 6);
	for (const s of model.steps) keepTogether(sheet, (dry) => step(sheet, s, titles, dry));

	// Page numbers, once the count is known.
	const total = sheet.pages.length;
	sheet.pages.forEach((page, i) => {
		const footer = winAnsi(`${h.vehicleName} \u2014 ${model.title}`);
		const right = `Page ${i + 1} of ${total}`;
		page.drawLine({ start: { x: MARGIN, y: MARGIN + 10 }, end: { x: size[0] - MARGIN, y: MARGIN + 10 }, thickness: 0.5, color: RULE });
		const short = wrap(footer, fonts.regular, SMALL, sheet.width - 80)[0];
		page.drawText(short, { x: MARGIN, y: MARGIN, size: SMALL, font: fonts.regular, color: SOFT });
		page.drawText(right, { x: size[0] - MARGIN - fonts.regular.widthOfTextAtSize(right, SMALL), y: MARGIN, size: SMALL, font: fonts.regular, color: SOFT });
	});

	pdf.setTitle(winAnsi(model.title));
	pdf.setAuthor('Loomwright');
	pdf.setSubject(winAnsi(`${h.vehicle}; ${h.diagramTitle}, revision ${h.revision}`));
	pdf.setCreator('Loomwright');
	pdf.setCreationDate(new Date(h.printedAt));
	return pdf.save();
}
