// The scenario trace mode shows: the document's default (ignition on, lights off, engine
// stopped) with the restorer's own settings on top, dropping any setting the document no
// longer has (a switch deleted or a position renamed while drawing).
import { defaultScenario, type Scenario } from '$lib/circuit/scenario';
import type { HarnessDocument, Part } from '$lib/circuit/schema';

export type Switch = Extract<Part, { kind: 'switch' }>;
export type Sender = Extract<Part, { kind: 'sender' }>;

export interface ScenarioSettings {
	switches: Record<string, string>;
	senders: Record<string, number>;
	engineRunning?: boolean;
}

export function switchesOf(doc: HarnessDocument): Switch[] {
	return doc.parts.filter((p): p is Switch => p.kind === 'switch');
}

export function sendersOf(doc: HarnessDocument): Sender[] {
	return doc.parts.filter((p): p is Sender => p.kind === 'sender');
}

/** The ignition switch (role "ignition"), for the shortcut at the top of the panel. */
export function ignitionOf(doc: HarnessDocument): Switch | undefined {
	return switchesOf(doc).find((p) => p.params.role === 'ignition');
}

/** Default scenario plus the settings that still fit the document. */
export function effectiveScenario(doc: HarnessDocument, settings: ScenarioSettings): Scenario {
	const s = defaultScenario(doc);
	for (const sw of switchesOf(doc)) {
		const want = settings.switches[sw.id];
		if (want !== undefined && sw.params.positions.some((p) => p.name === want)) s.switches[sw.id] = want;
	}
	for (const se of sendersOf(doc)) {
		const x = settings.senders[se.id];
		if (typeof x === 'number' && x >= 0 && x <= 1) s.senders[se.id] = x;
	}
	if (settings.engineRunning !== undefined) s.engineRunning = settings.engineRunning;
	return s;
}
