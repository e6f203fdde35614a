/**
 * The native document file: the circuit core's schema as JSON, versioned by `schemaVersion`.
 * Export writes the parsed document with its defaults filled in, so importing the file gives
 * back an equal document; import goes through `parseDocument`, whose errors carry JSON paths.
 */
import { parseDocument, SCHEMA_VERSION, type HarnessDocument, type SchemaError } from '../circuit/schema';

export const DOCUMENT_MEDIA_TYPE = 'application/json';
export const DOCUMENT_EXTENSION = '.loom.json';

/** Pretty-printed (tabs, as the code base writes JSON) with a trailing newline. */
export function exportDocument(doc: HarnessDocument): string {
	return JSON.stringify({ ...doc, schemaVersion: SCHEMA_VERSION }, null, '\t') + '\n';
}

export type ImportResult = { ok: true; document: HarnessDocument } | { ok: false; errors: SchemaError[] };

/** Parses a document file's text; every problem is returned with its JSON path (e.g. `wires[3].to.terminal`). */
export function importDocument(text: string): ImportResult {
	const trimmed = text.replace(/^\uFEFF/, '');
	if (!trimmed.trim()) return { ok: false, errors: [{ path: '(document)', message: 'the file is empty' }] };
	return parseDocument(trimmed);
}

/** A file name from a title: letters, digits and dashes, then the extension. */
export function fileName(title: string, extension: string): string {
	const base = title
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.replace(/[^A-Za-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.toLowerCase()
		.slice(0, 60);
	return (base || 'diagram') + extension;
}
