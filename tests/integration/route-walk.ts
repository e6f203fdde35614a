// Finds every route under a routes folder the way SvelteKit does: a folder with +page.svelte or
// +page.server.ts is a page, one with +server.ts an endpoint with the methods it exports. Route
// groups "(name)" do not appear in the address (SvelteKit docs, "Advanced routing: (group)").
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

export interface WalkedRoute {
	/** The address pattern, e.g. /diagrams/[id]/draw (groups removed). */
	route: string;
	page: boolean;
	/** HTTP methods exported by +server.ts, sorted. */
	methods: string[];
}

const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'HEAD', 'OPTIONS'];

function exportedMethods(source: string): string[] {
	const found = new Set<string>();
	for (const m of source.matchAll(/export\s+(?:const|let|async\s+function|function)\s+([A-Z]+)\b/g)) {
		if (METHODS.includes(m[1])) found.add(m[1]);
	}
	for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
		for (const part of m[1].split(',')) {
			const name = part.trim().split(/\s+as\s+/).pop()!;
			if (METHODS.includes(name)) found.add(name);
		}
	}
	return [...found].sort();
}

export function walkRoutes(root: string): WalkedRoute[] {
	const out: WalkedRoute[] = [];
	const visit = (dir: string) => {
		const names = readdirSync(dir);
		const page = names.includes('+page.svelte') || names.includes('+page.server.ts') || names.includes('+page.ts');
		const server = names.includes('+server.ts') ? exportedMethods(readFileSync(join(dir, '+server.ts'), 'utf8')) : [];
		if (page || names.includes('+server.ts')) {
			const segments = relative(root, dir).split(sep).filter((s) => s && !/^\(.*\)$/.test(s));
			out.push({ route: '/' + segments.join('/'), page, methods: server });
		}
		for (const n of names) {
			const p = join(dir, n);
			if (statSync(p).isDirectory()) visit(p);
		}
	};
	visit(root);
	return out.sort((a, b) => a.route.localeCompare(b.route));
}

/** What the table lacks or has too much of, compared with the walked routes, in words. */
export function coverageProblems(
	walked: WalkedRoute[],
	table: Record<string, { page?: unknown; api?: Record<string, unknown> }>
): string[] {
	const problems: string[] = [];
	for (const r of walked) {
		const entry = table[r.route];
		if (!entry) {
			problems.push(`${r.route}: no entry in the access table`);
			continue;
		}
		if (r.page && !entry.page) problems.push(`${r.route}: is a page but its entry has no page row`);
		if (!r.page && entry.page) problems.push(`${r.route}: the entry has a page row but there is no page`);
		const listed = Object.keys(entry.api ?? {}).sort();
		if (listed.join() !== r.methods.join()) problems.push(`${r.route}: exports ${r.methods.join(', ') || 'no methods'} but the entry lists ${listed.join(', ') || 'none'}`);
	}
	for (const route of Object.keys(table)) if (!walked.some((r) => r.route === route)) problems.push(`${route}: in the table but no such route`);
	return problems;
}
