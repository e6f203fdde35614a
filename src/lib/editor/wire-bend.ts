// How a wire on the canvas hands a bend the person dragged back to the document store: the
// canvas provides this to its wire edges (which xyflow renders without access to the store).
import { getContext, setContext } from 'svelte';
import type { Point } from './route';

export type WireBender = {
	/** False while the board is read-only or tracing. */
	readonly enabled: boolean;
	/**
	 * Stores the wire's new waypoints as one undoable edit; edits with the same `mergeKey` in a
	 * row (arrow-key steps on one run) are one undo step.
	 */
	bend: (wireId: string, waypoints: Point[], mergeKey?: string) => void;
	/** Ends a run of merged edits (the run's handle lost focus). */
	seal: () => void;
};

const KEY = Symbol('wire-bender');
export const setWireBender = (bender: WireBender) => setContext(KEY, bender);
export const getWireBender = () => getContext<WireBender | undefined>(KEY);
