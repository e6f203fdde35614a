/**
 * A colour code that reads one way in the diagram's palette and another in a known standard:
 * "BK" in the single-letter trade code is black with a pink tracer (B/K), while a restorer working
 * from an IEC 60757 manual means black. The drawing board says how it read the code and offers
 * the other reading, written in the diagram's own palette.
 */
import { formatCode, parseCode, resolvePalette, type Palette } from '$lib/circuit/colours';
import { IEC_60757 } from '$lib/circuit/palettes';

export interface OtherReading {
	/** "black with pink tracer". */
	readAs: string;
	/** The standard the other reading comes from: "IEC 60757 two-letter codes". */
	standard: string;
	/** "black". */
	otherWords: string;
	/** The other reading written in the diagram's palette ("B"), to use instead. */
	code: string;
}

const words = (base: string, tracer: string | null) => (tracer ? `${base} with ${tracer} tracer` : base);

function namesOf(code: string, palette: Palette): { base: string; tracer: string | null } | null {
	const parsed = parseCode(code, palette);
	if (!parsed.ok) return null;
	const name = (c: string) => palette.colours.find((x) => x.code.toUpperCase() === c.toUpperCase())?.name ?? null;
	const base = name(parsed.code.base);
	if (!base) return null;
	return { base, tracer: parsed.code.tracer ? name(parsed.code.tracer) : null };
}

/**
 * The other reading of `code`, when IEC 60757 reads it as other colours that the diagram's
 * palette can also write; otherwise null.
 * @example otherReading('BK', 'trade-letters') // { readAs: 'black with pink tracer', standard: 'IEC 60757 two-letter codes', otherWords: 'black', code: 'B' }
 */
export function otherReading(code: string, paletteOrId: string | Palette): OtherReading | null {
	const palette = resolvePalette(paletteOrId);
	// The open standard is the reference; a diagram already in IEC 60757 has one reading only.
	const standard = IEC_60757;
	if (palette.id === standard.id) return null;
	const here = namesOf(code, palette);
	const there = namesOf(code, standard);
	if (!here || !there) return null;
	if (here.base === there.base && here.tracer === there.tracer) return null;
	// Written back in the diagram's palette, by colour name; a colour it lacks means no offer.
	const codeOf = (name: string) => palette.colours.find((c) => c.name === name)?.code;
	const base = codeOf(there.base);
	const tracer = there.tracer ? codeOf(there.tracer) : undefined;
	if (!base || (there.tracer && !tracer)) return null;
	return { readAs: words(here.base, here.tracer), standard: standard.name, otherWords: words(there.base, there.tracer), code: formatCode({ base, tracer: tracer ?? null }) };
}
