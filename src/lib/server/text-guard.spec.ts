import { describe, expect, it } from 'vitest';
import { findBadField, findBadLine, findBadValue, textProblem } from './text-guard';

// What PostgreSQL cannot store (PostgreSQL manual §8.3: text never holds the NUL character;
// §8.14: jsonb refuses \u0000 and a lone UTF-16 surrogate escape; RFC 8259 §8.2 on unpaired
// surrogates in JSON strings).
describe('textProblem', () => {
	it.each([
		['plain', null],
		['G/B wire, 1.0 mm²', null],
		['emoji pair 🔧', null],
		['a\u0000b', 'NUL'],
		['\ud800', 'surrogate'],
		['x\udc00', 'surrogate'],
		['\udc00\ud800', 'surrogate']
	])('%j', (s, found) => {
		const p = textProblem(s);
		if (found === null) expect(p).toBeNull();
		else expect(p).toContain(found);
	});
});

describe('findBadValue', () => {
	it('names the path of a NUL deep in a document', () => {
		expect(findBadValue({ parts: [{ id: 'a' }, { id: 'b', label: 'x\u0000' }] })?.path).toBe('parts[1].label');
	});
	it('names a bad key', () => {
		expect(findBadValue({ meta: { ['k\ud800']: 1 } })?.path).toBe('meta["k\ufffd"]');
	});
	it('refuses 5,000 levels of nesting without overflowing the stack', () => {
		let deep: unknown = 1;
		for (let i = 0; i < 5000; i++) deep = { a: deep };
		const bad = findBadValue({ meta: deep });
		expect(bad?.message).toMatch(/nested more than 64 levels/);
		expect(bad?.path.startsWith('meta.a.a')).toBe(true);
	});
	it('passes a well-formed value', () => {
		expect(findBadValue({ a: [1, 'two', { three: null }] })).toBeNull();
	});
});

describe('findBadField and findBadLine', () => {
	it('names the form field', () => {
		const form = new FormData();
		form.set('name', 'ok');
		form.set('notes', 'bad\u0000');
		expect(findBadField(form)?.path).toBe('notes');
	});
	it('names the row of a file', () => {
		expect(findBadLine('from,to\n1,2\n3\u0000,4\n')?.row).toBe(3);
		expect(findBadLine('from,to\n1,2\n')).toBeNull();
	});
});
