// Counted nouns are written with noun()/counted() from $lib/words, never by hand: a hand-written
// plural ("wire${n === 1 ? '' : 's'}", "point(s)") is how "1 steps" and "Import the 1 valid
// rows" crept in. This scans the product's source (spec files aside) and names each line that
// pluralises by hand.
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(process.cwd(), 'src');

/** Hand-written plural forms. */
const PATTERNS: { name: string; re: RegExp }[] = [
	{ name: "an 's' suffix chosen by hand", re: /\?\s*(['"`])\1\s*:\s*(['"`])s\2/ },
	{ name: "an 's' suffix chosen by hand", re: /\?\s*(['"`])s\1\s*:\s*(['"`])\2/ },
	{ name: 'a "(s)" plural', re: /[a-z]\(s\)\s+[a-z]/i },
	{ name: 'a one-or-many choice by hand', re: /[!=]==\s*1\s*\?/ },
	{ name: 'a one-or-many choice by hand', re: />\s*1\s*\?\s*(['"`])(\w+)s\1\s*:\s*(['"`])\2\3/ }
];

/**
 * Lines that compare with 1 for another reason than a count's noun; each says why.
 */
const ALLOWED: { file: string; text: string; why: string }[] = [
	{ file: 'lib/editor/shortcuts.ts', text: 'key.length === 1 ?', why: 'a one-character key name, not a count' },
	{ file: 'lib/editor/switch-role.ts', text: 'found.length === 1 ? found[0]', why: 'joins a list with "and"; the noun is counted on the next line' },
	{ file: 'lib/components/editor/Canvas.svelte', text: 'dragged.length === 1 ? `Move part ${dragged[0]', why: 'names the one part moved; the name is only read when there is one' }
];

function sourceFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
		const path = join(dir, e.name);
		if (e.isDirectory()) return sourceFiles(path);
		return /\.(ts|svelte)$/.test(e.name) && !/\.spec\.ts$/.test(e.name) ? [path] : [];
	});
}

/** Comment lines talk about the code ("d(s)", "http(s)"); only code and markup are read. */
const isComment = (line: string) => /^\s*(\/\/|\/\*|\*|<!--)/.test(line);

function handPlurals(files: { file: string; text: string }[]): string[] {
	const found: string[] = [];
	for (const { file, text } of files) {
		text.split('\n').forEach((line, i) => {
			if (isComment(line)) return;
			for (const p of PATTERNS) {
				if (!p.re.test(line)) continue;
				if (ALLOWED.some((a) => a.file === file && line.includes(a.text))) continue;
				found.push(`${file}:${i + 1}: ${p.name}: ${line.trim().slice(0, 160)}`);
				break;
			}
		});
	}
	return found;
}

describe('no hand-written plurals', () => {
	it('finds each hand-written form it guards against', () => {
		const text = [
			"const a = `${n} wire${n === 1 ? '' : 's'}`;",
			"const b = `${n} step${n !== 1 ? 's' : ''}`;",
			'const c = `${n} point(s) from the battery`;',
			"const d = n === 1 ? 'this code' : 'these codes';",
			"const f = `${n > 1 ? 'steps' : 'step'} ${list}`;",
			'// every d(s) was solved exactly',
			"const e = counted(n, 'wire');"
		].join('\n');
		expect(handPlurals([{ file: 'lib/example.ts', text }]).map((f) => f.split(':').slice(0, 2).join(':'))).toEqual([
			'lib/example.ts:1',
			'lib/example.ts:2',
			'lib/example.ts:3',
			'lib/example.ts:4',
			'lib/example.ts:5'
		]);
	});

	it('finds none in src/ (file:line of each listed)', () => {
		const files = sourceFiles(ROOT).map((path) => ({ file: relative(ROOT, path).split('\\').join('/'), text: readFileSync(path, 'utf8') }));
		expect(files.length).toBeGreaterThan(100);
		expect(handPlurals(files)).toEqual([]);
	});

	it('every allowed line still exists, so the list does not outlive its reason', () => {
		for (const a of ALLOWED) expect(readFileSync(join(ROOT, a.file), 'utf8'), `${a.file}: ${a.why}`).toContain(a.text);
	});
});
