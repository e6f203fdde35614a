/**
 * Counted nouns and articles by rule rather than by hand ("1 step", "2 steps", "an earth point"):
 * the plural category comes from Intl.PluralRules (CLDR plural rules), so a count never reads
 * "1 steps". The product's words are English; the rules object is made once.
 */
const rules = new Intl.PluralRules('en');

/**
 * The noun's form for a count, without the number.
 * @example noun(1, 'step') // "step"
 * @example noun(3, 'wire') // "wires"
 * @example noun(2, 'key number', 'key numbers') // "key numbers"
 */
export function noun(n: number, one: string, other = `${one}s`): string {
	return rules.select(n) === 'one' ? one : other;
}

/**
 * A count with its noun.
 * @example counted(1, 'row') // "1 row"
 * @example counted(0, 'suspect') // "0 suspects"
 * @example counted(2, 'this', 'these') // "2 these" — use noun() for words that are not counted
 */
export function counted(n: number, one: string, other = `${one}s`): string {
	return `${n} ${noun(n, one, other)}`;
}

/**
 * The indefinite article for a word as it is spoken: "an" before a vowel sound. Letters read as
 * letters (an "LED", an "MOT") are not guessed; the product's part words start with their sound.
 * @example withArticle('earth point') // "an earth point"
 * @example withArticle('fuse') // "a fuse"
 */
export function withArticle(word: string): string {
	return `${/^[aeiou]/i.test(word) ? 'an' : 'a'} ${word}`;
}

/** The text with its first letter capital, to start a sentence. @example capitalised('an earth point') // "An earth point" */
export function capitalised(text: string): string {
	return text.charAt(0).toUpperCase() + text.slice(1);
}
