// A palette of the person's own, as they type it on the palettes page and as the API accepts
// it: a name and its colours (code, colour name, screen colour). One schema for both, so the
// page can show a problem beside its row before the server answers with the same words.
import { z } from 'zod';
import type { Palette } from '$lib/circuit/colours';

export const PALETTE_NAME_MAX = 80;
export const PALETTE_COLOURS_MAX = 60;

const Colour = z.object({
	code: z
		.string({ error: 'A code is needed.' })
		.trim()
		.min(1, 'A code is needed.')
		.max(6, 'A code is at most 6 letters.')
		.regex(/^[A-Za-z]*$/, 'A code is letters only, e.g. G or GN.'),
	name: z.string({ error: 'A colour name is needed.' }).trim().min(1, 'A colour name is needed.').max(40, 'A colour name is at most 40 characters.'),
	display: z.string({ error: 'A screen colour is needed.' }).regex(/^#[0-9a-fA-F]{6}$/, 'A screen colour is written #rrggbb, e.g. #2e7d32.')
});

export const PaletteInputSchema = z
	.object({
		name: z
			.string({ error: 'A palette needs a name.' })
			.trim()
			.min(1, 'A palette needs a name.')
			.max(PALETTE_NAME_MAX, `A palette name is at most ${PALETTE_NAME_MAX} characters.`),
		colours: z
			.array(Colour, { error: 'A palette needs a list of colours.' })
			.min(1, 'A palette needs at least one colour.')
			.max(PALETTE_COLOURS_MAX, `A palette has at most ${PALETTE_COLOURS_MAX} colours.`)
	})
	.superRefine((p, ctx) => {
		// Codes are read without regard to case (parseCode upper-cases), so "gb" and "GB" clash;
		// colour names are how a diagram changes palette (green stays green), so they must differ too.
		const codes = new Map<string, number>();
		const names = new Map<string, number>();
		p.colours.forEach((c, i) => {
			const code = c.code.toUpperCase();
			if (codes.has(code)) ctx.addIssue({ code: 'custom', path: ['colours', i, 'code'], message: `"${c.code}" is defined twice (also row ${codes.get(code)! + 1})` });
			else codes.set(code, i);
			const name = c.name.toLowerCase();
			if (names.has(name)) ctx.addIssue({ code: 'custom', path: ['colours', i, 'name'], message: `"${c.name}" is named twice (also row ${names.get(name)! + 1})` });
			else names.set(name, i);
		});
	});

export type PaletteInput = z.output<typeof PaletteInputSchema>;

/** The id a library palette carries once copied into a document: it says where it came from. */
export const libraryPaletteId = (id: string) => `account-${id}`;

/** A library palette as the circuit core's Palette, ready to copy into a document. */
export function asPalette(p: { id: string; name: string; colours: PaletteInput['colours'] }): Palette {
	return { id: libraryPaletteId(p.id), name: p.name, colours: p.colours.map((c) => ({ code: c.code, name: c.name, display: c.display })) };
}
