// The demo vehicle's fault hunts (invented, for the demo only). The open one has a planted
// fault the README walks a new user to; the readings a meter would show for it come from the
// circuit core (what-if.ts), so the walk-through cannot drift from what the app predicts.
import type { PartMark } from '../circuit/symptoms';

export interface DemoHunt {
	title: string;
	marks: PartMark[];
	/** Switch positions over the document's default (ignition on). */
	switches?: Record<string, string>;
	/** The fault that is really there, with its size (what the meter sees, as what-if.ts names it). */
	plantedFault: string;
	/** The same fault as the plan's suspects name it (the site: a suspect stands for every size). */
	plantedSuspect: string;
	/** For a concluded hunt: days ago it was started, and what was written at the end. */
	concluded?: { daysAgo: number; conclusion: string; partsReplaced: string[] };
}

/** Both gauges low: the shared point is the stabilizer, but the fault is above it, at fuse 6's feed clip. */
export const OPEN_HUNT: DemoHunt = {
	title: 'Fuel and temperature gauges both read low',
	marks: [
		{ part: 'fuel-gauge', mark: 'reads-low' },
		{ part: 'temp-gauge', mark: 'reads-low' }
	],
	plantedFault: 'joint:w-ign-fuse:to:20',
	plantedSuspect: 'joint:w-ign-fuse:to'
};

export const PAST_HUNTS: DemoHunt[] = [
	{
		title: '30 Tail lamp, right: dead',
		marks: [
			{ part: 'tail-right', mark: 'dead' },
			{ part: 'tail-left', mark: 'normal' }
		],
		switches: { 'light-switch': 'side' },
		plantedFault: 'joint:w-e-tail-right:to:100',
		plantedSuspect: 'joint:w-e-tail-right:to',
		concluded: {
			daysAgo: 140,
			conclusion: 'Earth eyelet of the right tail lamp lead green with corrosion at earth stud 52. Cleaned stud and eyelet, fitted a new star washer, smear of petroleum jelly. Lamp full brightness.',
			partsReplaced: ['Star washer, earth stud 52']
		}
	}
];
