// The account's palette library over HTTP: list, create, read, full replace, delete; problems
// named by field path; signed out 401; another account's palette 404 (OWASP ASVS 4.0.3 §4.2.1:
// never reveal that it exists); a diagram that copied a palette in keeps reading the same.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { asPalette } from '../../src/lib/editor/palette-input';
import { api, signedInAccount, type SignedIn } from './helpers';

// Codes and colour names of IEC 60757 (code for designation of colours): GN green, YE yellow,
// BK black, RD red. Screen colours are our own renderings.
const iecFour = [
	{ code: 'GN', name: 'green', display: '#2e7d32' },
	{ code: 'YE', name: 'yellow', display: '#fbc02d' },
	{ code: 'BK', name: 'black', display: '#1a1a1a' },
	{ code: 'RD', name: 'red', display: '#d32f2f' }
];

let owner: SignedIn;
let stranger: SignedIn;

beforeAll(async () => {
	owner = await signedInAccount('Palette Keeper');
	stranger = await signedInAccount('Palette Stranger');
});

afterAll(async () => {
	await db.$client.end();
});

describe('creating and listing', () => {
	it('creates a palette, lists it by name and reads it back unchanged', async () => {
		const made = await api('POST', '/api/palettes', owner.cookie, { name: '  Workshop manual codes ', colours: iecFour });
		expect(made.status).toBe(201);
		// The name is trimmed; the colours are kept in the order given.
		expect(made.body.palette).toMatchObject({ name: 'Workshop manual codes', colours: iecFour });
		const other = await api('POST', '/api/palettes', owner.cookie, { name: 'Auxiliary loom', colours: [iecFour[2]] });
		expect(other.status).toBe(201);

		const list = await api('GET', '/api/palettes', owner.cookie);
		expect(list.status).toBe(200);
		expect(list.body.palettes.map((p: { name: string }) => p.name)).toEqual(['Auxiliary loom', 'Workshop manual codes']);
		const one = await api('GET', `/api/palettes/${made.body.palette.id}`, owner.cookie);
		expect(one.status).toBe(200);
		expect(one.body.palette.colours).toEqual(iecFour);
	});

	it('names every problem by its path: a code defined twice, a bad screen colour, no name', async () => {
		// Row 4 repeats row 2's code "GB" in lower case: codes are read without regard to case.
		const colours = [
			{ code: 'G', name: 'green', display: '#2e7d32' },
			{ code: 'GB', name: 'green-black', display: '#2e7d32' },
			{ code: 'B', name: 'black', display: '#1a1a1a' },
			{ code: 'GB', name: 'grey-blue', display: '#12345' }
		];
		const r = await api('POST', '/api/palettes', owner.cookie, { name: '', colours });
		expect(r.status).toBe(400);
		expect(r.body.error).toBe('Some fields need fixing.');
		expect(r.body.issues).toEqual(
			expect.arrayContaining([
				{ path: 'name', message: 'A palette needs a name.' },
				{ path: 'colours[3].display', message: 'A screen colour is written #rrggbb, e.g. #2e7d32.' }
			])
		);
		const fixed = await api('POST', '/api/palettes', owner.cookie, { name: 'Twice', colours: colours.map((c) => ({ ...c, display: '#333333' })) });
		expect(fixed.status).toBe(400);
		expect(fixed.body.issues).toEqual([{ path: 'colours[3].code', message: '"GB" is defined twice (also row 2)' }]);
	});

	it('refuses codes that are not letters, an empty list, and a body that is not JSON', async () => {
		const digits = await api('POST', '/api/palettes', owner.cookie, { name: 'Numbers', colours: [{ code: '12', name: 'twelve', display: '#000000' }] });
		expect(digits.status).toBe(400);
		expect(digits.body.issues).toEqual([{ path: 'colours[0].code', message: 'A code is letters only, e.g. G or GN.' }]);
		const empty = await api('POST', '/api/palettes', owner.cookie, { name: 'Nothing', colours: [] });
		expect(empty.body.issues).toEqual([{ path: 'colours', message: 'A palette needs at least one colour.' }]);
		const junk = await api('POST', '/api/palettes', owner.cookie, '{"name": ');
		expect(junk.status).toBe(400);
		expect(junk.body.error).toBe('The request body is not valid JSON.');
	});

	it('answers 409 naming the field when the account already has a palette of that name', async () => {
		expect((await api('POST', '/api/palettes', owner.cookie, { name: 'Only once', colours: iecFour })).status).toBe(201);
		const again = await api('POST', '/api/palettes', owner.cookie, { name: 'Only once', colours: iecFour });
		expect(again.status).toBe(409);
		expect(again.body.issues).toEqual([{ path: 'name', message: 'You already have a palette named “Only once”. Choose another name.' }]);
		// Another account may use the same name: names are unique per account only.
		expect((await api('POST', '/api/palettes', stranger.cookie, { name: 'Only once', colours: iecFour })).status).toBe(201);
	});
});

describe('replacing and deleting', () => {
	it('PUT replaces the whole palette (colours left out are gone), and a clash of names is 409', async () => {
		const made = await api('POST', '/api/palettes', owner.cookie, { name: 'Draft', colours: iecFour });
		const id = made.body.palette.id;
		const put = await api('PUT', `/api/palettes/${id}`, owner.cookie, { name: 'Final', colours: [iecFour[3], iecFour[0]] });
		expect(put.status).toBe(200);
		const back = await api('GET', `/api/palettes/${id}`, owner.cookie);
		expect(back.body.palette).toMatchObject({ name: 'Final', colours: [iecFour[3], iecFour[0]] });
		expect((await api('PUT', `/api/palettes/${id}`, owner.cookie, { name: 'Only once', colours: iecFour })).status).toBe(409);
		const partial = await api('PUT', `/api/palettes/${id}`, owner.cookie, { name: 'No colours' });
		expect(partial.status).toBe(400);
		expect(partial.body.issues).toEqual([{ path: 'colours', message: 'A palette needs a list of colours.' }]);
	});

	it('deletes a palette; a diagram that copied it in still reads the same codes', async () => {
		const made = await api('POST', '/api/palettes', owner.cookie, { name: 'Short-lived', colours: iecFour });
		const v = await api('POST', '/api/vehicles', owner.cookie, { name: 'Palette Ostrimmel', systemVoltage: 12, earthPolarity: 'negative' });
		// A GN/YE wire (green with yellow tracer, IEC 60757) between an invented lamp and earth point.
		const document = {
			schemaVersion: 1,
			vehicle: { systemVoltage: 12, earth: 'negative' },
			palette: asPalette(made.body.palette),
			parts: [
				{ id: 'lamp', key: '9', kind: 'lamp' },
				{ id: 'earth', key: '10', kind: 'earth-point' }
			],
			wires: [{ id: 'w1', from: { part: 'lamp', terminal: 'earth' }, to: { part: 'earth', terminal: 'stud' }, code: 'GN/YE' }]
		};
		const d = await api('POST', '/api/diagrams', owner.cookie, { vehicleId: v.body.vehicle.id, title: 'Copied palette', document });
		expect(d.status).toBe(201);
		expect((await api('DELETE', `/api/palettes/${made.body.palette.id}`, owner.cookie)).status).toBe(204);
		expect((await api('GET', `/api/palettes/${made.body.palette.id}`, owner.cookie)).status).toBe(404);
		const after = await api('GET', `/api/diagrams/${d.body.diagram.id}`, owner.cookie);
		expect(after.body.diagram.document.palette).toEqual({ id: `account-${made.body.palette.id}`, name: 'Short-lived', colours: iecFour });
		expect(after.body.diagram.document.wires[0].code).toBe('GN/YE');
	});
});

describe('access', () => {
	it('is 401 signed out and 404 for another account, which never sees it listed', async () => {
		const made = await api('POST', '/api/palettes', owner.cookie, { name: 'Private codes', colours: iecFour });
		const id = made.body.palette.id;
		expect((await api('GET', '/api/palettes', null)).status).toBe(401);
		expect((await api('POST', '/api/palettes', null, { name: 'x', colours: iecFour })).status).toBe(401);
		expect((await api('GET', `/api/palettes/${id}`, null)).status).toBe(401);
		for (const [method, body] of [['GET', undefined], ['PUT', { name: 'Mine now', colours: iecFour }], ['DELETE', undefined]] as const) {
			const r = await api(method, `/api/palettes/${id}`, stranger.cookie, body);
			expect(r.status, method).toBe(404);
		}
		const theirs = await api('GET', '/api/palettes', stranger.cookie);
		expect(theirs.body.palettes.map((p: { id: string }) => p.id)).not.toContain(id);
		// Untouched by the stranger's PUT and DELETE.
		expect((await api('GET', `/api/palettes/${id}`, owner.cookie)).body.palette.name).toBe('Private codes');
		// A malformed id names nothing: the same 404, not a database error.
		expect((await api('GET', '/api/palettes/not-a-uuid', owner.cookie)).status).toBe(404);
	});
});
