// The diagram document at the server's edge: validating what clients send, making a new empty
// document for a vehicle, and summarising one for the diagram page.
//
// >>> CIRCUIT CORE PLUG-IN POINT <<<
// `validateDocument` and `newDocument` are the only places the server decides what a valid
// document is; both hand over to the circuit core's schema (src/lib/circuit/schema.ts).
// Relative import: the seed script runs outside Vite, where `$lib` does not resolve.
import { checkScenario, defaultScenario, type Scenario } from '../circuit/scenario';
import { emptyDocument, parseDocument, type HarnessDocument } from '../circuit/schema';
import { BadRequest } from './http';
import { under, type Issue } from './issues';

/** What the database stores: any JSON object (old rows are read without trusting them). */
export type DiagramDocument = Record<string, unknown>;

export type DocumentResult = { ok: true; doc: HarnessDocument } | { ok: false; errors: Issue[] };

/** Parses a document (with its defaults filled in) or returns every problem with its path. */
export function validateDocument(json: unknown): DocumentResult {
	const parsed = parseDocument(json);
	if (parsed.ok) return { ok: true, doc: parsed.document };
	// The core names the whole document "(document)"; the API's paths use "" for the whole value.
	return { ok: false, errors: parsed.errors.map((e) => ({ path: e.path === '(document)' ? '' : e.path, message: e.message })) };
}

export interface VehicleFacts {
	systemVoltage: number;
	earthPolarity: 'negative' | 'positive';
}

/** An empty document carrying the vehicle's system voltage and earth polarity. */
export function newDocument(vehicle: VehicleFacts): HarnessDocument {
	const systemVoltage = vehicle.systemVoltage as 6 | 12 | 24; // the vehicles table's check allows only these
	return emptyDocument({ systemVoltage, earth: vehicle.earthPolarity });
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

/** A stored document the circuit can be computed on, or a 400 naming its problems under "document". */
export function documentToPlan(json: unknown): HarnessDocument {
	const checked = validateDocument(json);
	if (!checked.ok) throw new BadRequest('The diagram has problems; fix them in the editor first.', checked.errors.map((e) => ({ path: under('document', e.path), message: e.message })));
	return checked.doc;
}

/** The scenario sent (the document's default when none), or a 400 naming its problems under "scenario". */
export function scenarioToPlan(doc: HarnessDocument, raw: unknown): Scenario {
	const sc = checkScenario(doc, raw ?? defaultScenario(doc));
	if (!sc.ok) throw new BadRequest('The scenario has problems.', sc.errors.map((e) => ({ path: under('scenario', e.path), message: e.message })));
	return sc.scenario;
}
