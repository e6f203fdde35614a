// Malformed input over the save, import and form endpoints: generated from a small set of
// hostile values (text PostgreSQL cannot store: NUL U+0000 and lone UTF-16 surrogates, PostgreSQL
// manual §8.3 and §8.14; nesting far past any document's; broken JSON, RFC 8259), each put in
// every field an endpoint takes. Every answer must be below 500, every refusal must name the
// field or row, and nothing stored may change.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '../../src/lib/circuit/demo';
import { db } from '../../src/lib/server/db';
import { baseUrl } from './helpers';
import { api, form, get, person, type Person } from './people';

const HOSTILE = ['a\u0000b', '\u0000', 'lead\ud800', '\udc00tail', '\udfff\ud800', 'ok\u0000\ud83d'];

/** `levels` objects inside each other, as JSON text (JSON.stringify itself overflows its stack on thousands). */
const nested = (levels: number) => '{"m":'.repeat(levels) + '"bottom"' + '}'.repeat(levels);
const withNested = (value: object, levels: number) => JSON.stringify(value).replace('"@nested@"', nested(levels));

interface Case {
	label: string;
	send: () => Promise<Response>;
	/** Words the refusal must contain: the field or row it is about. */
	names: string;
}

let owner: Person;
let vehicleId: string;
let diagramId: string;
const cases: Case[] = [];

async function snapshot(): Promise<string> {
	const [vehicles, diagram, palettes, comments, clubs, links] = await Promise.all([
		api('GET', '/api/vehicles', owner.cookie).then((r) => r.text()),
		api('GET', `/api/diagrams/${diagramId}`, owner.cookie).then((r) => r.text()),
		api('GET', '/api/palettes', owner.cookie).then((r) => r.text()),
		api('GET', `/api/diagrams/${diagramId}/comments`, owner.cookie).then((r) => r.text()),
		db.execute(sql`select count(*)::int as n from clubs`).then((r) => JSON.stringify(r)),
		db.execute(sql`select count(*)::int as n from share_links where diagram_id = ${diagramId}`).then((r) => JSON.stringify(r))
	]);
	return [vehicles, diagram, palettes, comments, clubs, links].join('\n');
}

const jsonText = (method: string, path: string, text: string) => () =>
	fetch(baseUrl() + path, { method, headers: { cookie: owner.cookie, origin: baseUrl(), 'content-type': 'application/json', accept: 'application/json' }, body: text });

beforeAll(async () => {
	owner = await person('Fuzz Owner');
	const made = await api('POST', '/api/vehicles', owner.cookie, { name: 'Fuzz car', make: 'Corvell', model: 'Stanway Six', year: '1954', systemVoltage: 12, earthPolarity: 'positive' });
	expect(made.status).toBe(201);
	vehicleId = (await made.json()).vehicle.id;
	const diagram = await api('POST', '/api/diagrams', owner.cookie, { vehicleId, title: 'Fuzz harness', document: demoHarness() });
	expect(diagram.status).toBe(201);
	diagramId = (await diagram.json()).diagram.id;

	const vehicle = { name: 'Fuzz car 2', make: 'M', model: 'N', year: '1960', systemVoltage: 12, earthPolarity: 'negative', notes: '' };
	for (const bad of HOSTILE) {
		for (const field of ['name', 'make', 'model', 'year', 'notes'] as const) {
			cases.push({ label: `POST /api/vehicles ${field}=${JSON.stringify(bad)}`, send: () => api('POST', '/api/vehicles', owner.cookie, { ...vehicle, [field]: bad }), names: field });
			cases.push({ label: `PATCH /api/vehicles ${field}`, send: () => api('PATCH', `/api/vehicles/${vehicleId}`, owner.cookie, { [field]: bad }), names: field });
			// A form's encoding (URL-encoded UTF-8, WHATWG URL §5.2) turns a lone surrogate into U+FFFD
			// before it leaves the client, so forms get the NUL values only.
			if (bad.includes('\u0000')) cases.push({ label: `form garage create ${field}`, send: () => form('/garage?/create', { ...vehicle, systemVoltage: '12', [field]: bad }, owner.cookie), names: field });
		}
		cases.push({ label: 'POST /api/palettes name', send: () => api('POST', '/api/palettes', owner.cookie, { name: bad, colours: [{ code: 'G', name: 'green', display: '#2e7d32' }] }), names: 'name' });
		cases.push({ label: 'POST /api/palettes colour name', send: () => api('POST', '/api/palettes', owner.cookie, { name: 'P', colours: [{ code: 'G', name: bad, display: '#2e7d32' }] }), names: 'colours[0].name' });
		cases.push({ label: 'POST comment body', send: () => api('POST', `/api/diagrams/${diagramId}/comments`, owner.cookie, { body: bad }), names: 'body' });
		cases.push({ label: 'PUT diagram title', send: () => api('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: 1, title: bad, document: demoHarness() }), names: 'title' });
		// A hostile string in every part's and wire's text fields of a saved document.
		const doc = demoHarness() as unknown as { parts: Record<string, unknown>[]; wires: Record<string, unknown>[] };
		for (let i = 0; i < 3; i++) {
			for (const key of Object.keys(doc.parts[i]).filter((k) => typeof doc.parts[i][k] === 'string')) {
				const d = structuredClone(doc);
				d.parts[i][key] = bad;
				cases.push({ label: `PUT document parts[${i}].${key}`, send: () => api('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: 1, document: d }), names: `parts[${i}].${key}` });
			}
			for (const key of Object.keys(doc.wires[i]).filter((k) => typeof doc.wires[i][k] === 'string')) {
				const d = structuredClone(doc);
				d.wires[i][key] = bad;
				cases.push({ label: `PUT document wires[${i}].${key}`, send: () => api('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: 1, document: d }), names: `wires[${i}].${key}` });
			}
		}
		cases.push({ label: 'PUT document meta key', send: () => api('PUT', `/api/diagrams/${diagramId}`, owner.cookie, { revision: 1, document: { ...demoHarness(), meta: { [bad]: 1 } } }), names: 'meta' });
		cases.push({ label: 'POST new diagram document meta', send: () => api('POST', '/api/diagrams', owner.cookie, { vehicleId, title: 'x', document: { ...demoHarness(), meta: { note: bad } } }), names: 'meta.note' });
		// The wire-list import: a bad character on a row, as text and as UTF-8 bytes.
		for (const row of [2, 3]) {
			const lines = ['from,to,colour', '1.30,2.1,G/B', '3.15,4.2,R'];
			lines[row - 1] = lines[row - 1].replace(',', `${bad},`);
			const text = lines.join('\n');
			cases.push({ label: `import text row ${row}`, send: () => api('POST', `/api/diagrams/${diagramId}/import`, owner.cookie, { text, confirm: true, validOnly: true, revision: 1 }), names: `row ${row}` });
			if (!/[\ud800-\udfff]/.test(bad)) {
				const base64 = Buffer.from(text, 'utf8').toString('base64');
				cases.push({ label: `import base64 row ${row}`, send: () => api('POST', `/api/diagrams/${diagramId}/import`, owner.cookie, { base64, confirm: true, validOnly: true, revision: 1 }), names: `row ${row}` });
			}
		}
		for (const [path, fields] of [
			['/clubs?/create', { name: bad, description: '' }],
			['/clubs?/create', { name: 'Fuzz club', description: bad }],
			[`/diagrams/${diagramId}/share?/link`, { label: bad }],
			[`/diagrams/${diagramId}?/rename`, { title: bad }],
			[`/diagrams/${diagramId}/comments`, { body: bad }]
		] as [string, Record<string, string>][]) {
			const field = Object.entries(fields).find(([, v]) => v === bad)![0];
			if (bad.includes('\u0000')) cases.push({ label: `form ${path} ${field}`, send: () => form(path, fields, owner.cookie), names: field });
		}
	}
	// Nesting: the 5,000 levels of meta and others past the bound.
	for (const levels of [65, 100, 1000, 3000, 5000]) {
		cases.push({ label: `PUT meta nested ${levels}`, send: jsonText('PUT', `/api/diagrams/${diagramId}`, withNested({ revision: 1, document: { ...demoHarness(), meta: '@nested@' } }, levels)), names: 'meta' });
		cases.push({ label: `POST vehicle nested ${levels}`, send: jsonText('POST', '/api/vehicles', withNested({ ...vehicle, extra: '@nested@' }, levels)), names: 'extra' });
	}
	// Broken JSON on each JSON endpoint.
	for (const text of ['{', '{"name":', '[1,2', 'nul', '"\\ud800', '{"a":1}}', '\u0000', '{"name":"\\u0000"}']) {
		for (const [method, path] of [['POST', '/api/vehicles'], ['PATCH', `/api/vehicles/${vehicleId}`], ['PUT', `/api/diagrams/${diagramId}`], ['POST', `/api/diagrams/${diagramId}/import`], ['POST', '/api/palettes']] as const) {
			cases.push({ label: `${method} ${path} ${JSON.stringify(text)}`, send: jsonText(method, path, text), names: text === '{"name":"\\u0000"}' ? 'name' : 'JSON' });
		}
	}
	// Lone surrogates as raw JSON escapes (JSON.stringify never writes them unpaired in the body text).
	for (const field of ['name', 'make', 'notes']) {
		cases.push({ label: `raw escape ${field}`, send: jsonText('POST', '/api/vehicles', `{"name":"n","systemVoltage":12,"earthPolarity":"negative","${field}":"\\udead"}`), names: field });
	}
}, 60_000);

afterAll(async () => {
	await db.$client.end();
});

describe('fuzzed malformed input', () => {
	it('is at least 300 inputs', () => {
		expect(cases.length).toBeGreaterThanOrEqual(300);
	});

	it('never answers 500, names the field or row of each refusal, and changes nothing stored', async () => {
		const before = await snapshot();
		const failures: string[] = [];
		for (const c of cases) {
			const res = await c.send();
			const text = await res.text();
			if (res.status >= 500) failures.push(`${c.label}: ${res.status}`);
			else if (res.status < 400) failures.push(`${c.label}: accepted with ${res.status}`);
			else if (res.status >= 400 && !text.includes(c.names)) failures.push(`${c.label}: ${res.status} does not name ${c.names}: ${text.slice(0, 200)}`);
		}
		expect(failures).toEqual([]);
		expect(await snapshot()).toBe(before);
	}, 240_000);

	it('a JSON body over the size limit (16M in tests, BODY_SIZE_LIMIT) sent without a length is 413, and nothing is stored', async () => {
		const before = await snapshot();
		const chunk = new TextEncoder().encode('x'.repeat(1024 * 1024));
		let sent = 0;
		const body = new ReadableStream<Uint8Array>({
			start(controller) {
				controller.enqueue(new TextEncoder().encode('{"name":"big","systemVoltage":12,"earthPolarity":"negative","notes":"'));
			},
			pull(controller) {
				if (sent++ < 17) controller.enqueue(chunk);
				else {
					controller.enqueue(new TextEncoder().encode('"}'));
					controller.close();
				}
			}
		});
		const res = await fetch(`${baseUrl()}/api/vehicles`, {
			method: 'POST',
			headers: { cookie: owner.cookie, origin: baseUrl(), 'content-type': 'application/json', accept: 'application/json' },
			body,
			duplex: 'half'
		} as RequestInit);
		expect(res.status).toBe(413);
		expect((await res.json()).error).toMatch(/larger than this server takes/);
		expect(await snapshot()).toBe(before);
	});

	it('a character above U+00FF in next= after sign-in is a redirect, not a 500', async () => {
		const res = await get('/signin?next=/garage%E2%98%8E', owner.cookie);
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/garage%E2%98%8E');
		const signedOut = await form('/signin?next=/x', { email: owner.email, password: owner.password, next: '/diagrams/☎' });
		expect(signedOut.status).toBe(303);
		expect(signedOut.headers.get('location')).toBe('/diagrams/%E2%98%8E');
	});
});
