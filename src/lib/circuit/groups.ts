/**
 * Suspects that no probe can tell apart, said as one job in the restorer's words: what to do
 * with every place of the group ("clean and re-make all three"), on the page, in the checklist and
 * in the conclusion. Which job suits which fault is common practice: a corroded or loose joint,
 * pin, earth, fuse holder or contact is cleaned and re-made; a broken wire repaired; a chafed
 * short found and re-insulated; a failed part bench-tested or replaced.
 */
import type { FaultKind } from './faults';
import { noun } from '../words';

export type Job = 'remake' | 'repair-wire' | 'insulate' | 'replace' | 'battery';

export function jobOf(kind: FaultKind | 'double'): Job {
	if (kind === 'battery:discharged') return 'battery';
	if (kind === 'wire:open') return 'repair-wire';
	if (kind === 'node:short') return 'insulate';
	if (/^(joint|earth-point|connector|fuse:resistive|switch:contact-(resistive|open)|relay:contact)/.test(kind)) return 'remake';
	return 'replace';
}

const JOB_TEXT: Record<Job, (n: number) => string> = {
	remake: (n) => (n === 2 ? 'clean and re-make both' : noun(n, 'clean and re-make it', `clean and re-make all ${n}`)),
	'repair-wire': (n) => noun(n, 'repair or replace the wire', 'repair or replace the wires'),
	insulate: (n) => noun(n, 'find the chafe and re-insulate it', 'find the chafe and re-insulate'),
	replace: (n) => noun(n, 'bench-test or replace it', 'bench-test or replace each'),
	battery: () => 'charge and test the battery'
};

/** One sentence for a group: its places, then the job for each kind of fault among them. */
export function groupAction(suspects: readonly { label: string; kind: FaultKind | 'double' }[]): string {
	const byJob = new Map<Job, string[]>();
	for (const s of suspects) {
		const job = jobOf(s.kind);
		(byJob.get(job) ?? byJob.set(job, []).get(job)!).push(s.label.replace(/\.$/, ''));
	}
	return [...byJob]
		.map(([job, labels]) => `${labels.join('; ')}: ${JOB_TEXT[job](labels.length)}`)
		.join('. ')
		.concat('.');
}
