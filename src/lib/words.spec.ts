// Counted nouns and articles by rule: English plural categories from Intl.PluralRules (CLDR:
// "one" for exactly 1, "other" otherwise, 0 included) and "an" before a vowel sound.
import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { addTerminal, EditError } from '$lib/editor/ops';
import { parseDocument } from '$lib/circuit/schema';
import { capitalised, counted, noun, withArticle } from './words';

describe('counted', () => {
	it.each([
		[0, 'step', '0 steps'],
		[1, 'step', '1 step'],
		[2, 'step', '2 steps'],
		[1, 'row', '1 row'],
		[41, 'suspect', '41 suspects']
	])('%i %s reads "%s"', (n, one, text) => expect(counted(n, one)).toBe(text));

	it('takes an irregular plural', () => {
		expect(counted(2, 'key number', 'key numbers')).toBe('2 key numbers');
		expect(noun(1, 'this', 'these')).toBe('this');
		expect(noun(3, 'this', 'these')).toBe('these');
	});
});

describe('withArticle', () => {
	it.each([
		['earth point', 'an earth point'],
		['ignition coil', 'an ignition coil'],
		['fuse', 'a fuse'],
		['switch', 'a switch']
	])('%s → %s', (word, text) => expect(withArticle(word)).toBe(text));

	it('starts a sentence with a capital', () => expect(capitalised(withArticle('earth point'))).toBe('An earth point'));

	it('reads "An earth point has fixed terminals" on the drawing board, not "A earth-point"', () => {
		const doc = demoHarness();
		const earth = doc.parts.find((p) => p.kind === 'earth-point')!;
		expect(() => addTerminal(doc, earth.id, 'x')).toThrow(new EditError('An earth point has fixed terminals.', 'terminals'));
	});

	it('reads "an earth-point has the terminals stud" when a document renames them, not "a earth-point"', () => {
		const doc = demoHarness() as unknown as { parts: { kind: string; terminals: string[] }[] };
		doc.parts.find((p) => p.kind === 'earth-point')!.terminals = ['bolt'];
		const r = parseDocument(doc);
		expect(r.ok).toBe(false);
		expect(!r.ok && r.errors.map((e) => e.message)).toContain('an earth-point has the terminals stud');
	});
});
