// Trace mode's state. The document store stays the one source: the scenario derives from
// the document and the restorer's settings, the tracer is prepared once per document and
// scenario, and only the cheap questions (which parts are selected, which terminal is under
// the pointer) run again when the selection or the pointer moves.
import { getContext, setContext } from 'svelte';
import { prepareTrace, type Tracer } from '$lib/circuit/trace';
import type { Scenario } from '$lib/circuit/scenario';
import type { TerminalRef } from '$lib/circuit/schema';
import type { HarnessStore } from '$lib/editor/document.svelte';
import { terminalReading, type TerminalReading } from './readings';
import { effectiveScenario, type ScenarioSettings } from './scenario';
import { canvasMarks, traceView, type CanvasMarks, type TraceView } from './view';

export type Hovered = { ref: TerminalRef; x: number; y: number };

export class TraceState {
	/** Trace mode is on (editing is off). */
	active = $state(false);
	settings: ScenarioSettings = $state.raw({ switches: {}, senders: {} });
	/** The terminal under the pointer (or focused in the panel), with where to show its reading. */
	hovered: Hovered | null = $state.raw(null);
	readonly store: HarnessStore;

	// (Closures: the store is set in the constructor, after the fields.)
	readonly scenario: Scenario = $derived.by(() => effectiveScenario(this.store.doc, this.settings));
	readonly tracer: Tracer | null = $derived.by(() => (this.active ? prepareTrace(this.store.doc, this.scenario) : null));
	readonly view: TraceView | null = $derived.by(() => (this.tracer ? traceView(this.store.doc, this.tracer, [...this.store.selection.parts]) : null));
	readonly marks: CanvasMarks | null = $derived(this.view ? canvasMarks(this.view) : null);
	readonly reading: TerminalReading | null = $derived(this.active && this.hovered ? this.read(this.hovered.ref) : null);

	constructor(store: HarnessStore) {
		this.store = store;
	}

	private read(ref: TerminalRef): TerminalReading | null {
		const part = this.store.doc.parts.find((p) => p.id === ref.part);
		if (!part || !part.terminals.includes(ref.terminal)) return null;
		return terminalReading(this.store.doc, this.scenario, ref);
	}

	setSwitch(partId: string, position: string): void {
		this.settings = { ...this.settings, switches: { ...this.settings.switches, [partId]: position } };
	}
	setSender(partId: string, position: number): void {
		this.settings = { ...this.settings, senders: { ...this.settings.senders, [partId]: position } };
	}
	setEngineRunning(on: boolean): void {
		this.settings = { ...this.settings, engineRunning: on };
	}
	/** Back to the document's default: ignition on, lights off, engine stopped. */
	reset(): void {
		this.settings = { switches: {}, senders: {} };
	}
	hover(ref: TerminalRef | null, at?: { x: number; y: number }): void {
		this.hovered = ref ? { ref, x: at?.x ?? 0, y: at?.y ?? 0 } : null;
	}
}

const KEY = Symbol('trace');

export function setTraceContext(trace: TraceState): TraceState {
	return setContext(KEY, trace);
}

/** Trace state of the drawing board around this component, if any (the canvas also works without). */
export function getTraceContext(): TraceState | undefined {
	return getContext<TraceState | undefined>(KEY);
}
