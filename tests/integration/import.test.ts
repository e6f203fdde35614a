// CSV wire-list import through the API of the built server: the demo vehicle's CSV becomes a
// document the circuit core parses with the same parts and wires; the file with planted errors
// (fixtures/bad-wire-list.md) reports each at its row and column and saves nothing until the
// good rows are confirmed, which makes exactly one revision. JSON export → import as a new
// diagram gives an equal document.
import { readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '../../src/lib/circuit/demo';
import { parseDocument, type HarnessDocument } from '../../src/lib/circuit/schema';
import { exportDocument } from '../../src/lib/harness-io/json';
import { db } from '../../src/lib/server/db';
import { diagramRevisions } from '../../src/lib/server/db/schema';
import { api as call, signedInAccount as account } from './helpers';

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/${name}`, import.meta.url));

/** What a CSV carries of a document: parts by key, wires by their ends' keys. */
function byKeys(doc: HarnessDocument) {
	const key = new Map(doc.parts.map((p) => [p.id, p.key]));
	return {
		parts: doc.parts.map((p) => ({ key: p.key, kind: p.kind, label: p.label, location: p.location, terminals: p.terminals })).sort((a, b) => a.key.localeCompare(b.key)),
		wires: doc.wires
			.map((w) => ({ from: `${key.get(w.from.part)}.${w.from.terminal}`, to: `${key.get(w.to.part)}.${w.to.terminal}`, code: w.code, size: w.size, lengthM: w.lengthM }))
			.sort((a, b) => (a.from + a.to).localeCompare(b.from + b.to))
	};
}

let owner: { id: string; cookie: string };
let vehicleId: string;

async function newDiagram(title: string, document?: unknown) {
	const d = await call('POST', '/api/diagrams', owner.cookie, { vehicleId, title, ...(document ? { document } : {}) });
	expect(d.status).toBe(201);
	return d.body.diagram as { id: string; revision: number; document: unknown };
}

async function revisionsOf(id: string) {
	return db.select().from(diagramRevisions).where(eq(diagramRevisions.diagramId, id));
}

beforeAll(async () => {
	owner = await account('Importer');
	const v = await call('POST', '/api/vehicles', owner.cookie, { name: 'Test Tourer', systemVoltage: 12, earthPolarity: 'positive' });
	expect(v.status).toBe(201);
	vehicleId = v.body.vehicle.id;
});

describe('CSV wire-list import', () => {
	it('imports the demo vehicle’s CSV as a document with the same parts and wires, in one revision', async () => {
		const diagram = await newDiagram('From CSV');
		const csv = fixture('demo-harness.csv');
		const preview = await call('POST', `/api/diagrams/${diagram.id}/import`, owner.cookie, { base64: csv.toString('base64') });
		expect(preview.status).toBe(200);
		expect(preview.body.preview.issues).toEqual([]);
		const demo = demoHarness();
		expect(preview.body.preview.summary.addedParts).toHaveLength(demo.parts.length);
		expect(preview.body.preview.summary.addedWires).toBe(demo.wires.length);
		// A preview saves nothing.
		expect((await call('GET', `/api/diagrams/${diagram.id}`, owner.cookie)).body.diagram.revision).toBe(1);

		const done = await call('POST', `/api/diagrams/${diagram.id}/import`, owner.cookie, { base64: csv.toString('base64'), confirm: true, revision: 1 });
		expect(done.status).toBe(200);
		expect(done.body.diagram.revision).toBe(2);
		const parsed = parseDocument(done.body.diagram.document);
		expect(parsed.ok).toBe(true);
		if (!parsed.ok) return;
		// The independent reference is the core's own demo document (what the CSV was written from).
		expect(byKeys(parsed.document)).toEqual(byKeys(demo));
		expect((await revisionsOf(diagram.id)).map((r) => r.revision).sort()).toEqual([1, 2]);

		// A confirm that names the old revision is refused (409) and changes nothing.
		const stale = await call('POST', `/api/diagrams/${diagram.id}/import`, owner.cookie, { base64: csv.toString('base64'), confirm: true, revision: 1 });
		expect(stale.status).toBe(409);
		expect(stale.body.revision).toBe(2);
	});

	// Each planted error, as documented row by row in fixtures/bad-wire-list.md.
	const planted: [number, string][] = [
		[7, 'kind'],
		[8, 'location'],
		[15, 'from part'],
		[16, 'colour'],
		[17, 'from terminal'],
		[18, 'size'],
		[19, 'length'],
		[20, 'from part'],
		[21, 'from part'],
		[22, 'field 9'],
		[23, 'field 1']
	];

	it('reports every planted error with its row and column and saves nothing', async () => {
		const diagram = await newDiagram('Bad CSV');
		const base64 = fixture('bad-wire-list.csv').toString('base64');
		const preview = await call('POST', `/api/diagrams/${diagram.id}/import`, owner.cookie, { base64 });
		expect(preview.status).toBe(200);
		const issues = preview.body.preview.issues as { row: number; column: string; message: string; expected: string }[];
		expect(issues.map((i) => [i.row, i.column])).toEqual(planted);
		for (const i of issues) {
			expect(i.message).not.toBe('');
			expect(i.expected).not.toBe('');
		}
		expect(preview.body.preview.separator).toBe(';');
		// bad-wire-list.md: part rows 2–6 and wire rows 11–14 are good.
		expect(preview.body.preview.goodRows).toBe(9);

		// Confirming without "good rows only" is refused with the problems; nothing changes.
		const refused = await call('POST', `/api/diagrams/${diagram.id}/import`, owner.cookie, { base64, confirm: true, revision: 1 });
		expect(refused.status).toBe(400);
		expect(refused.body.issues).toHaveLength(planted.length);
		expect(refused.body.issues[0].path).toBe('row 7, kind');
		const after = await call('GET', `/api/diagrams/${diagram.id}`, owner.cookie);
		expect(after.body.diagram.revision).toBe(1);
		expect(after.body.diagram.document).toEqual(diagram.document);
		expect(await revisionsOf(diagram.id)).toHaveLength(1);

		// The good rows only: parts 1–5 and the four wires of the lamp circuit, one revision.
		const good = await call('POST', `/api/diagrams/${diagram.id}/import`, owner.cookie, { base64, confirm: true, validOnly: true, revision: 1 });
		expect(good.status).toBe(200);
		expect(good.body.diagram.revision).toBe(2);
		const doc = good.body.diagram.document as HarnessDocument;
		expect(doc.parts.map((p) => `${p.key}:${p.kind}`)).toEqual(['1:battery', '2:earth-point', '3:fuse', '4:switch', '5:lamp']);
		// Decimal commas in the file: 0,8 m and 0,75 mm² (row 11, row 13).
		expect(byKeys(doc).wires).toEqual([
			{ from: '1.+', to: '3.in', code: 'N', size: { mm2: 2 }, lengthM: 0.8 },
			{ from: '3.out', to: '4.1', code: 'P', size: { mm2: 1 }, lengthM: 1.2 },
			{ from: '4.2', to: '5.feed', code: 'R', size: { mm2: 0.75 }, lengthM: 3.5 },
			{ from: '5.earth', to: '2.stud', code: 'B', size: { mm2: 0.75 }, lengthM: 0.4 }
		]);
		expect(await revisionsOf(diagram.id)).toHaveLength(2);
	});

	it('needs edit access: another account gets 404', async () => {
		const diagram = await newDiagram('Private');
		const stranger = await account('Stranger');
		const r = await call('POST', `/api/diagrams/${diagram.id}/import`, stranger.cookie, { text: 'a,b\n' });
		expect(r.status).toBe(404);
	});
});

describe('JSON document round trip', () => {
	it('export then import as a new diagram gives an equal document', async () => {
		const first = await newDiagram('Original', demoHarness());
		const fetched = await call('GET', `/api/diagrams/${first.id}`, owner.cookie);
		const file = exportDocument(fetched.body.diagram.document);
		const copy = await newDiagram('Imported copy', JSON.parse(file));
		const again = await call('GET', `/api/diagrams/${copy.id}`, owner.cookie);
		expect(again.body.diagram.document).toEqual(fetched.body.diagram.document);
		expect(again.body.diagram.document).toEqual(JSON.parse(exportDocument(demoHarness())));
	});

	it('an invalid document file gets errors with JSON paths', async () => {
		const bad = JSON.parse(exportDocument(demoHarness()));
		bad.wires[2].from.terminal = 'nowhere';
		const r = await call('POST', '/api/diagrams', owner.cookie, { vehicleId, title: 'Bad', document: bad });
		expect(r.status).toBe(400);
		expect(r.body.issues.map((i: { path: string }) => i.path)).toEqual(['document.wires[2].from.terminal']);
	});
});
