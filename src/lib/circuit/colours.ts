/**
 * Wire colour codes: a base colour plus an optional tracer (the thinner stripe), written
 * base first (`G/B` = green with a black tracer).
 *
 * Parsing is forgiving about separators (`/`, `-`, space, `.`, `_`, `+`, `,` or none) and
 * case. Without a separator the letters are split into the longest codes the palette knows,
 * so `LGB` is light green with black and `GNYE` stays the IEC green-and-yellow.
 */
import { BUILT_IN_PALETTES, type Palette, type PaletteColour } from './palettes';

export { BUILT_IN_PALETTES, IEC_60757, TRADE_LETTERS, PaletteSchema } from './palettes';
export type { Palette, PaletteColour } from './palettes';

export interface ColourCode {
	base: string;
	tracer: string | null;
}

export type CodeResult = { ok: true; code: ColourCode } | { ok: false; error: string };

const SEPARATORS = /[\s/\-._+,]+/;

/** The palette a document names: a built-in id or an inline palette. */
export function resolvePalette(palette: string | Palette): Palette {
	if (typeof palette !== 'string') return palette;
	const found = BUILT_IN_PALETTES[palette];
	if (!found) {
		throw new Error(
			`resolvePalette: unknown palette "${palette}"; built in: ${Object.keys(BUILT_IN_PALETTES).join(', ')}`
		);
	}
	return found;
}

function index(palette: Palette): Map<string, PaletteColour> {
	const m = new Map<string, PaletteColour>();
	for (const c of palette.colours) m.set(c.code.toUpperCase(), c);
	return m;
}

/** Split a run of letters into palette codes, longest match first. */
function splitLetters(run: string, codes: Map<string, PaletteColour>): string[] | null {
	const longest = Math.max(...[...codes.keys()].map((k) => k.length));
	// Dynamic programming over prefixes, preferring the fewest (hence longest) codes.
	const best: (string[] | null)[] = new Array(run.length + 1).fill(null);
	best[0] = [];
	for (let i = 0; i < run.length; i++) {
		const here = best[i];
		if (!here) continue;
		for (let len = Math.min(longest, run.length - i); len >= 1; len--) {
			const piece = run.slice(i, i + len);
			if (!codes.has(piece)) continue;
			const next = [...here, piece];
			const there = best[i + len];
			if (!there || next.length < there.length) best[i + len] = next;
		}
	}
	return best[run.length];
}

/** Parse a colour code in a palette. Errors name the unknown code and the palette. */
export function parseCode(text: string, paletteOrId: string | Palette): CodeResult {
	const palette = resolvePalette(paletteOrId);
	const codes = index(palette);
	const trimmed = text.trim();
	if (!trimmed) return { ok: false, error: `empty colour code (palette: ${palette.name})` };
	const tokens = trimmed.toUpperCase().split(SEPARATORS).filter(Boolean);
	const parts: string[] = [];
	for (const token of tokens) {
		if (codes.has(token)) {
			parts.push(token);
			continue;
		}
		const split = /^[A-Z]+$/.test(token) ? splitLetters(token, codes) : null;
		if (!split) {
			return {
				ok: false,
				error: `unknown colour code "${token}" in the palette ${palette.name} (known: ${[...codes.keys()].join(' ')})`
			};
		}
		parts.push(...split);
	}
	if (parts.length > 2) {
		return {
			ok: false,
			error: `"${text}" names ${parts.length} colours (${parts.join(', ')}); a code is a base and at most one tracer`
		};
	}
	const canonical = (c: string) => codes.get(c)!.code;
	return { ok: true, code: { base: canonical(parts[0]), tracer: parts[1] ? canonical(parts[1]) : null } };
}

/** Format a code the way the palette writes it: base, separator, tracer. */
export function formatCode(code: ColourCode, separator = '/'): string {
	return code.tracer ? `${code.base}${separator}${code.tracer}` : code.base;
}

export interface DisplayColours {
	base: string;
	tracer: string | null;
	/** Human words, e.g. "green with black tracer". */
	description: string;
}

/** Screen colours for a wire: base fill and tracer stripe. */
export function displayColours(text: string, paletteOrId: string | Palette): DisplayColours {
	const palette = resolvePalette(paletteOrId);
	const parsed = parseCode(text, palette);
	if (!parsed.ok) throw new Error(`displayColours: ${parsed.error}`);
	const codes = index(palette);
	const base = codes.get(parsed.code.base.toUpperCase())!;
	const tracer = parsed.code.tracer ? codes.get(parsed.code.tracer.toUpperCase())! : null;
	return {
		base: base.display,
		tracer: tracer ? tracer.display : null,
		description: tracer ? `${base.name} with ${tracer.name} tracer` : base.name
	};
}
