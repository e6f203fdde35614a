// Suggestions for the wire colour code field: codes already used in the diagram first (a
// manual repeats a handful of colours), then what the palette can make from what was typed.
import { displayColours, formatCode, parseCode, type Palette } from '$lib/circuit/colours';

export type CodeSuggestion = { code: string; base: string; tracer: string | null; description: string };

function suggestion(code: string, palette: Palette): CodeSuggestion | null {
	try {
		const d = displayColours(code, palette);
		return { code, base: d.base, tracer: d.tracer, description: d.description };
	} catch {
		return null;
	}
}

/** Codes used in the diagram, most used first (ties in first-use order). */
export function usedCodes(codes: readonly string[]): string[] {
	const counts = new Map<string, number>();
	for (const c of codes) counts.set(c, (counts.get(c) ?? 0) + 1);
	return [...counts.entries()].sort((a, b) => b[1] - a[1]).map(([c]) => c);
}

/**
 * Up to `limit` codes to offer for what has been typed.
 * @example codeSuggestions('G/', TRADE_LETTERS, []) // G/B, G/U, G/N, … (green with each tracer)
 */
export function codeSuggestions(text: string, palette: Palette, used: readonly string[], limit = 10): CodeSuggestion[] {
	const typed = text.trim().toUpperCase();
	const out: string[] = [];
	const add = (c: string) => {
		if (!out.includes(c)) out.push(c);
	};
	const norm = (c: string) => c.replace(/[\s\-._+,]+/g, '/').toUpperCase();
	const sep = typed.match(/^([A-Z]+)[\s/\-._+,]+([A-Z]*)$/);
	if (!typed) {
		for (const c of usedCodes(used)) add(c);
		for (const c of palette.colours) add(c.code);
	} else if (sep) {
		// Base chosen; offer its tracers (filtered by what follows the separator).
		const base = palette.colours.find((c) => c.code.toUpperCase() === sep[1]);
		if (base) {
			for (const c of usedCodes(used)) if (norm(c).startsWith(`${base.code}/${sep[2]}`)) add(c);
			for (const t of palette.colours) {
				if (t.code === base.code || !t.code.toUpperCase().startsWith(sep[2])) continue;
				add(formatCode({ base: base.code, tracer: t.code }));
			}
		}
	} else {
		for (const c of usedCodes(used)) if (norm(c).startsWith(typed)) add(c);
		for (const c of palette.colours) if (c.code.toUpperCase().startsWith(typed)) add(c.code);
		// A complete code typed without a separator ("GB") is offered written properly.
		const parsed = parseCode(typed, palette);
		if (parsed.ok) add(formatCode(parsed.code));
	}
	return out
		.map((c) => suggestion(c, palette))
		.filter((s): s is CodeSuggestion => s !== null)
		.slice(0, limit);
}
