import { describe, expect, it } from 'vitest';
import { demoHarness } from '../circuit/demo';
import { generateHarness } from '../circuit/testing/generate';
import { exportDocument, fileName, importDocument } from './json';

describe('document file', () => {
	it('export then import gives an equal document (the demo)', () => {
		const demo = demoHarness();
		const back = importDocument(exportDocument(demo));
		expect(back.ok).toBe(true);
		if (back.ok) expect(back.document).toEqual(demo);
	});

	it('export then import gives an equal document (generated harnesses)', () => {
		for (let seed = 1; seed <= 20; seed++) {
			const { doc } = generateHarness(seed);
			const back = importDocument(exportDocument(doc));
			if (!back.ok) throw new Error(JSON.stringify(back.errors));
			expect(back.document).toEqual(doc);
		}
	});

	it('names the JSON path of every problem', () => {
		const demo = JSON.parse(exportDocument(demoHarness()));
		demo.wires[3].to.terminal = 'nowhere';
		demo.parts[2].kind = 'flux-capacitor';
		const r = importDocument(JSON.stringify(demo));
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors.map((e) => e.path)).toContain('parts[2].kind');
		// Shape errors come first; once the shape is right, references are checked.
		demo.parts[2].kind = demoHarness().parts[2].kind;
		const r2 = importDocument(JSON.stringify(demo));
		expect(!r2.ok && r2.errors.map((e) => e.path)).toEqual(['wires[3].to.terminal']);
	});

	it('refuses a newer schema version, an empty file and text that is not JSON', () => {
		const r = importDocument(JSON.stringify({ ...demoHarness(), schemaVersion: 99 }));
		expect(!r.ok && r.errors[0]).toMatchObject({ path: 'schemaVersion' });
		expect(importDocument('   ')).toEqual({ ok: false, errors: [{ path: '(document)', message: 'the file is empty' }] });
		expect(!importDocument('{"schemaVersion": 1,').ok).toBe(true);
	});

	it('makes plain file names', () => {
		expect(fileName('Ostrimmel Tourer — dash loom', '.loom.json')).toBe('ostrimmel-tourer-dash-loom.loom.json');
		expect(fileName('***', '.svg')).toBe('diagram.svg');
	});
});
