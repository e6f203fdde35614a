/**
 * The diagram document: vehicle facts, parts, wires, palette and layout, validated with zod.
 * Types are inferred from the schemas; `parseDocument` is the one way in from JSON.
 */
import { z } from 'zod';
import {
	DEFAULT_TERMINALS,
	FIXED_TERMINALS,
	LOCATIONS,
	PARAM_SCHEMAS,
		type PartKind,
	type VehicleFacts
} from './parts';
import { PaletteSchema, parseCode, resolvePalette, BUILT_IN_PALETTES } from './colours';
import { withArticle } from '../words';

export const SCHEMA_VERSION = 1;

const Id = z
	.string()
	.regex(/^[A-Za-z0-9_-]{1,64}$/, 'an id is 1–64 letters, digits, "_" or "-"');
const TerminalName = z.string().min(1).max(32);

export const PositionSchema = z.object({ x: z.number(), y: z.number() });

export const VehicleSchema = z.object({
	systemVoltage: z.union([z.literal(6), z.literal(12), z.literal(24)]),
	earth: z.enum(['negative', 'positive'])
});

function partBranch<K extends PartKind, S extends z.ZodObject>(kind: K, paramsSchema: S) {
	const fixed = FIXED_TERMINALS[kind];
	const terminals = fixed
		? z
				.array(TerminalName)
				.default([...fixed])
				.refine((t) => t.length === fixed.length && t.every((n, i) => n === fixed[i]), {
					message: `${withArticle(kind)} has the terminals ${fixed.join(', ')}`
				})
		: z.array(TerminalName).min(kind === 'splice' ? 2 : 1).default([...DEFAULT_TERMINALS[kind]]);
	return z.object({
		id: Id,
		/** The number in the manual's component key. */
		key: z.string().min(1).max(16),
		label: z.string().max(120).default(''),
		kind: z.literal(kind),
		params: paramsSchema.prefault({} as z.input<S>),
		terminals,
		position: PositionSchema.default({ x: 0, y: 0 }),
		location: z.enum(LOCATIONS).default('engine-bay'),
		notes: z.string().max(2000).optional()
	});
}

export const PartSchema = z.discriminatedUnion('kind', [
	partBranch('battery', PARAM_SCHEMAS['battery']),
	partBranch('earth-point', PARAM_SCHEMAS['earth-point']),
	partBranch('fuse', PARAM_SCHEMAS['fuse']),
	partBranch('switch', PARAM_SCHEMAS['switch']),
	partBranch('relay', PARAM_SCHEMAS['relay']),
	partBranch('lamp', PARAM_SCHEMAS['lamp']),
	partBranch('gauge', PARAM_SCHEMAS['gauge']),
	partBranch('sender', PARAM_SCHEMAS['sender']),
	partBranch('stabilizer', PARAM_SCHEMAS['stabilizer']),
	partBranch('resistor', PARAM_SCHEMAS['resistor']),
	partBranch('motor', PARAM_SCHEMAS['motor']),
	partBranch('ignition-coil', PARAM_SCHEMAS['ignition-coil']),
	partBranch('connector', PARAM_SCHEMAS['connector']),
	partBranch('splice', PARAM_SCHEMAS['splice']),
	partBranch('generator', PARAM_SCHEMAS['generator']),
	partBranch('load', PARAM_SCHEMAS['load']),
]);

export const TerminalRefSchema = z.object({ part: Id, terminal: TerminalName });

export const WireSizeSchema = z.union([
	z.object({ mm2: z.number().positive().max(200) }).strict(),
	z.object({ awg: z.number().int().min(-3).max(40) }).strict()
]);

export const WireSchema = z.object({
	id: Id,
	from: TerminalRefSchema,
	to: TerminalRefSchema,
	/** Colour code in the document's palette, e.g. "G/B". */
	code: z.string().min(1).max(16),
	size: WireSizeSchema.default({ mm2: 1 }),
	lengthM: z.number().nonnegative().max(100).default(1),
	/**
	 * The length was measured on the vehicle, not read off the manual's drawing: a diagnosis holds
	 * it as it is instead of ±50 % (uncertainty.ts). Absent means not measured, so older documents
	 * read the same.
	 */
	lengthMeasured: z.boolean().optional(),
	waypoints: z.array(PositionSchema).optional(),
	notes: z.string().max(2000).optional()
});

export const MetaSchema = z
	.object({
		title: z.string().max(200).optional(),
		notes: z.string().max(10000).optional()
	})
	.passthrough();

const DocumentShape = z.object({
	schemaVersion: z.literal(SCHEMA_VERSION),
	vehicle: VehicleSchema,
	palette: z.union([z.string().min(1), PaletteSchema]).default('trade-letters'),
	parts: z.array(PartSchema).default([]),
	wires: z.array(WireSchema).default([]),
	meta: MetaSchema.optional()
});

export type Part = z.output<typeof PartSchema>;
export type PartOf<K extends PartKind> = Extract<Part, { kind: K }>;
export type Wire = z.output<typeof WireSchema>;
export type TerminalRef = z.output<typeof TerminalRefSchema>;
export type Vehicle = z.output<typeof VehicleSchema>;
export type Position = z.output<typeof PositionSchema>;
export type HarnessDocument = z.output<typeof DocumentShape>;
export type DocumentInput = z.input<typeof DocumentShape>;

export interface SchemaError {
	/** Where, e.g. `wires[3].to.terminal`. */
	path: string;
	message: string;
}

export type ParseResult =
	| { ok: true; document: HarnessDocument }
	| { ok: false; errors: SchemaError[] };

export function formatPath(path: readonly PropertyKey[]): string {
	let s = '';
	for (const p of path) {
		if (typeof p === 'number') s += `[${p}]`;
		else s += s ? `.${String(p)}` : String(p);
	}
	return s || '(document)';
}

/** Reference checks that need the whole document. */
function checkReferences(doc: HarnessDocument): SchemaError[] {
	const errors: SchemaError[] = [];
	const parts = new Map<string, HarnessDocument['parts'][number]>();
	const keys = new Map<string, number>();
	doc.parts.forEach((part, i) => {
		if (parts.has(part.id)) errors.push({ path: `parts[${i}].id`, message: `part id "${part.id}" is used twice` });
		else parts.set(part.id, part);
		const k = keys.get(part.key);
		if (k !== undefined) {
			errors.push({ path: `parts[${i}].key`, message: `key number "${part.key}" is already used by parts[${k}]` });
		} else keys.set(part.key, i);
		const terms = new Set<string>();
		part.terminals.forEach((t, j) => {
			if (terms.has(t)) errors.push({ path: `parts[${i}].terminals[${j}]`, message: `terminal "${t}" is named twice on part "${part.key}"` });
			terms.add(t);
		});
		const own = (t: string, path: string) => {
			if (!terms.has(t)) {
				errors.push({ path, message: `part "${part.key}" (${part.id}) has no terminal "${t}"; it has ${part.terminals.join(', ')}` });
			}
		};
		if (part.kind === 'switch') {
			const names = new Set<string>();
			part.params.positions.forEach((pos, j) => {
				if (names.has(pos.name)) errors.push({ path: `parts[${i}].params.positions[${j}].name`, message: `position "${pos.name}" is named twice` });
				names.add(pos.name);
				pos.closed.forEach(([a, b], c) => {
					own(a, `parts[${i}].params.positions[${j}].closed[${c}][0]`);
					own(b, `parts[${i}].params.positions[${j}].closed[${c}][1]`);
				});
			});
			if (part.params.defaultPosition !== undefined && !names.has(part.params.defaultPosition)) {
				errors.push({ path: `parts[${i}].params.defaultPosition`, message: `no position "${part.params.defaultPosition}"; positions are ${[...names].join(', ')}` });
			}
		}
		if (part.kind === 'connector') {
			const used = new Map<string, number>();
			part.params.pins.forEach(([a, b], j) => {
				own(a, `parts[${i}].params.pins[${j}][0]`);
				own(b, `parts[${i}].params.pins[${j}][1]`);
				if (a === b) errors.push({ path: `parts[${i}].params.pins[${j}]`, message: `a pin pair joins two different terminals` });
				for (const t of [a, b]) {
					if (used.has(t)) errors.push({ path: `parts[${i}].params.pins[${j}]`, message: `terminal "${t}" is already in pin pair ${used.get(t)}` });
					used.set(t, j);
				}
			});
		}
		if (part.kind === 'load') {
			if (part.params.between) {
				own(part.params.between[0], `parts[${i}].params.between[0]`);
				own(part.params.between[1], `parts[${i}].params.between[1]`);
			} else if (part.terminals.length < 2) {
				errors.push({ path: `parts[${i}].terminals`, message: `a load needs two terminals to sit between` });
			}
		}
		if (part.kind === 'sender' && part.params.ohmsAt0 === part.params.ohmsAt1) {
			// Allowed, but a fixed sender is better drawn as a resistor; not an error.
		}
		if (part.kind === 'relay' && part.params.pullIn !== undefined && part.params.dropOut !== undefined && part.params.dropOut > part.params.pullIn) {
			errors.push({ path: `parts[${i}].params.dropOut`, message: `drop-out ${part.params.dropOut} V is above pull-in ${part.params.pullIn} V` });
		}
	});

	let palette: z.output<typeof PaletteSchema> | undefined;
	try {
		palette = resolvePalette(doc.palette);
	} catch {
		errors.push({ path: 'palette', message: `unknown palette "${String(doc.palette)}"; built in: ${Object.keys(BUILT_IN_PALETTES).join(', ')}` });
	}
	if (palette) {
		const codes = new Set<string>();
		palette.colours.forEach((c, j) => {
			const up = c.code.toUpperCase();
			if (codes.has(up)) errors.push({ path: `palette.colours[${j}].code`, message: `colour code "${c.code}" is defined twice` });
			codes.add(up);
		});
	}

	const wireIds = new Set<string>();
	doc.wires.forEach((wire, i) => {
		if (wireIds.has(wire.id)) errors.push({ path: `wires[${i}].id`, message: `wire id "${wire.id}" is used twice` });
		if (parts.has(wire.id)) errors.push({ path: `wires[${i}].id`, message: `wire id "${wire.id}" is also a part id` });
		wireIds.add(wire.id);
		for (const end of ['from', 'to'] as const) {
			const ref = wire[end];
			const part = parts.get(ref.part);
			if (!part) {
				errors.push({ path: `wires[${i}].${end}.part`, message: `wire "${wire.id}" ${end} names part "${ref.part}", which does not exist` });
			} else if (!part.terminals.includes(ref.terminal)) {
				errors.push({
					path: `wires[${i}].${end}.terminal`,
					message: `wire "${wire.id}" ${end} names terminal "${ref.terminal}" on part "${part.key}" (${part.id}), which has no such terminal; it has ${part.terminals.join(', ')}`
				});
			}
		}
		if (wire.from.part === wire.to.part && wire.from.terminal === wire.to.terminal) {
			errors.push({ path: `wires[${i}].to`, message: `wire "${wire.id}" starts and ends on the same terminal` });
		}
		if (palette) {
			const parsed = parseCode(wire.code, palette);
			if (!parsed.ok) errors.push({ path: `wires[${i}].code`, message: parsed.error });
		}
	});
	return errors;
}

/**
 * Upgrades from older schema versions, keyed by the version they upgrade from.
 * None yet: version 1 is the first. A version 2 adds `1: (doc) => ...` here.
 */
export const MIGRATIONS: Record<number, (doc: Record<string, unknown>) => Record<string, unknown>> = {};

/** Bring a raw document up to the current schema version, or say why not. */
export function migrate(raw: unknown): { ok: true; value: unknown } | { ok: false; errors: SchemaError[] } {
	if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
		return { ok: false, errors: [{ path: '(document)', message: 'a document is a JSON object' }] };
	}
	let doc = raw as Record<string, unknown>;
	const given = doc.schemaVersion;
	if (typeof given !== 'number' || !Number.isInteger(given) || given < 1) {
		return { ok: false, errors: [{ path: 'schemaVersion', message: `schemaVersion must be a whole number from 1; got ${JSON.stringify(given)}` }] };
	}
	let version: number = given;
	if (version > SCHEMA_VERSION) {
		return {
			ok: false,
			errors: [{ path: 'schemaVersion', message: `this document has schema version ${version}, newer than this app reads (${SCHEMA_VERSION}); update Loomwright` }]
		};
	}
	while (version < SCHEMA_VERSION) {
		const step = MIGRATIONS[version];
		if (!step) return { ok: false, errors: [{ path: 'schemaVersion', message: `no upgrade from schema version ${version}` }] };
		doc = step(doc);
		version = doc.schemaVersion as number;
	}
	return { ok: true, value: doc };
}

/** Parse a document from JSON text or a value; returns it typed, or every problem with its path. */
export function parseDocument(json: unknown): ParseResult {
	let raw = json;
	if (typeof json === 'string') {
		try {
			raw = JSON.parse(json);
		} catch (e) {
			return { ok: false, errors: [{ path: '(document)', message: `not valid JSON: ${(e as Error).message}` }] };
		}
	}
	const migrated = migrate(raw);
	if (!migrated.ok) return migrated;
	const shaped = DocumentShape.safeParse(migrated.value);
	if (!shaped.success) {
		return {
			ok: false,
			errors: shaped.error.issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message }))
		};
	}
	const errors = checkReferences(shaped.data);
	if (errors.length) return { ok: false, errors };
	return { ok: true, document: shaped.data };
}

/** Parse or throw an error listing every problem (for fixtures and tests). */
export function assertDocument(json: unknown): HarnessDocument {
	const r = parseDocument(json);
	if (!r.ok) throw new Error(`invalid document:\n${r.errors.map((e) => `  ${e.path}: ${e.message}`).join('\n')}`);
	return r.document;
}

/** A new empty document for a vehicle. */
export function emptyDocument(vehicle: VehicleFacts, palette: string = 'trade-letters'): HarnessDocument {
	return assertDocument({ schemaVersion: SCHEMA_VERSION, vehicle, palette, parts: [], wires: [] });
}

/** Look up a part by id, or throw naming the caller. */
export function partById(doc: HarnessDocument, id: string, caller = 'partById'): Part {
	const p = doc.parts.find((x) => x.id === id);
	if (!p) throw new Error(`${caller}: no part with id "${id}"`);
	return p;
}
