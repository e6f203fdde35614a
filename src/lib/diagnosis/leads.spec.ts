// Where the leads go, in words, on the invented demo harness: the diagnosis page and the printed
// checklist both take them from leads.ts.
import { describe, expect, it } from 'vitest';
import { demoHarness } from '$lib/circuit/demo';
import { defaultScenario } from '$lib/circuit/scenario';
import { leadWords } from './leads';
import { planDiagnosis } from './session';

const doc = demoHarness();
const { result } = planDiagnosis(doc, { scenario: defaultScenario(doc), marks: [{ part: 'fuel-gauge', mark: 'reads-low' }], meter: 'entry-dmm' }, []);
const probe = (id: string) => {
	const p = result.probes.find((x) => x.id === id);
	if (!p) throw new Error(`no probe ${id}`);
	return p;
};

describe('leadWords', () => {
	it('puts a volt drop across a joint between the terminal and the wire just behind its crimp (common practice)', () => {
		const words = leadWords(probe('joint:w-ign-fuse:to'), doc);
		expect(words.red).toBe('6 Fuse, ignition accessories, terminal in');
		expect(words.black).toBe('Black lead on wire W, just behind its crimp at terminal in');
		// Not the same words for both leads.
		expect(words.black).not.toContain(words.red);
	});

	it('puts the black lead of a volts-to-earth probe where the planner says: the battery\u2019s earthed post', () => {
		const words = leadWords(probe('volts:fuse-ign:out'), doc);
		expect(words.red).toBe('6 Fuse, ignition accessories, terminal out');
		expect(words.black).toBe('Black lead on the battery\u2019s earthed + post (positive earth: feeds read negative)');
	});

	it('keeps the planner\u2019s own sentence for the black lead when it gave one', () => {
		const p = { place: probe('volts:fuse-ign:out').place, conditions: ['Ignition on', 'Black lead on the stud beside the part'] };
		expect(leadWords(p, doc)).toMatchObject({ black: 'Black lead on the stud beside the part', blackFromConditions: 'Black lead on the stud beside the part' });
	});
});
