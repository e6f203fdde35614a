// Every route under src/routes against every kind of visitor, with the status each must get.
// The routes are found by walking the folder, so a route added without an entry here fails the
// first test. Expected answers follow access.ts: no account → 401 from the API and a redirect
// (303) to sign-in from signed-in pages; cannot see → 404 (OWASP ASVS 4.0.3 §4.2.1: hide what
// exists); can see but not at that level → 403; allowed → the route's own answer (a mutating
// request sent an empty body gets 400 after the access check, so the check is what is measured).
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '../../src/lib/circuit/demo';
import { db } from '../../src/lib/server/db';
import { baseUrl } from './helpers';
import { api, form, mailTo, pathOf, person, type Person } from './people';
import { coverageProblems, walkRoutes } from './route-walk';

const ROLES = ['anonymous', 'link', 'other', 'admin', 'clubMember', 'viewer', 'commenter', 'editor', 'owner'] as const;
type Role = (typeof ROLES)[number];
type Expect = Record<Role, number>;

interface Fixture {
	vehicle: string;
	/** A second vehicle of the owner's, for the DELETE row (deleting the first would take the diagram). */
	spareVehicle: string;
	diagram: string;
	/** A second diagram shared the same way, for the DELETE row. */
	spareDiagram: string;
	page: string;
	/** A second manual page, so the editor's DELETE and the owner's each have one to delete. */
	sparePage: string;
	club: string;
	/** A palette in the owner's library, and a second one for the DELETE row. */
	palette: string;
	sparePalette: string;
	linkToken: string;
	invitation: string;
	/** A diagnosis on the main diagram, started by the owner. */
	diagnosis: string;
	/** A second one, for the DELETE row; and a reading of the first, for striking. */
	spareDiagnosis: string;
	reading: number;
}

type Url = (f: Fixture, role: Role) => string;
interface Row {
	url?: Url;
	body?: unknown;
	expect: Expect;
}
interface Entry {
	url: Url;
	page?: Expect;
	api?: Partial<Record<'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', Row>>;
}

const every = (status: number): Expect => Object.fromEntries(ROLES.map((r) => [r, status])) as Expect;
/** Any account gets `status`; no account gets `anon` (401 from the API, 303 from signed-in pages). */
const signedIn = (status: number, anon: number): Expect => ({ ...every(status), anonymous: anon, link: anon });
const adminOnly = (status: number): Expect => ({ ...every(404), admin: status });
const ownerOnly = (status: number, anon: number): Expect => ({ ...every(404), anonymous: anon, link: anon, owner: status });

const RANK = { viewer: 1, commenter: 2, editor: 3, owner: 4 } as const;
const NEED = { view: 1, comment: 2, edit: 3, owner: 4 } as const;
/**
 * A diagram route at a level. Shares give viewer/commenter/editor their levels; the club member
 * (no share to the club), another account and the site admin cannot see it. A read-only link
 * opens API reads at view level; signed-in pages send anyone without an account to sign in.
 */
function onDiagram(level: keyof typeof NEED, ok: number, kind: 'page' | 'api'): Expect {
	const anon = kind === 'page' ? 303 : 401;
	const shared = (who: keyof typeof RANK) => (RANK[who] >= NEED[level] ? ok : 403);
	return {
		anonymous: anon,
		link: kind === 'api' && level === 'view' ? ok : anon,
		other: 404,
		admin: 404,
		clubMember: 404,
		viewer: shared('viewer'),
		commenter: shared('commenter'),
		editor: shared('editor'),
		owner: ok
	};
}

const d = (rest = '') => (f: Fixture) => `/diagrams/${f.diagram}${rest}`;
const a = (rest = '') => (f: Fixture) => `/api/diagrams/${f.diagram}${rest}`;
const randomToken = 'AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA';

// The table: one entry per route under src/routes.
const TABLE: Record<string, Entry> = {
	'/': { url: () => '/', page: every(200) },
	'/signin': { url: () => '/signin', page: signedIn(303, 200) },
	'/signup': { url: () => '/signup', page: signedIn(303, 200) },
	'/signout': { url: () => '/signout', page: every(200) },
	'/reset': { url: () => '/reset', page: every(200) },
	'/reset/[token]': { url: () => `/reset/${randomToken}`, page: every(200) },
	'/verify/[token]': { url: () => `/verify/${randomToken}`, page: every(200) },
	'/s/[token]': { url: (f) => `/s/${f.linkToken}`, page: every(200) },
	'/admin': { url: () => '/admin', page: adminOnly(200) },
	'/admin/mail': { url: () => '/admin/mail', page: adminOnly(200) },
	'/account': { url: () => '/account', page: signedIn(200, 303) },
	'/garage': { url: () => '/garage', page: signedIn(200, 303) },
	'/garage/[vehicleId]': { url: (f) => `/garage/${f.vehicle}`, page: ownerOnly(200, 303) },
	'/palettes': { url: () => '/palettes', page: signedIn(200, 303) },
	'/shared': { url: () => '/shared', page: signedIn(200, 303) },
	'/clubs': { url: () => '/clubs', page: signedIn(200, 303) },
	'/clubs/[id]': { url: (f) => `/clubs/${f.club}`, page: { ...ownerOnly(200, 303), clubMember: 200 } },
	'/invitations/[token]': { url: (f) => `/invitations/${f.invitation}`, page: signedIn(200, 303) },
	'/diagrams/[id]': { url: d(), page: onDiagram('view', 200, 'page') },
	'/diagrams/[id]/draw': { url: d('/draw'), page: onDiagram('view', 200, 'page') },
	'/diagrams/[id]/revisions': { url: d('/revisions'), page: onDiagram('view', 200, 'page') },
	'/diagrams/[id]/copy': { url: d('/copy'), page: onDiagram('view', 200, 'page') },
	'/diagrams/[id]/comments': { url: d('/comments'), page: onDiagram('comment', 200, 'page') },
	'/diagrams/[id]/share': { url: d('/share'), page: onDiagram('owner', 200, 'page') },
	// A diagnosis is seen through its diagram, with an account only (a read-only link does not reach it).
	'/diagnoses/[id]': { url: (f) => `/diagnoses/${f.diagnosis}`, page: onDiagram('view', 200, 'page') },
	'/diagnoses/[id]/checklist': { url: (f) => `/diagnoses/${f.diagnosis}/checklist`, page: onDiagram('view', 200, 'page') },

	'/api/health': { url: () => '/api/health', api: { GET: { expect: every(200) } } },
	'/api/vehicles': {
		url: () => '/api/vehicles',
		api: { GET: { expect: signedIn(200, 401) }, POST: { body: {}, expect: signedIn(400, 401) } }
	},
	'/api/vehicles/[id]': {
		url: (f) => `/api/vehicles/${f.vehicle}`,
		api: {
			GET: { expect: ownerOnly(200, 401) },
			PATCH: { body: {}, expect: ownerOnly(400, 401) },
			DELETE: { url: (f) => `/api/vehicles/${f.spareVehicle}`, expect: ownerOnly(204, 401) }
		}
	},
	// Palettes are the account's own and never shared: another account (even an admin) gets 404.
	'/api/palettes': {
		url: () => '/api/palettes',
		api: { GET: { expect: signedIn(200, 401) }, POST: { body: {}, expect: signedIn(400, 401) } }
	},
	'/api/palettes/[id]': {
		url: (f) => `/api/palettes/${f.palette}`,
		api: {
			GET: { expect: ownerOnly(200, 401) },
			PUT: { body: {}, expect: ownerOnly(400, 401) },
			DELETE: { url: (f) => `/api/palettes/${f.sparePalette}`, expect: ownerOnly(204, 401) }
		}
	},
	'/api/diagrams': {
		url: () => '/api/diagrams',
		api: { GET: { expect: signedIn(200, 401) }, POST: { body: {}, expect: signedIn(400, 401) } }
	},
	'/api/diagrams/[id]': {
		url: a(),
		api: {
			GET: { expect: onDiagram('view', 200, 'api') },
			PUT: { body: {}, expect: onDiagram('edit', 400, 'api') },
			DELETE: { url: (f) => `/api/diagrams/${f.spareDiagram}`, expect: onDiagram('owner', 204, 'api') }
		}
	},
	'/api/diagrams/[id]/revisions': { url: a('/revisions'), api: { GET: { expect: onDiagram('view', 200, 'api') } } },
	'/api/diagrams/[id]/revisions/[revision]': { url: a('/revisions/1'), api: { GET: { expect: onDiagram('view', 200, 'api') } } },
	'/api/diagrams/[id]/revisions/[revision]/restore': {
		url: a('/revisions/1/restore'),
		api: { POST: { body: {}, expect: onDiagram('edit', 400, 'api') } }
	},
	'/api/diagrams/[id]/import': { url: a('/import'), api: { POST: { body: {}, expect: onDiagram('edit', 400, 'api') } } },
	'/api/diagrams/[id]/predict': { url: a('/predict'), api: { POST: { body: {}, expect: onDiagram('view', 400, 'api') } } },
	'/api/diagrams/[id]/probe-plan': { url: a('/probe-plan'), api: { POST: { body: {}, expect: onDiagram('view', 400, 'api') } } },
	// Diagnoses: through their diagram, with an account only (a read-only link gets 401).
	'/api/diagrams/[id]/diagnoses': {
		url: a('/diagnoses'),
		api: { GET: { expect: { ...onDiagram('view', 200, 'api'), link: 401 } }, POST: { body: {}, expect: { ...onDiagram('edit', 400, 'api'), link: 401 } } }
	},
	'/api/diagnoses/[id]': {
		url: (f) => `/api/diagnoses/${f.diagnosis}`,
		api: {
			GET: { expect: { ...onDiagram('view', 200, 'api'), link: 401 } },
			PATCH: { body: {}, expect: { ...onDiagram('edit', 400, 'api'), link: 401 } },
			DELETE: { url: (f) => `/api/diagnoses/${f.spareDiagnosis}`, expect: { ...onDiagram('owner', 204, 'api'), link: 401 } }
		}
	},
	'/api/diagnoses/[id]/readings': {
		url: (f) => `/api/diagnoses/${f.diagnosis}/readings`,
		api: { GET: { expect: { ...onDiagram('view', 200, 'api'), link: 401 } }, POST: { body: {}, expect: { ...onDiagram('edit', 400, 'api'), link: 401 } } }
	},
	// Striking is idempotent: a reading struck already answers 200 again.
	'/api/diagnoses/[id]/readings/[readingId]': {
		url: (f) => `/api/diagnoses/${f.diagnosis}/readings/${f.reading}`,
		api: { DELETE: { expect: { ...onDiagram('edit', 200, 'api'), link: 401 } } }
	},
	'/api/diagnoses/[id]/conclude': {
		url: (f) => `/api/diagnoses/${f.diagnosis}/conclude`,
		api: { POST: { body: {}, expect: { ...onDiagram('edit', 400, 'api'), link: 401 } } }
	},
	'/api/diagnoses/[id]/checklist.pdf': { url: (f) => `/api/diagnoses/${f.diagnosis}/checklist.pdf`, api: { GET: { expect: { ...onDiagram('view', 200, 'api'), link: 401 } } } },
	'/api/diagrams/[id]/comments': {
		url: a('/comments'),
		api: { GET: { expect: onDiagram('comment', 200, 'api') }, POST: { body: {}, expect: onDiagram('comment', 400, 'api') } }
	},
	// Copying needs an account to copy into, so a link alone is 401.
	'/api/diagrams/[id]/copy': { url: a('/copy'), api: { POST: { body: {}, expect: { ...onDiagram('view', 400, 'api'), link: 401 } } } },
	'/api/diagrams/[id]/pages': {
		url: a('/pages'),
		api: { GET: { expect: onDiagram('view', 200, 'api') }, POST: { body: {}, expect: onDiagram('edit', 400, 'api') } }
	},
	'/api/diagrams/[id]/pages/[pageId]': {
		url: (f) => `/api/diagrams/${f.diagram}/pages/${f.page}`,
		api: {
			GET: { expect: onDiagram('view', 200, 'api') },
			PATCH: { body: {}, expect: onDiagram('edit', 400, 'api') },
			DELETE: {
				url: (f, role) => `/api/diagrams/${f.diagram}/pages/${role === 'editor' ? f.sparePage : f.page}`,
				expect: onDiagram('edit', 204, 'api')
			}
		}
	}
};

const routesDir = join(import.meta.dirname, '../../src/routes');

describe('the access table covers every route', () => {
	it('has an entry, with the right methods, for every page and endpoint under src/routes', () => {
		expect(coverageProblems(walkRoutes(routesDir), TABLE)).toEqual([]);
	});

	it('notices a route added without an entry (a made-up routes folder)', () => {
		const dir = mkdtempSync(join(tmpdir(), 'loom-routes-'));
		try {
			mkdirSync(join(dir, '(app)', 'workbench'), { recursive: true });
			writeFileSync(join(dir, '(app)', 'workbench', '+page.svelte'), '<h1>Bench</h1>');
			mkdirSync(join(dir, 'api', 'lamps', '[id]'), { recursive: true });
			writeFileSync(join(dir, 'api', 'lamps', '[id]', '+server.ts'), 'export const GET = () => 1;\nexport async function DELETE() {}\n');
			const walked = walkRoutes(dir);
			expect(walked).toEqual([
				{ route: '/api/lamps/[id]', page: false, methods: ['DELETE', 'GET'] },
				{ route: '/workbench', page: true, methods: [] }
			]);
			expect(coverageProblems(walked, { '/workbench': { page: {} } })).toEqual(['/api/lamps/[id]: no entry in the access table']);
			expect(coverageProblems(walked, { '/workbench': { page: {} }, '/api/lamps/[id]': { api: { GET: {} } } })).toEqual([
				'/api/lamps/[id]: exports DELETE, GET but the entry lists GET'
			]);
		} finally {
			rmSync(dir, { recursive: true, force: true });
		}
	});
});

// A 1×1 PNG (the PNG signature of ISO/IEC 15948 §5.2, IHDR, one IDAT, IEND).
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');

let fx: Fixture;
const cookies = {} as Record<Role, string | undefined>;

beforeAll(async () => {
	const [owner, editor, commenter, viewer, clubMember, other, admin] = await Promise.all([
		person('Matrix Owner'),
		person('Matrix Editor'),
		person('Matrix Commenter'),
		person('Matrix Viewer'),
		person('Matrix Club Member'),
		person('Matrix Other'),
		person('Matrix Admin', 'admin')
	]);
	Object.assign(cookies, { owner: owner.cookie, editor: editor.cookie, commenter: commenter.cookie, viewer: viewer.cookie, clubMember: clubMember.cookie, other: other.cookie, admin: admin.cookie });

	const vehicle = async (name: string) => {
		const res = await api('POST', '/api/vehicles', owner.cookie, { name, make: 'Corvell', model: 'Stanway Six', year: '1954', systemVoltage: 12, earthPolarity: 'positive' });
		expect(res.status).toBe(201);
		return (await res.json()).vehicle.id as string;
	};
	const diagram = async (vehicleId: string, title: string) => {
		const res = await api('POST', '/api/diagrams', owner.cookie, { vehicleId, title, document: demoHarness() });
		expect(res.status).toBe(201);
		const id = (await res.json()).diagram.id as string;
		for (const [who, level] of [[editor, 'edit'], [commenter, 'comment'], [viewer, 'view']] as [Person, string][]) {
			expect((await form(`/diagrams/${id}/share?/person`, { email: who.email, level }, owner.cookie)).status).toBe(200);
		}
		return id;
	};
	const v = await vehicle('Matrix car');
	const spareVehicle = await vehicle('Matrix spare');
	const main = await diagram(v, 'Matrix harness');
	const spare = await diagram(v, 'Matrix spare harness');

	const upload = async () => {
		const body = new FormData();
		body.set('file', new Blob([PNG], { type: 'image/png' }), 'page.png');
		const up = await fetch(`${baseUrl()}/api/diagrams/${main}/pages`, { method: 'POST', headers: { cookie: owner.cookie, origin: baseUrl() }, body });
		expect(up.status).toBe(201);
		return (await up.json()).page.id as string;
	};
	const page = await upload();
	const sparePage = await upload();

	// A club the owner organises, with a member, and nothing shared with it.
	const made = await form('/clubs?/create', { name: 'Matrix Club', description: '' }, owner.cookie);
	const club = made.headers.get('location')!.split('/').pop()!;
	await form(`/clubs/${club}?/invite`, { email: clubMember.email }, owner.cookie);
	const joinLink = pathOf((await mailTo(clubMember.email, /invites you to/)).links[0]);
	expect((await form(`${joinLink}?/accept`, {}, clubMember.cookie)).status).toBe(303);
	// A pending invitation for the invitation page's row.
	await form(`/clubs/${club}?/invite`, { email: other.email }, owner.cookie);
	const invitation = pathOf((await mailTo(other.email, /invites you to/)).links[0]).split('/').pop()!;

	const link = await form(`/diagrams/${main}/share?/link`, { label: 'matrix' }, owner.cookie);
	const linkToken = (await link.text()).match(/\/s\/([A-Za-z0-9_-]{43})/)![1];

	const palette = async (name: string) => {
		const res = await api('POST', '/api/palettes', owner.cookie, { name, colours: [{ code: 'G', name: 'green', display: '#2e7d32' }] });
		expect(res.status).toBe(201);
		return (await res.json()).palette.id as string;
	};

	const started = await api('POST', `/api/diagrams/${main}/diagnoses`, owner.cookie, { revision: 1, marks: [{ part: 'fuel-gauge', mark: 'reads-low' }, { part: 'temp-gauge', mark: 'reads-low' }] });
	expect(started.status).toBe(201);
	const diagnosis = (await started.json()).diagnosis.id as string;
	const spareStarted = await api('POST', `/api/diagrams/${main}/diagnoses`, owner.cookie, { revision: 1, marks: [{ part: 'fuel-gauge', mark: 'dead' }] });
	expect(spareStarted.status).toBe(201);
	const spareDiagnosis = (await spareStarted.json()).diagnosis.id as string;
	const taken = await api('POST', `/api/diagnoses/${diagnosis}/readings`, owner.cookie, {
		readings: [{ clientId: crypto.randomUUID(), probe: 'volts:fuse-ign:out', outcome: 'value', value: -12.3, unit: 'V', takenAt: new Date().toISOString() }]
	});
	expect(taken.status).toBe(200);
	const reading = (await taken.json()).readings[0].id as number;

	fx = { vehicle: v, spareVehicle, diagram: main, spareDiagram: spare, page, sparePage, club, palette: await palette('Matrix codes'), sparePalette: await palette('Matrix spare codes'), linkToken, invitation, diagnosis, spareDiagnosis, reading };
}, 120_000);

afterAll(async () => {
	await db.$client.end();
});

/** One request as a role: a session cookie, or none; the link role sends the read-only token. */
async function send(role: Role, method: string, url: URL, body: unknown, kind: 'page' | 'api'): Promise<Response> {
	const cookie = cookies[role];
	return fetch(url, {
		method,
		redirect: 'manual',
		headers: {
			origin: baseUrl(),
			accept: kind === 'page' ? 'text/html' : 'application/json',
			...(body !== undefined ? { 'content-type': 'application/json' } : {}),
			...(cookie ? { cookie } : {})
		},
		body: body === undefined ? undefined : JSON.stringify(body)
	});
}

/**
 * The status a visitor meets. For a page that is the HTML answer, and when that is 200, the
 * answer of its data (SvelteKit's `__data.json`, which the browser fetches on client-side
 * navigation and which is all a page rendered in the browser only, ssr = false, ever gets): a
 * redirect there counts as 303 and an error node as its status.
 */
async function ask(role: Role, method: string, path: string, body: unknown, kind: 'page' | 'api'): Promise<number> {
	const url = new URL(path, baseUrl());
	if (role === 'link') url.searchParams.set('link', fx.linkToken);
	const res = await send(role, method, url, body, kind);
	await res.arrayBuffer();
	if (kind === 'api' || res.status !== 200) return res.status;
	const dataUrl = new URL(url);
	dataUrl.pathname = url.pathname.replace(/\/$/, '') + '/__data.json';
	const data = await send(role, 'GET', dataUrl, undefined, 'api');
	const answer = (await data.json()) as { type: string; nodes?: ({ type: string; status?: number } | null)[] };
	if (answer.type === 'redirect') return 303;
	const failed = answer.nodes?.find((n) => n?.type === 'error');
	return failed ? (failed.status ?? 500) : data.status;
}

describe('route × visitor', () => {
	for (const [route, entry] of Object.entries(TABLE)) {
		const rows: [string, 'page' | 'api', Row][] = [
			...(entry.page ? [['GET', 'page', { expect: entry.page }] as [string, 'page', Row]] : []),
			...Object.entries(entry.api ?? {}).map(([m, row]) => [m, 'api', row] as [string, 'api', Row])
		];
		for (const [method, kind, row] of rows) {
			it(`${kind === 'page' ? 'page' : method} ${route}`, async () => {
				const got: Partial<Expect> = {};
				// Owner last: its DELETE really deletes.
				for (const role of ROLES) got[role] = await ask(role, method, (row.url ?? entry.url)(fx, role), row.body, kind);
				expect(got).toEqual(row.expect);
			});
		}
	}
});
