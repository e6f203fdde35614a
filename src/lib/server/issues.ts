// One way to turn validation problems into what the API and the forms show.
import type { z } from 'zod';

export interface Issue {
	/** Path to the field, e.g. "systemVoltage" or "document.parts[0].kind"; "" for the whole value. */
	path: string;
	message: string;
}

/** Same spelling as the circuit core's paths: names joined by ".", list indexes in brackets. */
export function pathString(path: readonly PropertyKey[]): string {
	let out = '';
	for (const p of path) {
		if (typeof p === 'number') out += `[${p}]`;
		else out += out ? `.${String(p)}` : String(p);
	}
	return out;
}

/** Puts a path under a parent field: under("document", "parts[0]") → "document.parts[0]". */
export function under(parent: string, path: string): string {
	if (!path || path === '(document)') return parent;
	return path.startsWith('[') ? parent + path : `${parent}.${path}`;
}

export function fromZod(error: z.ZodError, prefix = ''): Issue[] {
	return error.issues.map((issue) => ({
		path: prefix ? under(prefix, pathString(issue.path)) : pathString(issue.path),
		message: issue.message
	}));
}

/** First message per top-level field, for showing beside form inputs. */
export function fieldErrors(issues: Issue[]): Record<string, string> {
	const out: Record<string, string> = {};
	for (const { path, message } of issues) {
		const field = path.split(/[.[]/)[0] || 'form';
		out[field] ??= message;
	}
	return out;
}
