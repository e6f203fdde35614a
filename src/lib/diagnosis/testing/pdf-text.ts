/**
 * Reads back the text a PDF draws, for tests: loads the file with pdf-lib, inflates each page's
 * content streams and collects the strings shown by `Tj` (PDF 1.7 §9.4.3), decoded from
 * WinAnsiEncoding (PDF 1.7 Annex D.2; the 0x80–0x9F row as the WHATWG Encoding Standard's
 * windows-1252 index). Enough for the text pdf-lib writes with the standard fonts (hex strings,
 * one run per drawText call); not a general PDF text extractor.
 */
import { decodePDFRawStream, PDFArray, PDFDocument, PDFRawStream, type PDFObject } from 'pdf-lib';

const ROW_80 = [
	0x20ac, 0, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021, 0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0, 0x017d, 0,
	0, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x02dc, 0x2122, 0x0161, 0x203a, 0x0153, 0, 0x017e, 0x0178
];

function decodeWinAnsi(hex: string): string {
	let out = '';
	for (let i = 0; i + 1 < hex.length; i += 2) {
		const b = parseInt(hex.slice(i, i + 2), 16);
		out += String.fromCodePoint(b >= 0x80 && b < 0xa0 ? ROW_80[b - 0x80] || 0xfffd : b);
	}
	return out;
}

function streamText(obj: PDFObject | undefined): string {
	if (obj instanceof PDFRawStream) return new TextDecoder('latin1').decode(decodePDFRawStream(obj).decode());
	return '';
}

export interface PdfText {
	pages: number;
	/** The text runs of each page, in drawing order. */
	runs: string[][];
	title: string | undefined;
}

export async function pdfText(bytes: Uint8Array): Promise<PdfText> {
	const pdf = await PDFDocument.load(bytes);
	const runs = pdf.getPages().map((page) => {
		const contents = page.node.Contents();
		const parts = contents instanceof PDFArray ? contents.asArray().map((ref) => pdf.context.lookup(ref)) : [contents];
		const content = parts.map(streamText).join('\n');
		return [...content.matchAll(/<([0-9A-Fa-f]*)>\s*Tj/g)].map((m) => decodeWinAnsi(m[1]));
	});
	return { pages: pdf.getPageCount(), runs, title: pdf.getTitle() };
}

/** The step numbers the PDF heads ("Step 3" alone as one run), in order. */
export function stepHeadings(text: PdfText): number[] {
	return text.runs.flat().flatMap((r) => {
		const m = /^Step (\d+)$/.exec(r);
		return m ? [Number(m[1])] : [];
	});
}
