// Text the database cannot keep, found before anything is written, with where it is.
// PostgreSQL refuses the NUL character (U+0000) in text and jsonb ("invalid byte sequence for
// encoding UTF8: 0x00"; jsonb: "unsupported Unicode escape sequence"), and jsonb refuses a lone
// UTF-16 surrogate escape (PostgreSQL manual, §8.14.1 and §9.16). Deep nesting costs a stack
// frame a level wherever a value is walked, so it is bounded too.
import type { Issue } from './issues';

/** Deepest nesting of objects and arrays a JSON body may have (a harness document needs about 6). */
export const MAX_DEPTH = 64;

/** Why a string cannot be stored, in words, or null when it can. */
export function textProblem(s: string): string | null {
	if (s.includes('\u0000')) return 'contains a NUL character (U+0000), which cannot be stored';
	// A high surrogate not followed by a low one, or a low one not after a high one.
	if (/[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/.test(s)) {
		return 'contains a lone UTF-16 surrogate (not a character), which cannot be stored';
	}
	return null;
}

const keyPath = (path: string, key: string) => (/^[A-Za-z_$][\w$]*$/.test(key) ? (path ? `${path}.${key}` : key) : `${path}[${JSON.stringify(key)}]`);

/**
 * The first problem in a parsed JSON value: text that cannot be stored (in a value or a key), or
 * nesting deeper than `maxDepth`. Walks with its own stack, so a hostile depth cannot overflow it.
 */
export function findBadValue(value: unknown, maxDepth = MAX_DEPTH, root = ''): Issue | null {
	const stack: { value: unknown; path: string; depth: number }[] = [{ value, path: root, depth: 0 }];
	while (stack.length) {
		const { value: v, path, depth } = stack.pop()!;
		if (typeof v === 'string') {
			const problem = textProblem(v);
			if (problem) return { path, message: `${path || 'The value'} ${problem}.` };
		} else if (v !== null && typeof v === 'object') {
			if (depth >= maxDepth) return { path, message: `${path || 'The body'} is nested more than ${maxDepth} levels deep.` };
			if (Array.isArray(v)) {
				for (let i = v.length - 1; i >= 0; i--) stack.push({ value: v[i], path: `${path}[${i}]`, depth: depth + 1 });
			} else {
				const entries = Object.entries(v as Record<string, unknown>);
				for (let i = entries.length - 1; i >= 0; i--) {
					const [key, child] = entries[i];
					const problem = textProblem(key);
					const at = keyPath(path, key.replace(/[\u0000\ud800-\udfff]/g, '\ufffd'));
					if (problem) return { path: at, message: `The name of ${at} ${problem}.` };
					stack.push({ value: child, path: at, depth: depth + 1 });
				}
			}
		}
	}
	return null;
}

/** The first field of a form whose text (or uploaded file's name) cannot be stored. */
export function findBadField(data: FormData): Issue | null {
	for (const [name, value] of data) {
		const text = typeof value === 'string' ? value : value.name;
		const problem = textProblem(text);
		const field = name.replace(/[\u0000\ud800-\udfff]/g, '\ufffd');
		if (problem) return { path: field, message: `${typeof value === 'string' ? `The field “${field}”` : `The name of the file in “${field}”`} ${problem}.` };
		const nameProblem = textProblem(name);
		if (nameProblem) return { path: field, message: `A field's name ${nameProblem}.` };
	}
	return null;
}

/** The first line (counted from 1) of a text file holding a character that cannot be stored. */
export function findBadLine(text: string): { row: number; message: string } | null {
	const problem = textProblem(text);
	if (!problem) return null;
	const lines = text.split(/\r\n|\n|\r/);
	for (let i = 0; i < lines.length; i++) {
		const p = textProblem(lines[i]);
		if (p) return { row: i + 1, message: `Row ${i + 1} ${p}.` };
	}
	return { row: 1, message: `The file ${problem}.` };
}
