// How a wire on the canvas hands a bend the person dragged back to the document store: the
// canvas provides this to its wire edges (which xyflow renders without access to the store).
import { getContext, setContext } from 'svelte';
import type { Point } from './route';

export type WireBender = {
	/** False while the board is read-only or tracing. */
	readonly enabled: boolean;
	/** Stores the wire's new waypoints as one undoable edit. */
	bend: (wireId: string, waypoints: Point[]) => void;
};

const KEY = Symbol('wire-bender');
export const setWireBender = (bender: WireBender) => setContext(KEY, bender);
export const getWireBender = () => getContext<WireBender | undefined>(KEY);
