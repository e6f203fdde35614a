// The diagram document at the server's edge: validating what clients send, making a new empty
// document for a vehicle, and summarising one for the diagram page.
//
// >>> CIRCUIT CORE PLUG-IN POINT <<<
// `validateDocument` and `newDocument` are the only places the server decides what a valid
// document is. When src/lib/circuit/schema.ts exports `parseDocument` and `emptyDocument`, call
// them here and nowhere else; until then a document must be a JSON object whose `parts` and
// `wires`, where present, are lists.
import { z } from 'zod';
import { fromZod, type Issue } from './issues';

export type DiagramDocument = Record<string, unknown>;

export type DocumentResult = { ok: true; doc: DiagramDocument } | { ok: false, errors: Issue[] };

const interimDocument = z.looseObject({
	schemaVersion: z.number().int().positive().optional(),
	vehicle: z
		.looseObject({
			systemVoltage: z.union([z.literal(6), z.literal(12), z.literal(24)]).optional(),
			earth: z.enum(['negative', 'positive']).optional()
		})
		.optional(),
	parts: z.array(z.unknown()).optional(),
	wires: z.array(z.unknown()).optional()
});

export function validateDocument(json: unknown): DocumentResult {
	if (typeof json !== 'object' || json === null || Array.isArray(json)) {
		return { ok: false, errors: [{ path: '', message: 'A diagram document must be a JSON object.' }] };
	}
	const parsed = interimDocument.safeParse(json);
	if (!parsed.success) return { ok: false, errors: fromZod(parsed.error) };
	return { ok: true, doc: parsed.data };
}

export interface VehicleFacts {
	systemVoltage: number;
	earthPolarity: 'negative' | 'positive';
}

/** An empty document carrying the vehicle's system voltage and earth polarity. */
export function newDocument(vehicle: VehicleFacts): DiagramDocument {
	return {
		schemaVersion: 1,
		vehicle: { systemVoltage: vehicle.systemVoltage, earth: vehicle.earthPolarity },
		parts: [],
		wires: []
	};
}
// >>> END OF PLUG-IN POINT <<<

export interface DocumentSummary {
	schemaVersion: number | null;
	systemVoltage: number | null;
	earth: string | null;
	parts: number;
	wires: number;
	/** Parts counted by kind, largest first: [["lamp", 6], ["fuse", 2]]. */
	kinds: [string, number][];
}

function list(value: unknown): unknown[] {
	return Array.isArray(value) ? value : [];
}

/** Reads counts from any document shape without trusting it (the page shows what is there). */
export function summarise(doc: unknown): DocumentSummary {
	const d = (typeof doc === 'object' && doc !== null ? doc : {}) as Record<string, unknown>;
	const vehicle = (typeof d.vehicle === 'object' && d.vehicle !== null ? d.vehicle : {}) as Record<string, unknown>;
	// The circuit core may name its parts list "components".
	const parts = list(d.parts ?? d.components);
	const counts = new Map<string, number>();
	for (const part of parts) {
		const kind = typeof part === 'object' && part !== null && typeof (part as { kind?: unknown }).kind === 'string'
			? (part as { kind: string }).kind
			: 'other';
		counts.set(kind, (counts.get(kind) ?? 0) + 1);
	}
	return {
		schemaVersion: typeof d.schemaVersion === 'number' ? d.schemaVersion : null,
		systemVoltage: typeof vehicle.systemVoltage === 'number' ? vehicle.systemVoltage : null,
		earth: typeof vehicle.earth === 'string' ? vehicle.earth : null,
		parts: parts.length,
		wires: list(d.wires).length,
		kinds: [...counts.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))
	};
}
