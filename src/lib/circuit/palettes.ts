/**
 * Built-in wire colour palettes, as data. Display colours are our own screen renderings.
 *
 * - `iec-60757`: the two-letter colour codes of IEC 60757 (code for designation of colours).
 * - `trade-letters`: the single-letter code common on older British-built vehicles
 *   (common practice; see TRADE.md for which letters are confirmed and which are from memory).
 */
import { z } from 'zod';

export const PaletteColourSchema = z.object({
	code: z
		.string()
		.min(1)
		.max(6)
		.regex(/^[A-Za-z]+$/, 'a colour code is letters only'),
	name: z.string().min(1),
	/** Screen colour as #rrggbb. */
	display: z.string().regex(/^#[0-9a-fA-F]{6}$/, 'display colour must be #rrggbb')
});

export const PaletteSchema = z.object({
	id: z.string().min(1),
	name: z.string().min(1),
	colours: z.array(PaletteColourSchema).min(1)
});

export type PaletteColour = z.output<typeof PaletteColourSchema>;
export type Palette = z.output<typeof PaletteSchema>;

export const IEC_60757: Palette = {
	id: 'iec-60757',
	name: 'IEC 60757 two-letter codes',
	colours: [
		{ code: 'BK', name: 'black', display: '#1a1a1a' },
		{ code: 'BN', name: 'brown', display: '#7b4a1e' },
		{ code: 'RD', name: 'red', display: '#d32f2f' },
		{ code: 'OG', name: 'orange', display: '#f57c00' },
		{ code: 'YE', name: 'yellow', display: '#fbc02d' },
		{ code: 'GN', name: 'green', display: '#2e7d32' },
		{ code: 'BU', name: 'blue', display: '#1565c0' },
		{ code: 'VT', name: 'violet', display: '#7b1fa2' },
		{ code: 'GY', name: 'grey', display: '#8a8a8a' },
		{ code: 'WH', name: 'white', display: '#f5f5f5' },
		{ code: 'PK', name: 'pink', display: '#f48fb1' },
		{ code: 'GD', name: 'gold', display: '#c9a227' },
		{ code: 'TQ', name: 'turquoise', display: '#26a69a' },
		{ code: 'SR', name: 'silver', display: '#c0c0c0' },
		{ code: 'GNYE', name: 'green-and-yellow', display: '#8bc34a' }
	]
};

export const TRADE_LETTERS: Palette = {
	id: 'trade-letters',
	name: 'Single-letter trade code',
	colours: [
		{ code: 'B', name: 'black', display: '#1a1a1a' },
		{ code: 'U', name: 'blue', display: '#1565c0' },
		{ code: 'N', name: 'brown', display: '#7b4a1e' },
		{ code: 'G', name: 'green', display: '#2e7d32' },
		{ code: 'LG', name: 'light green', display: '#9ccc65' },
		{ code: 'R', name: 'red', display: '#d32f2f' },
		{ code: 'W', name: 'white', display: '#f5f5f5' },
		{ code: 'Y', name: 'yellow', display: '#fbc02d' },
		{ code: 'P', name: 'purple', display: '#7b1fa2' },
		{ code: 'S', name: 'slate', display: '#607d8b' },
		{ code: 'K', name: 'pink', display: '#f48fb1' },
		{ code: 'O', name: 'orange', display: '#f57c00' }
	]
};

export const BUILT_IN_PALETTES: Readonly<Record<string, Palette>> = {
	[IEC_60757.id]: IEC_60757,
	[TRADE_LETTERS.id]: TRADE_LETTERS
};
