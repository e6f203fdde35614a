import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import type { TracePoint } from '$lib/circuit/trace';
import { pointName, sharedSentence } from './words';

const doc = demoHarness();

describe('pointName', () => {
	// Expected names worked by hand from the demo's key numbers and labels (src/lib/circuit/demo.ts).
	const cases: [TracePoint, string][] = [
		[{ type: 'node', node: 'stabilizer:out', terminals: [{ part: 'stabilizer', terminal: 'out' }] }, 'terminal out of 19 Instrument voltage stabilizer'],
		[{ type: 'node', node: 'feed-splice', terminals: [{ part: 'feed-splice', terminal: '1' }, { part: 'feed-splice', terminal: '2' }] }, '5 Battery feed splice'],
		[{ type: 'node', node: 'chassis', terminals: [] }, 'the chassis (body) earth'],
		[{ type: 'wire', wire: 'w-stab-in' }, 'wire G from 6 out to 19 in'],
		[{ type: 'part', part: 'fuse-ign' }, '6 Fuse, ignition accessories'],
		[{ type: 'part', part: 'ignition', contact: ['30', '15'] }, 'contacts 30–15 of 10 Ignition and starter switch']
	];
	it.each(cases)('%j → %s', (point, name) => expect(pointName(doc, point)).toBe(name));
});

describe('sharedSentence', () => {
	const fuse: TracePoint = { type: 'part', part: 'fuse-ign' };
	const cases: [Parameters<typeof sharedSentence>[1], string][] = [
		[
			{ side: 'feed', parts: ['fuel-gauge', 'temp-gauge', 'brake-left'], nearest: fuse, unreached: [] },
			'All three get their feed through 6 Fuse, ignition accessories; a fault there or above it explains all 3.'
		],
		[
			{ side: 'feed', parts: ['fuel-gauge', 'horn'], nearest: null, unreached: [] },
			'Both are fed straight from the battery by separate ways: no shared feed point explains them, so look for separate faults, or at the battery and its main cable.'
		],
		[
			{ side: 'earth', parts: ['side-left', 'side-right'], nearest: { type: 'part', part: 'front-earth' }, unreached: [] },
			'Both return to earth through 48 Front lamp earth; a fault there or between it and the battery explains both.'
		],
		[
			{ side: 'feed', parts: ['fuel-gauge', 'temp-gauge', 'horn'], nearest: fuse, unreached: ['horn'] },
			'Both get their feed through 6 Fuse, ignition accessories; a fault there or above it explains both. No feed path at all reaches 41 Horn.'
		]
	];
	it.each(cases)('%j', (input, sentence) => expect(sharedSentence(doc, input)).toBe(sentence));
});
